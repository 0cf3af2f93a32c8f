import type { ReactNode } from "react";
import { Wordmark } from "@/components/shell/wordmark";
import { DEPARTMENT } from "@/lib/department";

export default function PublicLayout({ children }: { children: ReactNode }) {
  return (
    <div className="flex min-h-screen flex-col">
      <header className="border-b border-rule bg-sheet">
        <div className="mx-auto flex max-w-5xl items-center justify-between px-6 py-4">
          <Wordmark />
          <span className="text-sm text-ink-soft">
            {DEPARTMENT.city} · {DEPARTMENT.division}
          </span>
        </div>
      </header>
      <main className="mx-auto w-full max-w-md flex-1 px-6 py-12">{children}</main>
      <footer className="border-t border-rule py-4 text-center text-xs text-ink-faint">
        {DEPARTMENT.address} · {DEPARTMENT.phone}
      </footer>
    </div>
  );
}
