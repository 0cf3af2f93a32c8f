import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { fieldForPath } from "@/lib/checks/beam-form";
import { buildTableModel, DEFAULT_TABLE, EMPTY_LOAD, modelToTable, tableFormSchema, type TableFormInput } from "@/lib/checks/table-form";
import { parseModel, solve, SolverInputError } from "@/lib/solver";

// Two bars from supports at (0, 0) and (2a, 0) meeting at (a, h), load P down at the apex.
// By virtual work (1·Δ = Σ nNL/AE) with n = 1/(2 sin θ) and N = P/(2 sin θ) in each bar:
// Δ = P·L/(2·A·E·sin²θ), L the bar length and θ its angle to the horizontal.
const a = 3; // m
const h = 4; // m
const L = Math.hypot(a, h);
const sin = h / L;
const A = 0.002; // m²
const E = 200e9; // Pa
const P = 50e3; // N

const vTruss: TableFormInput = {
  kind: "truss",
  units: { length: "m", modulus: "GPa", inertia: "mm^4", area: "mm^2", force: "kN", lineLoad: "kN/m" },
  nodes: [
    { id: "A", x: "0", y: "0" },
    { id: "B", x: String(2 * a), y: "0" },
    { id: "C", x: String(a), y: String(h) },
  ],
  members: [
    { id: "AC", start: "A", end: "C", E: "200", I: "", A: "2000", release: "none" },
    { id: "BC", start: "B", end: "C", E: "200", I: "", A: "2000", release: "none" },
  ],
  supports: [
    { node: "A", type: "pin" },
    { node: "B", type: "pin" },
  ],
  loads: [{ ...EMPTY_LOAD, type: "node", target: "C", fy: "-50" }],
  checks: [],
  find: [{ node: "C", dof: "y" }],
};

describe("truss and frame tables → model file", () => {
  it("a two-bar truss: apex deflection P·L/(2AE sin²θ) by virtual work", () => {
    const t = tableFormSchema.parse(vTruss);
    const r = solve(buildTableModel(t, { title: "two-bar" }).model);
    expect(-r.find[0]!.value_si).toBeCloseTo((P * L) / (2 * A * E * sin ** 2), 12);
    // each bar: N = −P/(2 sin θ), in compression
    expect(r.members[0]!.end_forces.start.N_N).toBeCloseTo(-P / (2 * sin), 6);
  });

  it("the default king-post truss parses and solves", () => {
    const t = tableFormSchema.parse(DEFAULT_TABLE);
    const r = solve(buildTableModel(t, { title: "k" }).model);
    expect(r.cross_check.disagreements).toEqual([]);
  });

  it("row problems land on their row: an unknown node, a duplicate id, a truss member without A", () => {
    const bad = { ...vTruss, members: [{ ...vTruss.members[0]!, end: "Z" }, { ...vTruss.members[1]!, id: "AC", A: "" }] };
    const r = tableFormSchema.safeParse(bad);
    expect(r.success).toBe(false);
    const issues = r.success ? [] : r.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`);
    expect(issues).toEqual(expect.arrayContaining(["members.0.end: No node Z.", "members.1.id: Member AC is listed twice.", "members.1.A: A truss member needs its area A."]));
  });

  it("the solver's messages map back to the row and field that caused them", () => {
    const t = tableFormSchema.parse({ ...vTruss, nodes: [...vTruss.nodes, { id: "D", x: "3", y: "4" }], members: [...vTruss.members, { id: "CD", start: "C", end: "D", E: "200", I: "", A: "2000", release: "none" }] });
    const built = buildTableModel(t, { title: "x" });
    try {
      parseModel(built.model);
      expect.unreachable("coincident nodes must be refused");
    } catch (e) {
      expect(e).toBeInstanceOf(SolverInputError);
      const issue = (e as SolverInputError).issues.find((i) => i.path === "nodes.D");
      expect(issue?.message).toBe("coincides with node C");
      expect(fieldForPath(built.origin, "nodes.D")).toBe("nodes.3.id");
    }
    expect(fieldForPath(built.origin, "members.BC.A")).toBe("members.1.A");
    expect(fieldForPath(built.origin, "loads[0].Fy")).toBe("loads.0.fy");
  });

  it("an uploaded model file goes into the tables and back with the same answer (lib/solver/examples)", () => {
    for (const name of ["roof-truss.model.json", "portal-frame.model.json", "continuous-beam.model.json"]) {
      const file = JSON.parse(readFileSync(path.join(process.cwd(), "lib/solver/examples", name), "utf8")) as unknown;
      const t = modelToTable(file);
      expect(t.unsupported).toEqual([]);
      const rebuilt = buildTableModel(tableFormSchema.parse(t.input), { title: t.title });
      const before = solve(file);
      const after = solve(rebuilt.model);
      before.checks.forEach((c, i) => c.combos.forEach((k, j) => expect(after.checks[i]!.combos[j]!.verdict.delta_m).toBeCloseTo(k.verdict.delta_m, 12)));
      // the same numbers up to the last digits of unit conversion (ft → m may be done in another order)
      before.find.forEach((f, i) => expect(Math.abs(after.find[i]!.value_si - f.value_si)).toBeLessThanOrEqual(1e-12 * Math.abs(f.value_si)));
      expect(after.find.length).toBe(before.find.length);
    }
  });

  it("lists what the tables cannot hold instead of dropping it silently", () => {
    const t = modelToTable({
      kind: "frame",
      nodes: { A: ["0 m", "0 m"], B: ["4 m", "0 m"] },
      members: { AB: { ends: ["A", "B"], E: "200 GPa", I: "1e8 mm^4", shear: { G: "77 GPa", Av: "2000 mm^2" } } },
      supports: { A: "fixed" },
      loads: [{ member: "AB", dT: "30 degC", alpha: "12e-6 1/degC" }],
    });
    expect(t.unsupported).toEqual(["members.AB.shear: the tables have no shear columns", "loads[0]: this kind of load (moment, temperature, misfit or settlement) has no row; use the model file"]);
  });
});
