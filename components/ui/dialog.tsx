"use client";

import { useEffect, useRef, type ReactNode } from "react";

/** A modal built on the native <dialog>: focus trap, Escape and backdrop come from the browser. */
export function Dialog({ open, onClose, title, children }: { open: boolean; onClose: () => void; title: string; children: ReactNode }) {
  const ref = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const d = ref.current;
    if (!d) return;
    if (open && !d.open) d.showModal();
    if (!open && d.open) d.close();
  }, [open]);
  return (
    <dialog
      ref={ref}
      onClose={onClose}
      aria-labelledby="dialog-title"
      className="m-auto w-full max-w-lg border border-rule-strong bg-sheet p-0 text-ink shadow-xl backdrop:bg-ink/30"
    >
      <div className="border-b border-rule px-5 py-3">
        <h2 id="dialog-title" className="text-lg font-semibold">
          {title}
        </h2>
      </div>
      <div className="px-5 py-4">{open ? children : null}</div>
    </dialog>
  );
}
