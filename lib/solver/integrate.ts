/**
 * Gauss–Legendre quadrature on [a, b]. n points integrate polynomials up to degree 2n − 1
 * exactly. Along a member every field is a polynomial between breakpoints (supports, joints,
 * load points, load ends, find points): N and V at most quadratic, M at most cubic under a
 * linearly varying load, so products such as M·m (degree 4) or M² (degree 6) need 3 and 4
 * points. The checker uses GAUSS_POINTS = 4 on every segment: exact to degree 7.
 */

export const GAUSS_POINTS = 4;

// Abscissae and weights on [−1, 1] (Abramowitz & Stegun, Table 25.4), to 16 digits.
const X4 = [-0.8611363115940526, -0.3399810435848563, 0.3399810435848563, 0.8611363115940526];
const W4 = [0.3478548451374538, 0.6521451548625461, 0.6521451548625461, 0.3478548451374538];

const RULES: Record<number, { x: number[]; w: number[] }> = {
  1: { x: [0], w: [2] },
  2: { x: [-0.5773502691896257, 0.5773502691896257], w: [1, 1] },
  3: { x: [-0.7745966692414834, 0, 0.7745966692414834], w: [0.5555555555555556, 0.8888888888888888, 0.5555555555555556] },
  4: { x: X4, w: W4 },
  5: {
    x: [-0.906179845938664, -0.5384693101056831, 0, 0.5384693101056831, 0.906179845938664],
    w: [0.2369268850561891, 0.4786286704993665, 0.5688888888888889, 0.4786286704993665, 0.2369268850561891],
  },
};

export interface GaussRule {
  /** offsets from the segment start, m */
  h: Float64Array;
  /** weights including the half-length Jacobian, m */
  w: Float64Array;
}

/** The n-point rule mapped to a segment of length len (m), as offsets from its start. */
export function gaussOnSegment(len: number, n = GAUSS_POINTS): GaussRule {
  const rule = RULES[n];
  if (!rule) throw new Error(`no ${n}-point Gauss–Legendre rule`);
  const h = new Float64Array(n);
  const w = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    h[i] = ((rule.x[i] ?? 0) + 1) * 0.5 * len;
    w[i] = (rule.w[i] ?? 0) * 0.5 * len;
  }
  return { h, w };
}
