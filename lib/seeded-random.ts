/**
 * Deterministic random numbers in [0, 1) from a 32-bit seed (mulberry32), so generated demo data
 * and randomized test rounds can be replayed from their seed. Not for anything secret.
 */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A whole number in [min, maxInclusive] from such a generator. */
export const randomInt = (random: () => number, min: number, maxInclusive: number) => min + Math.floor(random() * (maxInclusive - min + 1));
