import { expect } from "vitest";

import { solve, type SolveOptions, type SolveResult } from "@/lib/solver";

/** Relative closeness: |a − b| ≤ tol · max(|a|, |b|) (or ≤ tol when both are below 1). */
export function expectClose(actual: number, expected: number, tol = 1e-9, label = ""): void {
  const scale = Math.max(Math.abs(actual), Math.abs(expected));
  const ok = Math.abs(actual - expected) <= tol * (scale === 0 ? 1 : scale);
  if (!ok) {
    expect.fail(`${label} expected ${expected}, got ${actual} (relative difference ${Math.abs(actual - expected) / scale}, tolerance ${tol})`);
  }
}

/** SI beam/frame quantities as model-file strings. */
export const si = {
  m: (v: number): string => `${v} m`,
  N: (v: number): string => `${v} N`,
  Nm: (v: number): string => `${v} N*m`,
  Npm: (v: number): string => `${v} N/m`,
  Pa: (v: number): string => `${v} Pa`,
  m2: (v: number): string => `${v} m^2`,
  m4: (v: number): string => `${v} m^4`,
};

export interface BeamSpec {
  /** node x positions, m */
  xs: number[];
  supports: Record<string, unknown>;
  loads?: Record<string, unknown>[];
  find?: { node: string; dof: string }[];
  E?: number;
  I?: number;
  A?: number;
  shear?: { G: number; Av: number };
}

/** A horizontal beam with nodes N0, N1, … at `xs` and members M1, M2, … between them. */
export function beamModel(spec: BeamSpec): Record<string, unknown> {
  const nodes: Record<string, [string, string]> = {};
  spec.xs.forEach((x, i) => (nodes[`N${i}`] = [si.m(x), "0 m"]));
  const members: Record<string, unknown> = {};
  for (let i = 1; i < spec.xs.length; i++) {
    members[`M${i}`] = {
      ends: [`N${i - 1}`, `N${i}`],
      E: si.Pa(spec.E ?? 200e9),
      I: si.m4(spec.I ?? 1.2e-4),
      ...(spec.A ? { A: si.m2(spec.A) } : {}),
      ...(spec.shear ? { shear: { G: si.Pa(spec.shear.G), Av: si.m2(spec.shear.Av) } } : {}),
    };
  }
  return { kind: "beam", nodes, members, supports: spec.supports, loads: spec.loads ?? [], find: spec.find ?? [] };
}

export function run(model: unknown, options: SolveOptions = {}): SolveResult {
  return solve(model, { stations: false, ...options });
}

export function findValue(r: SolveResult, label: string, dof = "y"): number {
  const f = r.find.find((x) => x.label === label && x.dof === dof);
  if (!f) throw new Error(`no find item ${label} ${dof}`);
  return f.value_si;
}

export function reaction(r: SolveResult, node: string): { Fx: number; Fy: number; M: number } {
  const x = r.reactions.find((q) => q.node === node);
  if (!x) throw new Error(`no reaction at ${node}`);
  return { Fx: x.Fx_N ?? 0, Fy: x.Fy_N ?? 0, M: x.M_Nm ?? 0 };
}

export function member(r: SolveResult, id: string): SolveResult["members"][number] {
  const m = r.members.find((q) => q.id === id);
  if (!m) throw new Error(`no member ${id}`);
  return m;
}

/** Every value the independent stiffness solution saw agrees with virtual work. */
export function expectCrossCheckAgrees(r: SolveResult): void {
  expect(r.cross_check.error).toBeUndefined();
  expect(r.cross_check.available).toBe(true);
  expect(r.cross_check.compared).toBeGreaterThan(0);
  expect(r.cross_check.disagreements).toEqual([]);
}
