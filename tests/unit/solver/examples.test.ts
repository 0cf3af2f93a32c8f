import { spawnSync } from "node:child_process";
import { readdirSync, readFileSync } from "node:fs";

import { describe, expect, it } from "vitest";

import { SOLVER_VERSION } from "@/lib/solver";
import { EXAMPLE_MODELS } from "@/lib/solver/examples";
import { runCli } from "@/scripts/solve";
import { expectClose, expectCrossCheckAgrees, findValue, reaction, run } from "@/tests/unit/solver/helpers";

const dir = "lib/solver/examples";
const files = readdirSync(dir).filter((f) => f.endsWith(".model.json")).sort();
const load = (f: string): Record<string, unknown> => JSON.parse(readFileSync(`${dir}/${f}`, "utf8")) as Record<string, unknown>;

const ft = 0.3048;
const inch = 0.0254;
const lbf = 4.4482216152605;

describe("example models (invented Larkspur Falls scenario)", () => {
  it("covers joists, a glulam beam, a steel girder with a cantilever, a roof truss, a portal frame and a continuous beam", () => {
    expect(files).toEqual([
      "continuous-beam.model.json",
      "floor-joist-j1.model.json",
      "glulam-beam-gb1.model.json",
      "portal-frame.model.json",
      "roof-truss.model.json",
      "steel-girder-cantilever.model.json",
    ]);
  });

  for (const f of files) {
    it(`${f}: solves, agrees with the stiffness solution, balances energy, judges every check`, () => {
      const model = load(f);
      const r = run(model);
      expectCrossCheckAgrees(r);
      expect(r.energy.balanced).toBe(true);
      expect(r.find).toHaveLength((model.find as unknown[]).length);
      expect(r.checks.length).toBeGreaterThan(0);
      for (const c of r.checks) {
        expect(c.combos.length).toBeGreaterThan(0);
        for (const k of c.combos) expect(k.verdict.delta_m).toBeGreaterThan(0);
      }
    });
  }

  it("floor joist J1 mid-span = 5wl⁴/384EI (AISC Table 3-23 case 1) with w = 13.33 + 53.33 plf", () => {
    const r = run(load("floor-joist-j1.model.json"));
    const w = ((13.33 + 53.33) * lbf) / ft;
    const EI = ((1.6e6 * lbf) / inch ** 2) * 98.93 * inch ** 4;
    expectClose(findValue(r, "mid:J1"), -(5 * w * (14 * ft) ** 4) / (384 * EI), 1e-12, "Δ");
  });

  it("continuous purlin P-2: reactions 0.4 and 1.1 wl (three equal spans, AISC Manual coefficients, from memory)", () => {
    const r = run(load("continuous-beam.model.json"));
    const wl = ((0.12 + 0.2) * 1000 * lbf * 16 * ft) / ft;
    expect(r.method.degree_of_indeterminacy).toBe(2);
    expectClose(reaction(r, "A").Fy, 0.4 * wl, 1e-12, "end");
    expectClose(reaction(r, "B").Fy, 1.1 * wl, 1e-12, "interior");
  });

  it("roof truss RT-1 is symmetric: both supports carry half of the 5 × (1.6 + 2.0 + 1.28) kip", () => {
    const r = run(load("roof-truss.model.json"));
    const total = 5 * (1.6 + 2 + 1.28) * 1000 * lbf;
    expectClose(reaction(r, "L0").Fy, total / 2, 1e-9, "L0");
    expectClose(reaction(r, "L6").Fy, total / 2, 1e-9, "L6");
  });

  it("the examples index lists every file with its title", () => {
    expect(EXAMPLE_MODELS.map((e) => `${e.id}.model.json`).sort()).toEqual(files);
    for (const e of EXAMPLE_MODELS) expect(e.title).toBe(load(`${e.id}.model.json`).title);
  });

  it("the examples show each claim verdict: agree, ask and correction", () => {
    const verdicts = new Set(files.flatMap((f) => run(load(f)).checks.flatMap((c) => c.combos.map((k) => k.claim?.verdict)).filter(Boolean)));
    expect([...verdicts].sort()).toEqual(["agree", "ask", "correction"]);
  });
});

describe("command line: npm run --silent solve -- FILE …", () => {
  const io = () => {
    const out = { stdout: "", stderr: "" };
    return { out, io: { stdout: (t: string) => (out.stdout += t), stderr: (t: string) => (out.stderr += t), readFile: (p: string) => readFileSync(p, "utf8") } };
  };

  it("prints one JSON object for one file and an array in order for several", () => {
    const a = io();
    expect(runCli([`${dir}/floor-joist-j1.model.json`], a.io)).toBe(0);
    const one = JSON.parse(a.out.stdout);
    expect(one.solver_version).toBe(SOLVER_VERSION);
    expect(one.find[0]).toMatchObject({ label: "mid:J1", dof: "y", unit_si: "m" });
    expect(typeof one.find[0].value_si).toBe("number");
    expect(typeof one.find[0].stiffness_si).toBe("number");
    expect(one.find[0].terms[0].member).toBe("J1");
    expect(typeof one.energy.external_work_J).toBe("number");
    expect(typeof one.energy.strain_energy_J).toBe("number");
    const b = io();
    expect(runCli([`${dir}/roof-truss.model.json`, `${dir}/portal-frame.model.json`], b.io)).toBe(0);
    expect(JSON.parse(b.out.stdout).map((x: { kind: string }) => x.kind)).toEqual(["truss", "frame"]);
  });

  it("--summary prints a short table", () => {
    const a = io();
    expect(runCli([`${dir}/floor-joist-j1.model.json`, "--summary"], a.io)).toBe(0);
    expect(a.out.stdout).toMatch(/check J1 L: Δ 0\.291 in = l\/\d+(\.\d+)?, limit l\/360 \(0\.467 in\) PASS, claimed 0\.29 in: agree/);
  });

  it("a bad model exits non-zero with the message on stderr (real process)", () => {
    const bad = spawnSync(process.execPath, ["--import", "tsx", "scripts/solve.ts", "tests/unit/solver/fixtures/bad-inertia.model.json"], { encoding: "utf8" });
    expect(bad.status).toBe(1);
    expect(bad.stdout).toBe("");
    expect(bad.stderr).toBe('tests/unit/solver/fixtures/bad-inertia.model.json: members.B2.I: unit "in^3" is not a second moment of area\n');
  }, 30_000);
});
