import { CLAIM_COMBOS } from "@/lib/checks/claims";
import { toSi } from "@/lib/checks/quantities";

// Claimed deflections written in one cell, as the table editor and the CSV schedule take them:
// "L 0.42 in; D+L 0.61 in". Combination first, then the deflection with its unit.

export interface ClaimEntry {
  combo: string;
  /** the deflection as a model-file quantity, e.g. "0.42 in" */
  delta: string;
}

export type ClaimsParse = { ok: true; claims: ClaimEntry[] } | { ok: false; message: string };

export function parseClaimsText(text: string): ClaimsParse {
  const claims: ClaimEntry[] = [];
  const parts = text
    .split(";")
    .map((p) => p.trim())
    .filter((p) => p !== "");
  for (const part of parts) {
    const m = /^(\S+)\s+(.+)$/.exec(part);
    if (!m?.[1] || !m[2]) return { ok: false, message: `"${part}": write the combination, then the deflection, e.g. "L 0.42 in"` };
    const combo = m[1].replace(/\s+/g, "");
    if (!(CLAIM_COMBOS as readonly string[]).includes(combo)) {
      return { ok: false, message: `"${part}": the combination must be one of ${CLAIM_COMBOS.join(", ")}` };
    }
    const delta = m[2].trim();
    const si = toSi(delta, "length");
    if (si === null) return { ok: false, message: `"${part}": "${delta}" is not a deflection with a unit (in or mm)` };
    if (!(si > 0)) return { ok: false, message: `"${part}": the deflection must be greater than zero` };
    claims.push({ combo, delta });
  }
  return { ok: true, claims };
}

export function claimsToText(claims: readonly { combo: string; delta: string }[]): string {
  return claims.map((c) => `${c.combo} ${c.delta}`).join("; ");
}
