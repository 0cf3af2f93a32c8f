import { Matrix, solve as denseSolve } from "ml-matrix";
import { describe, expect, it } from "vitest";

import { EnvelopeLU } from "@/lib/solver/envelope-lu";
import { gaussOnSegment } from "@/lib/solver/integrate";
import { rootsIn } from "@/lib/solver/polynomial";
import { expectClose } from "@/tests/unit/solver/helpers";

// A deterministic pseudo-random sequence (Park–Miller minimal standard generator).
function lcg(seed: number): () => number {
  let s = seed;
  return () => {
    s = (s * 16807) % 2147483647;
    return s / 2147483647 - 0.5;
  };
}

describe("building blocks against independent references", () => {
  it("banded elimination solves like a dense LU (ml-matrix) on a random banded system", () => {
    const n = 60;
    const rand = lcg(7);
    const A = Matrix.zeros(n, n);
    for (let i = 0; i < n; i++) for (let j = Math.max(0, i - 3); j < Math.min(n, i + 4); j++) A.set(i, j, rand() + (i === j ? 4 : 0));
    const ptr = [0];
    const r: number[] = [];
    const v: number[] = [];
    for (let j = 0; j < n; j++) {
      for (let i = 0; i < n; i++) {
        if (A.get(i, j) === 0) continue;
        r.push(i);
        v.push(A.get(i, j));
      }
      ptr.push(r.length);
    }
    const lu = new EnvelopeLU({ nRows: n, ptr: Int32Array.from(ptr), rows: Int32Array.from(r), vals: Float64Array.from(v) });
    expect(lu.dependentColumns).toEqual([]);
    expect(lu.dependentRows).toEqual([]);
    const b = Float64Array.from({ length: n }, () => rand());
    const x = new Float64Array(n);
    lu.solve(Float64Array.from(b), x);
    const ref = denseSolve(A, Matrix.columnVector(Array.from(b)));
    for (let i = 0; i < n; i++) expectClose(x[i] ?? 0, ref.get(i, 0), 1e-10, `x${i}`);
    // transposed solve: Aᵀ z = g
    const g = Float64Array.from({ length: n }, () => rand());
    const z = lu.solveTransposed(Float64Array.from(g));
    const refT = denseSolve(A.transpose(), Matrix.columnVector(Array.from(g)));
    for (let i = 0; i < n; i++) expectClose(z[i] ?? 0, refT.get(i, 0), 1e-10, `z${i}`);
  });

  it("a dependent column is reported and the rest still solves", () => {
    // columns: e1, e2, e1 + e2 (dependent), e3
    const lu = new EnvelopeLU({
      nRows: 3,
      ptr: Int32Array.of(0, 1, 2, 4, 5),
      rows: Int32Array.of(0, 1, 0, 1, 2),
      vals: Float64Array.of(2, 3, 1, 1, 5),
    });
    expect(lu.dependentColumns).toEqual([2]);
    const x = Float64Array.of(0, 0, 1, 0); // the dependent column's value preset to 1
    lu.solve(Float64Array.of(4, 6, 10), x);
    expect(Array.from(x)).toEqual([1.5, 5 / 3, 1, 2]);
  });

  it("Gauss–Legendre 4-point rule integrates x⁷ exactly and not x⁸ (Abramowitz & Stegun 25.4.30)", () => {
    const g = gaussOnSegment(2);
    let s7 = 0;
    let s8 = 0;
    for (let i = 0; i < 4; i++) {
      s7 += (g.w[i] ?? 0) * (g.h[i] ?? 0) ** 7;
      s8 += (g.w[i] ?? 0) * (g.h[i] ?? 0) ** 8;
    }
    expectClose(s7, 2 ** 8 / 8, 1e-14, "∫₀² x⁷");
    expect(Math.abs(s8 - 2 ** 9 / 9)).toBeGreaterThan(1e-3);
  });

  it("polynomial roots are isolated and bisected to full precision", () => {
    // (x − 0.3)(x − 0.5)(x − 0.9) = x³ − 1.7x² + 0.87x − 0.135
    const roots = rootsIn([-0.135, 0.87, -1.7, 1], 0, 1);
    expect(roots).toHaveLength(3);
    [0.3, 0.5, 0.9].forEach((r, i) => expectClose(roots[i] ?? 0, r, 1e-14, `root ${i}`));
    // 8ξ³ − 9ξ² + 1 = 0 has the root (1 + √33)/16 (propped cantilever, see aisc-table-3-23.test.ts)
    const prop = rootsIn([1, 0, -9, 8], 0.01, 0.99);
    expect(prop).toHaveLength(1);
    expectClose(prop[0] ?? 0, (1 + Math.sqrt(33)) / 16, 1e-15, "propped cantilever root");
  });
});
