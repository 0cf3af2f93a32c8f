// Money as integer cents, formatted and parsed with integer arithmetic only: no binary
// floating point ever touches an amount (0.1 + 0.2 ≠ 0.3; 1.005 × 100 = 100.49999…).

/** "$1,234.56" (US dollars; a minus sign before the dollar sign for negatives). */
export function formatCents(cents: number): string {
  if (!Number.isSafeInteger(cents)) throw new RangeError(`An amount must be a whole number of cents; got ${cents}.`);
  const sign = cents < 0 ? "-" : "";
  const abs = Math.abs(cents);
  const dollars = Math.floor(abs / 100);
  const rest = abs % 100;
  return `${sign}$${dollars.toLocaleString("en-US")}.${String(rest).padStart(2, "0")}`;
}

/**
 * An exact value of `numerator / denominator` dollars-cents, written with as many decimals as
 * it needs (at most `maxDecimals`), e.g. 95 533 750 / 1 000 000 → "$955.3375". For showing the
 * unrounded product before it is rounded to the cent.
 */
export function formatExactCents(numerator: bigint, denominator: bigint, maxDecimals = 6): string {
  if (denominator <= 0n) throw new RangeError("The denominator must be positive.");
  const negative = numerator < 0n;
  const n = negative ? -numerator : numerator;
  // Value in cents = n / d; in dollars = n / (100 d).
  const scale = 10n ** BigInt(maxDecimals);
  const scaled = (n * scale) / (100n * denominator); // dollars × 10^maxDecimals, truncated
  const exact = (n * scale) % (100n * denominator) === 0n;
  const whole = scaled / scale;
  let frac = (scaled % scale).toString().padStart(maxDecimals, "0").replace(/0+$/, "");
  if (frac.length < 2) frac = frac.padEnd(2, "0");
  return `${negative ? "-" : ""}$${Number(whole).toLocaleString("en-US")}.${frac}${exact ? "" : "…"}`;
}

/**
 * Dollars as a person types them ("1,022.50", "$60", "3.5") → integer cents, or null when it is
 * not an amount. Parsed from the digits, never through a float.
 */
export function parseDollarsToCents(text: string): number | null {
  const v = text.replace(/[$,\s]/g, "");
  if (!/^\d{1,11}(\.\d{1,2})?$/.test(v)) return null;
  const [whole = "0", frac = ""] = v.split(".");
  return Number(whole) * 100 + Number(frac.padEnd(2, "0"));
}

/** A percentage as typed ("65", "2.5", "0.75") → basis points (65 % = 6 500), or null. */
export function parsePercentToBasisPoints(text: string): number | null {
  const v = text.replace(/[%\s]/g, "");
  if (!/^\d{1,4}(\.\d{1,2})?$/.test(v)) return null;
  const [whole = "0", frac = ""] = v.split(".");
  return Number(whole) * 100 + Number(frac.padEnd(2, "0"));
}

/** Basis points as a percentage for people: 6500 → "65%", 250 → "2.5%". */
export function formatBasisPoints(bp: number): string {
  const whole = Math.floor(bp / 100);
  const frac = String(bp % 100).padStart(2, "0").replace(/0+$/, "");
  return `${whole}${frac ? `.${frac}` : ""}%`;
}

/** Cents as the dollar text an input field shows ("1,022.50"), which parseDollarsToCents reads back. */
export function centsToInput(cents: number): string {
  return `${Math.floor(cents / 100).toLocaleString("en-US")}.${String(cents % 100).padStart(2, "0")}`;
}
