/** Small helpers for polynomials stored as coefficient runs c[off] + c[off+1]·h + … */

export function evalPoly(c: ArrayLike<number>, off: number, n: number, h: number): number {
  let s = 0;
  for (let i = n - 1; i >= 0; i--) s = s * h + (c[off + i] ?? 0);
  return s;
}

function derivative(c: readonly number[]): number[] {
  const d: number[] = [];
  for (let i = 1; i < c.length; i++) d.push(i * (c[i] ?? 0));
  return d;
}

function trimmed(c: readonly number[]): number[] {
  const out = [...c];
  while (out.length > 1 && (out[out.length - 1] ?? 0) === 0) out.pop();
  return out;
}

function bisect(c: readonly number[], a: number, b: number, fa: number): number {
  let lo = a;
  let hi = b;
  let flo = fa;
  for (let it = 0; it < 200 && hi - lo > 0; it++) {
    const mid = 0.5 * (lo + hi);
    if (mid <= lo || mid >= hi) break;
    const fm = evalPoly(c, 0, c.length, mid);
    if (fm === 0) return mid;
    if (fm < 0 === flo < 0) {
      lo = mid;
      flo = fm;
    } else hi = mid;
  }
  return 0.5 * (lo + hi);
}

/**
 * Real roots of the polynomial on [a, b], isolated exactly: between consecutive roots of the
 * derivative the polynomial is monotone, so each sign change holds one root, found by bisection
 * to the last bit.
 */
export function rootsIn(coeffs: readonly number[], a: number, b: number): number[] {
  const c = trimmed(coeffs);
  if (c.length <= 1) return [];
  if (c.length === 2) {
    const r = -(c[0] ?? 0) / (c[1] ?? 1);
    return r >= a && r <= b ? [r] : [];
  }
  const crit = rootsIn(derivative(c), a, b);
  const knots = [a, ...crit, b];
  const roots: number[] = [];
  for (let k = 0; k + 1 < knots.length; k++) {
    const x0 = knots[k] ?? a;
    const x1 = knots[k + 1] ?? b;
    const f0 = evalPoly(c, 0, c.length, x0);
    const f1 = evalPoly(c, 0, c.length, x1);
    if (f0 === 0) {
      if (roots.length === 0 || Math.abs((roots[roots.length - 1] ?? 0) - x0) > 0) roots.push(x0);
      continue;
    }
    if (f0 < 0 !== f1 < 0 && f1 !== 0) roots.push(bisect(c, x0, x1, f0));
  }
  const last = evalPoly(c, 0, c.length, b);
  if (last === 0 && (roots.length === 0 || roots[roots.length - 1] !== b)) roots.push(b);
  return roots;
}
