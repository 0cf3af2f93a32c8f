import { describe, expect, it } from "vitest";

import { IBC_2021_TABLE_1604_3, type CreepInterpretation, type LimitsTable, type Material, type SolveResult } from "@/lib/solver";
import { expectClose, run } from "@/tests/unit/solver/helpers";

// Serviceability combinations and limits: IBC 2021 Table 1604.3 (rows and footnotes d, f, g, i),
// NDS 2018 §3.5.2 (K_cr, from memory), claimed-vs-computed thresholds (common practice, no source:
// ±5 % agree, 5–15 % ask, > 15 % or a flipped pass/fail is a correction; 2 % near-limit flag).
// Deflections by AISC Manual Table 3-23 case 1: Δ = 5wl⁴/384EI (SI, EI = 2.4e7 N·m², l = 6 m).
const l = 6;
const EI = 200e9 * 1.2e-4;
const simple = (w: number): number => (5 * w * l ** 4) / (384 * EI);

function beam(loads: { w: number; case: string }[], check: Record<string, unknown>): Record<string, unknown> {
  return {
    kind: "beam",
    nodes: { A: ["0 m", "0 m"], B: [`${l} m`, "0 m"] },
    members: { AB: { ends: ["A", "B"], E: "200 GPa", I: "1.2e-4 m^4" } },
    supports: { A: "pin", B: "roller" },
    loads: loads.map((q) => ({ member: "AB", w: `${-q.w} N/m`, case: q.case })),
    checks: [{ member: "AB", ...check }],
  };
}

function combo(r: SolveResult, name: string): SolveResult["checks"][number]["combos"][number] {
  const c = r.checks[0]?.combos.find((k) => k.name === name);
  if (!c) throw new Error(`no combination ${name}; have ${r.checks[0]?.combos.map((k) => k.name).join(", ")}`);
  return c;
}

const wD = 4e3;
const wL = 6e3;

