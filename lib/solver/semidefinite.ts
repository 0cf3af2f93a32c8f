/**
 * Solves F x = b for a symmetric positive semidefinite flexibility matrix (row-major n × n).
 * A redundant with no flexibility (only axially rigid members feel it) gets x = 0; that is
 * right when nothing strains it, and `inconsistent` names it (index) when something does.
 */
export function solveSemidefinite(F: Float64Array, b: Float64Array, n: number): { x: Float64Array; inconsistent: number } {
  let maxDiag = 0;
  for (let i = 0; i < n; i++) maxDiag = Math.max(maxDiag, F[i * n + i] ?? 0);
  // Jacobi scaling makes the pivot test independent of the redundants' units (N vs N·m).
  const scale = new Float64Array(n);
  const keep: number[] = [];
  for (let i = 0; i < n; i++) {
    const f = F[i * n + i] ?? 0;
    if (f > 1e-13 * maxDiag) {
      scale[i] = 1 / Math.sqrt(f);
      keep.push(i);
    }
  }
  // Cholesky of the scaled matrix over the kept indices, dropping pivots that vanish.
  const k = keep.length;
  const Lm = new Float64Array(k * k);
  const used: boolean[] = new Array(k).fill(true);
  for (let a = 0; a < k; a++) {
    const ia = keep[a] ?? 0;
    for (let c = 0; c <= a; c++) {
      const ic = keep[c] ?? 0;
      let sum = (F[ia * n + ic] ?? 0) * (scale[ia] ?? 0) * (scale[ic] ?? 0);
      for (let t = 0; t < c; t++) if (used[t]) sum -= (Lm[a * k + t] ?? 0) * (Lm[c * k + t] ?? 0);
      if (c === a) {
        if (sum <= 1e-12) {
          used[a] = false;
          for (let t = 0; t < a; t++) Lm[a * k + t] = 0;
        } else Lm[a * k + a] = Math.sqrt(sum);
      } else if (used[c]) Lm[a * k + c] = sum / (Lm[c * k + c] ?? 1);
    }
  }
  const y = new Float64Array(k);
  for (let a = 0; a < k; a++) {
    if (!used[a]) continue;
    let sum = (b[keep[a] ?? 0] ?? 0) * (scale[keep[a] ?? 0] ?? 0);
    for (let t = 0; t < a; t++) if (used[t]) sum -= (Lm[a * k + t] ?? 0) * (y[t] ?? 0);
    y[a] = sum / (Lm[a * k + a] ?? 1);
  }
  const z = new Float64Array(k);
  for (let a = k - 1; a >= 0; a--) {
    if (!used[a]) continue;
    let sum = y[a] ?? 0;
    for (let t = a + 1; t < k; t++) if (used[t]) sum -= (Lm[t * k + a] ?? 0) * (z[t] ?? 0);
    z[a] = sum / (Lm[a * k + a] ?? 1);
  }
  const x = new Float64Array(n);
  keep.forEach((i, a) => (x[i] = (z[a] ?? 0) * (scale[i] ?? 0)));
  // Residual test: every equation, including the dropped ones, must hold.
  let bMax = 0;
  for (let i = 0; i < n; i++) bMax = Math.max(bMax, Math.abs(b[i] ?? 0));
  let inconsistent = -1;
  for (let i = 0; i < n && inconsistent < 0; i++) {
    let res = -(b[i] ?? 0);
    let mag = Math.abs(b[i] ?? 0);
    for (let j = 0; j < n; j++) {
      const t = (F[i * n + j] ?? 0) * (x[j] ?? 0);
      res += t;
      mag = Math.max(mag, Math.abs(t));
    }
    if (Math.abs(res) > 1e-8 * Math.max(mag, 1e-12 * bMax) && Math.abs(res) > 1e-14 * bMax) inconsistent = i;
  }
  return { x, inconsistent };
}
