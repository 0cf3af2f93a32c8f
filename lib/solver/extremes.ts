import { vOffset, type MemberField } from "@/lib/solver/member-field";
import { evalPoly, rootsIn } from "@/lib/solver/polynomial";

/** Largest transverse displacement along a member: signed value (m, local y) and where (m). */
export interface TransverseExtreme {
  value: number;
  x: number;
}

/**
 * Candidates are the segment ends and the roots of the slope v'(x) inside each segment; v is
 * a polynomial of degree ≤ 5 there, so its critical points are isolated exactly (polynomial.ts)
 * and bisected to the last bit — far inside the required 1e-9 of the span.
 */
export function maxTransverse(f: MemberField): TransverseExtreme {
  let value = 0;
  let x = 0;
  let best = -1;
  for (let k = 0; k < f.nSeg; k++) {
    const x0 = f.g.xs[k] ?? 0;
    const len = (f.g.xs[k + 1] ?? 0) - x0;
    const o = vOffset(f, k);
    const c = f.c;
    const v0 = c[o] ?? 0;
    if (Math.abs(v0) > best) {
      best = Math.abs(v0);
      value = v0;
      x = x0;
    }
    const v1 = evalPoly(c, o, 6, len);
    if (Math.abs(v1) > best) {
      best = Math.abs(v1);
      value = v1;
      x = x0 + len;
    }
    // A linear v (axial members, unloaded chords) has its extremes at the ends.
    if (c[o + 2] === 0 && c[o + 3] === 0 && c[o + 4] === 0 && c[o + 5] === 0) continue;
    const slope = [1, 2, 3, 4, 5].map((i) => i * (c[o + i] ?? 0));
    for (const h of rootsIn(slope, 0, len)) {
      const vh = evalPoly(c, o, 6, h);
      if (Math.abs(vh) > best) {
        best = Math.abs(vh);
        value = vh;
        x = x0 + h;
      }
    }
  }
  return { value, x };
}
