import { z } from "zod";
import {
  AREA_LOAD_UNITS,
  LENGTH_UNITS,
  LINE_LOAD_UNITS,
  fmt,
  isBlank,
  optionalNumberText,
  positiveText,
  siPerUnit,
  tidy,
  type AreaLoadUnit,
  type LengthUnit,
  type LineLoadUnit,
} from "@/lib/checks/quantities";

// w = q × tributary width (+ self weight): how a calc turns an area load into a line load
// on a beam or joist (common practice, no source).

export const tributarySchema = z.object({
  q: positiveText("area load q"),
  qUnit: z.enum(AREA_LOAD_UNITS),
  width: positiveText("tributary width"),
  widthUnit: z.enum(LENGTH_UNITS),
  selfWeight: optionalNumberText("self weight"),
  outUnit: z.enum(LINE_LOAD_UNITS),
});

export type TributaryInput = z.infer<typeof tributarySchema>;

export interface TributaryResult {
  /** line load in the chosen unit */
  w: number;
  unit: LineLoadUnit;
  /** N/m */
  si: number;
  /** the arithmetic as a calc writes it, e.g. "40 psf × 6 ft = 240 plf" */
  text: string;
}

/** Line load from an area load times a tributary width, plus an optional self weight (in the output unit). */
export function tributaryLineLoad(q: number, qUnit: AreaLoadUnit, width: number, widthUnit: LengthUnit, outUnit: LineLoadUnit, selfWeight = 0): TributaryResult {
  const pa = q * siPerUnit(qUnit, "modulus");
  const m = width * siPerUnit(widthUnit, "length");
  const perOut = siPerUnit(outUnit, "lineLoad");
  const fromArea = (pa * m) / perOut;
  const w = fromArea + selfWeight;
  const si = w * perOut;
  // Write the width in the unit that pairs with the area load: ft with psf, m with kPa.
  const pairUnit: LengthUnit = qUnit === "psf" ? "ft" : "m";
  const pairWidth = (width * siPerUnit(widthUnit, "length")) / siPerUnit(pairUnit, "length");
  const widthText = widthUnit === pairUnit ? `${tidy(width)} ${widthUnit}` : `${tidy(width)} ${widthUnit} (${fmt(pairWidth, 4)} ${pairUnit})`;
  let text = `${tidy(q)} ${qUnit} × ${widthText} = ${fmt(fromArea, 4)} ${outUnit}`;
  if (selfWeight !== 0) text += ` + ${tidy(selfWeight)} ${outUnit} self weight = ${fmt(w, 4)} ${outUnit}`;
  return { w, unit: outUnit, si, text };
}

export function tributaryFromInput(t: TributaryInput): TributaryResult {
  return tributaryLineLoad(Number(t.q), t.qUnit, Number(t.width), t.widthUnit, t.outUnit, isBlank(t.selfWeight) ? 0 : Number(t.selfWeight));
}