describe("IBC 2021 Table 1604.3 combinations and limits", () => {
  it("floor row: L alone at l/360, D + L at l/240", () => {
    const r = run(beam([{ w: wD, case: "D" }, { w: wL, case: "L" }], { row: "floor", material: "steel" }));
    expect(r.checks[0]?.combos.map((k) => k.name)).toEqual(["L", "D+L"]);
    const L = combo(r, "L");
    expectClose(L.verdict.delta_m, simple(wL), 1e-9, "Δ_L");
    expectClose(L.verdict.allowable_m, l / 360, 1e-12, "l/360");
    expect(L.verdict.limit).toBe("l/360");
    expectClose(L.verdict.span_over_delta, l / simple(wL), 1e-9, "l/Δ");
    expectClose(combo(r, "D+L").verdict.allowable_m, l / 240, 1e-12, "l/240");
  });

  const creepCases: [CreepInterpretation, Material, number, string][] = [
    ["ibc-footnote-d", "sawn-dry", 0.5, "footnote d: 0.5 D for dry lumber"],
    ["ibc-footnote-d", "glulam", 0.5, "footnote d: 0.5 D for glulam"],
    ["ibc-footnote-d", "sawn-wet", 1, "footnote d: 1.0 D at other moisture conditions"],
    ["ibc-footnote-d", "clt", 1, "footnote d: 1.0 D for CLT"],
    ["ibc-footnote-d", "steel", 0, "footnote g: creep part zero for steel"],
    ["nds-3.5.2", "sawn-dry", 1.5, "NDS §3.5.2: K_cr = 1.5 dry service"],
    ["nds-3.5.2", "panel", 2, "NDS §3.5.2: K_cr = 2.0 structural panels"],
    ["immediate", "glulam", 1, "full immediate Δ_D + Δ_L (common practice)"],
  ];
  for (const [interpretation, material, k, source] of creepCases) {
    it(`creep ${interpretation}, ${material}: D + L = ${k}·Δ_D + Δ_L (${source})`, () => {
      const r = run(beam([{ w: wD, case: "D" }, { w: wL, case: "L" }], { row: "floor", material }), { creep: interpretation });
      expectClose(combo(r, "D+L").verdict.delta_m, simple(k * wD + wL), 1e-9, "Δ_D+L");
      expect(r.creep.interpretation).toBe(interpretation);
    });
  }

  it("wind: 0.42 × W (footnote f) against the S-or-W column; walls take no S", () => {
    const r = run(beam([{ w: 3e3, case: "W" }, { w: 2e3, case: "S" }], { row: "roof-no-ceiling" }));
    expectClose(combo(r, "W").verdict.delta_m, simple(0.42 * 3e3), 1e-9, "0.42 W");
    expectClose(combo(r, "W").verdict.allowable_m, l / 180, 1e-12, "l/180");
    expectClose(combo(r, "S").verdict.delta_m, simple(2e3), 1e-9, "S");
    const wall = run(beam([{ w: 3e3, case: "W" }, { w: 2e3, case: "S" }], { row: "exterior-wall-brittle" }));
    expect(wall.checks[0]?.combos.map((k) => k.name)).toEqual(["W"]);
    expectClose(combo(wall, "W").verdict.allowable_m, l / 240, 1e-12, "l/240");
  });

  it("roof live load: Lr alone and D + Lr", () => {
    const r = run(beam([{ w: wD, case: "D" }, { w: 2e3, case: "Lr" }], { row: "roof-plaster-ceiling", material: "steel" }));
    expect(r.checks[0]?.combos.map((k) => k.name)).toEqual(["Lr", "D+Lr"]);
    expectClose(combo(r, "Lr").verdict.allowable_m, l / 360, 1e-12, "l/360");
    expectClose(combo(r, "D+Lr").verdict.allowable_m, l / 240, 1e-12, "l/240");
    expectClose(combo(r, "D+Lr").verdict.delta_m, simple(2e3), 1e-9, "steel: no creep part");
  });

  it("a cantilever is judged with l = 2 × its length (footnote i)", () => {
    // AISC Table 3-23 case 19: cantilever tip Δ = wl⁴/8EI
    const model = {
      kind: "beam",
      nodes: { A: ["0 m", "0 m"], B: ["2 m", "0 m"] },
      members: { AB: { ends: ["A", "B"], E: "200 GPa", I: "1.2e-4 m^4" } },
      supports: { A: "fixed" },
      loads: [{ member: "AB", w: "-5 kN/m", case: "L" }],
      checks: [{ member: "AB", row: "floor", cantilever: true }],
    };
    const r = run(model);
    const L = combo(r, "L");
    expectClose(L.verdict.limit_span_m, 4, 1e-12, "2 × 2 m");
    expectClose(L.verdict.allowable_m, 4 / 360, 1e-12, "2l/360");
    expectClose(L.verdict.delta_m, (5e3 * 2 ** 4) / (8 * EI), 1e-9, "wl⁴/8EI");
    expect(L.where).toEqual({ member: "AB", x_m: 2 });
  });

  it("pass, fail and the near-limit flag within 2 %", () => {
    const allowable = l / 360;
    const wFor = (ratio: number): number => (ratio * allowable * 384 * EI) / (5 * l ** 4);
    const verdict = (ratio: number) => combo(run(beam([{ w: wFor(ratio), case: "L" }], { row: "floor" })), "L").verdict;
    expect(verdict(0.97)).toMatchObject({ pass: true, near_limit: false });
    expect(verdict(0.99)).toMatchObject({ pass: true, near_limit: true });
    expect(verdict(1.015)).toMatchObject({ pass: false, near_limit: true });
    expect(verdict(1.03)).toMatchObject({ pass: false, near_limit: false });
  });

  it("a custom limits table (a jurisdiction's amendment) replaces Table 1604.3", () => {
    const table: LimitsTable = {
      ...IBC_2021_TABLE_1604_3,
      source: "Larkspur Falls amendment 2024-3",
      rows: [{ id: "floor", label: "Floors", live: 480, total: 360 }],
    };
    const r = run(beam([{ w: wD, case: "D" }, { w: wL, case: "L" }], { row: "floor", material: "steel" }), { limits: table });
    expectClose(combo(r, "L").verdict.allowable_m, l / 480, 1e-12, "l/480");
    expectClose(combo(r, "D+L").verdict.allowable_m, l / 360, 1e-12, "l/360");
    expect(r.limits.source).toBe("Larkspur Falls amendment 2024-3");
  });

  it("a check at a point (truss panel point) uses the displacement there and the stated span", () => {
    const bar = { E: "200 GPa", A: "2e-3 m^2" };
    const r = run({
      kind: "truss",
      nodes: { A: ["0 m", "0 m"], B: ["4 m", "0 m"], C: ["8 m", "0 m"], D: ["4 m", "3 m"] },
      members: { AB: { ends: ["A", "B"], ...bar }, BC: { ends: ["B", "C"], ...bar }, AD: { ends: ["A", "D"], ...bar }, DC: { ends: ["D", "C"], ...bar }, BD: { ends: ["B", "D"], ...bar } },
      supports: { A: "pin", C: "roller" },
      loads: [{ node: "B", Fy: "-100 kN", case: "S" }],
      checks: [{ at: { node: "B", dof: "y" }, span: "8 m", row: "roof-no-ceiling", material: "steel" }],
    });
    // method of joints by hand (see truss-joints.test.ts): Δ_B = 13.5 P/EA
    expectClose(combo(r, "S").verdict.delta_m, (13.5 * 100e3) / (200e9 * 2e-3), 1e-12, "Δ_B");
    expectClose(combo(r, "S").verdict.allowable_m, 8 / 180, 1e-12, "l/180");
  });
});

