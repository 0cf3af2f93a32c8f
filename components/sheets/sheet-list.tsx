"use client";

import { useEffect, useId, useRef, useState } from "react";
import type { PdfCache } from "@/components/sheets/pdf-cache";
import { revealWithin } from "@/components/sheets/scroll-within";
import type { SetEntry } from "@/components/sheets/sheet-model";
import { Thumbnail } from "@/components/sheets/thumbnail";
import type { ViewerDocument } from "@/components/sheets/viewer-types";

export type SetChoice = "current" | number;

interface SheetListProps {
  cache: PdfCache | null;
  documents: Map<number, ViewerDocument>;
  entries: SetEntry[];
  cycles: number[];
  latestCycle: number;
  choice: SetChoice;
  onChoice: (choice: SetChoice) => void;
  currentSheetId: number | null;
  onPick: (sheetId: number) => void;
}

/** A revision delta, as drawn beside a revised detail: a triangle holding the cycle number. */
export function RevisionDelta({ cycle }: { cycle: number }) {
  return (
    <svg aria-hidden="true" viewBox="0 0 20 18" className="inline-block h-4 w-4 shrink-0 align-[-3px]">
      <path d="M10 1.5 L18.5 16.5 L1.5 16.5 Z" fill="var(--color-sheet)" stroke="var(--color-ink)" strokeWidth="1.3" strokeLinejoin="miter" />
      <text x="10" y="14.2" textAnchor="middle" fontSize="8.5" fontFamily="var(--font-mono)" fill="var(--color-ink)">
        {cycle}
      </text>
    </svg>
  );
}

export function SheetList({ cache, documents, entries, cycles, latestCycle, choice, onChoice, currentSheetId, onPick }: SheetListProps) {
  const [root, setRoot] = useState<HTMLOListElement | null>(null);
  const currentRef = useRef<HTMLButtonElement | null>(null);
  const setId = useId();

  useEffect(() => {
    if (root && currentRef.current) revealWithin(root, currentRef.current);
  }, [currentSheetId, choice, root]);

  return (
    <nav aria-label="Sheets" className="flex min-h-0 flex-col">
      {cycles.length > 1 ? (
        <div className="border-b border-rule px-3 py-2">
          <label htmlFor={setId} className="block text-xs font-medium text-ink-soft">
            Sheet set
          </label>
          <p id={`${setId}-hint`} className="sr-only">
            The current set holds the latest version of each sheet.
          </p>
          <select
            id={setId}
            aria-describedby={`${setId}-hint`}
            value={String(choice)}
            onChange={(e) => onChoice(e.target.value === "current" ? "current" : Number(e.target.value))}
            className="mt-1 block w-full rounded-sm border border-rule-strong bg-sheet px-2 py-1 text-sm text-ink"
          >
            <option value="current">Current set</option>
            {cycles.map((c) => (
              <option key={c} value={c}>
                Cycle {c} as submitted{c === latestCycle ? " (current)" : ""}
              </option>
            ))}
          </select>
        </div>
      ) : null}
      <ol ref={setRoot} className="min-h-0 flex-1 overflow-y-auto py-1">
        {entries.map(({ sheet, earlier }) => {
          const current = sheet.id === currentSheetId;
          const revised = earlier.length > 0;
          return (
            <li key={sheet.id}>
              <button
                type="button"
                ref={current ? currentRef : undefined}
                aria-current={current ? "true" : undefined}
                onClick={() => onPick(sheet.id)}
                className={`flex w-full items-start gap-2 border-l-2 px-3 py-1.5 text-left hover:bg-sheet ${
                  current ? "border-accent bg-sheet" : "border-transparent"
                }`}
              >
                <Thumbnail cache={cache} doc={documents.get(sheet.documentId)} page={sheet.page} root={root} />
                <span className="min-w-0 flex-1">
                  <span className="flex items-center gap-1">
                    <span className={`num whitespace-nowrap text-xs text-ink ${current ? "font-semibold" : ""}`}>{sheet.sheetNumber ?? `p. ${sheet.page}`}</span>
                    {revised ? <RevisionDelta cycle={sheet.cycle} /> : null}
                  </span>
                  <span className="mt-0.5 line-clamp-2 block text-xs text-ink-soft">{sheet.title}</span>
                  {revised ? <span className="mt-0.5 block text-[10px] text-ink-soft">Revised in cycle {sheet.cycle}</span> : null}
                </span>
              </button>
            </li>
          );
        })}
      </ol>
    </nav>
  );
}
