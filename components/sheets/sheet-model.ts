// Which sheets make up a set, and which earlier version a revised sheet replaces.
// Pure: no React, no pdf.js, so it runs in unit tests as is.
import type { PinStatus, ViewerDocument, ViewerPin, ViewerSheet } from "@/components/sheets/viewer-types";

export interface SetEntry {
  sheet: ViewerSheet;
  /** Earlier versions of the same sheet number, most recent cycle first. */
  earlier: ViewerSheet[];
}

export interface SheetSets {
  /** Cycles that have sheets, ascending. */
  cycles: number[];
  latestCycle: number;
  /** The set in force: for each sheet, its latest version, in the order sheets first appeared. */
  current: SetEntry[];
  /** Each cycle's sheets as submitted, in document and page order. */
  byCycle: Map<number, SetEntry[]>;
}

/**
 * Identity of a sheet across cycles is its sheet number (a revised sheet keeps its number and
 * records the revision in the title block: common practice, no source). Case and spaces are
 * not significant; punctuation is, because "A1.01" and "A-101" are different schemes.
 */
export function normalizeSheetNumber(sheetNumber: string | null): string | null {
  if (sheetNumber === null) return null;
  const n = sheetNumber.replace(/\s+/g, "").toUpperCase();
  return n === "" ? null : n;
}

function uniqueKey(sheet: ViewerSheet): string {
  return `doc:${sheet.documentId}:p${sheet.page}`;
}

function orderWithin(documents: ViewerDocument[]) {
  const docIndex = new Map(documents.map((d, i) => [d.id, i]));
  return (a: ViewerSheet, b: ViewerSheet) =>
    a.cycle - b.cycle ||
    (docIndex.get(a.documentId) ?? Number.MAX_SAFE_INTEGER) - (docIndex.get(b.documentId) ?? Number.MAX_SAFE_INTEGER) ||
    a.documentId - b.documentId ||
    a.page - b.page;
}

/**
 * Keys per sheet id. A number used twice within one cycle (a misread title block, or the same
 * sheet in two files) is not an identity: the second copy gets a key of its own so no page
 * disappears from the list.
 */
function keysById(ordered: ViewerSheet[]): Map<number, string> {
  const keys = new Map<number, string>();
  const seenInCycle = new Map<number, Set<string>>();
  for (const s of ordered) {
    const n = normalizeSheetNumber(s.sheetNumber);
    let seen = seenInCycle.get(s.cycle);
    if (!seen) {
      seen = new Set();
      seenInCycle.set(s.cycle, seen);
    }
    const key = n !== null && !seen.has(n) ? n : uniqueKey(s);
    seen.add(key);
    keys.set(s.id, key);
  }
  return keys;
}

export function buildSheetSets(documents: ViewerDocument[], sheets: ViewerSheet[]): SheetSets {
  const ordered = [...sheets].sort(orderWithin(documents));
  const keys = keysById(ordered);
  const history = new Map<string, ViewerSheet[]>();
  const current = new Map<string, SetEntry>();
  const byCycle = new Map<number, SetEntry[]>();

  for (const s of ordered) {
    const key = keys.get(s.id) ?? uniqueKey(s);
    const before = history.get(key) ?? [];
    const entry: SetEntry = { sheet: s, earlier: [...before].reverse() };
    history.set(key, [...before, s]);
    // Map.set on an existing key keeps its insertion position: a revision takes the old sheet's place.
    current.set(key, entry);
    const list = byCycle.get(s.cycle) ?? [];
    list.push(entry);
    byCycle.set(s.cycle, list);
  }

  const cycles = [...byCycle.keys()].sort((a, b) => a - b);
  return { cycles, latestCycle: cycles.at(-1) ?? 1, current: [...current.values()], byCycle };
}

export function cycleLabel(cycle: number, latestCycle: number): string {
  return cycle === latestCycle ? `Cycle ${cycle} (current)` : `Cycle ${cycle}`;
}

export function sheetLabel(sheet: ViewerSheet): string {
  return sheet.sheetNumber ? `${sheet.sheetNumber} — ${sheet.title}` : sheet.title;
}

/** Words for the canvas and the live region, e.g. "Sheet S-101, Foundation plan, cycle 2". */
export function sheetDescription(sheet: ViewerSheet): string {
  const head = sheet.sheetNumber ? `Sheet ${sheet.sheetNumber}, ${sheet.title}` : `Sheet: ${sheet.title}`;
  return `${head}, cycle ${sheet.cycle}`;
}

const STATUS_WORD: Record<PinStatus, string> = { open: "open", draft: "draft", resolved: "resolved" };

/** Accessible name of a pin: number and status in words, e.g. "Comment 3, open". */
export function pinName(pin: Pick<ViewerPin, "number" | "status">): string {
  return `Comment ${pin.number}, ${STATUS_WORD[pin.status]}`;
}

/** Pins in reading and tab order: by comment number. */
export function orderPins<T extends Pick<ViewerPin, "number" | "id">>(pins: T[]): T[] {
  return [...pins].sort((a, b) => a.number - b.number || a.id - b.id);
}