describe("claimed vs computed (common practice, no source)", () => {
  const computed = simple(wL);
  const claimOf = (claimed: number, options = {}) =>
    combo(run(beam([{ w: wL, case: "L" }], { row: "floor", claimed: [{ combo: "L", delta: `${claimed} m` }] }), options), "L").claim;

  it("within ±5 % agrees", () => {
    expect(claimOf(computed * 1.04)).toMatchObject({ verdict: "agree", flipped: false });
    expect(claimOf(computed * 0.96)?.verdict).toBe("agree");
    expectClose(claimOf(computed * 1.04)?.difference ?? 0, 0.04, 1e-9, "difference");
  });

  it("5–15 % asks for the assumptions", () => {
    expect(claimOf(computed * 1.1)?.verdict).toBe("ask");
    expect(claimOf(computed * 0.88)?.verdict).toBe("ask");
  });

  it("over 15 % is a correction", () => {
    expect(claimOf(computed * 1.2)?.verdict).toBe("correction");
    expect(claimOf(computed * 0.5)?.verdict).toBe("correction");
  });

  it("a flipped pass/fail is a correction even when the numbers are close", () => {
    const allowable = l / 360;
    const w = (1.01 * allowable * 384 * EI) / (5 * l ** 4); // computed fails by 1 %
    const r = run(beam([{ w, case: "L" }], { row: "floor", claimed: [{ combo: "L", delta: `${0.99 * allowable} m` }] }));
    expect(combo(r, "L").claim).toMatchObject({ verdict: "correction", flipped: true, claimed_passes: true, computed_passes: false });
  });

  it("thresholds are configurable", () => {
    expect(claimOf(computed * 1.04, { claimThresholds: { agree: 0.02, ask: 0.1 } })?.verdict).toBe("ask");
    expect(claimOf(computed * 1.12, { claimThresholds: { agree: 0.02, ask: 0.1 } })?.verdict).toBe("correction");
  });
});
