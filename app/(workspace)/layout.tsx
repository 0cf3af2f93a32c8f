import type { ReactNode } from "react";
import { NAV_BY_ROLE } from "@/components/shell/nav";
import { SideNav } from "@/components/shell/side-nav";
import { Wordmark } from "@/components/shell/wordmark";
import { Providers } from "@/components/shell/providers";
import { signOutAction } from "./actions";
import { requirePageUser } from "@/lib/auth/session";
import { DEPARTMENT } from "@/lib/department";
import { env } from "@/lib/env";
import { ROLE_LABELS } from "@/lib/workflow/roles";

export default async function WorkspaceLayout({ children }: { children: ReactNode }) {
  const user = await requirePageUser();
  const items = [...NAV_BY_ROLE[user.role]];
  if (user.role === "admin" && env().DEMO_MODE) items.push({ href: "/admin/mailbox", label: "Captured mail (demo)" });
  return (
    <Providers>
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:bg-sheet focus:p-2">
        Skip to content
      </a>
      <header className="no-print border-b border-rule bg-sheet">
        <div className="mx-auto flex max-w-[1400px] flex-wrap items-center justify-between gap-3 px-5 py-3">
          <div className="flex items-center gap-4">
            <Wordmark />
            <span className="hidden text-xs text-ink-faint sm:inline">
              {DEPARTMENT.city} · {DEPARTMENT.division}
            </span>
          </div>
          <div className="flex items-center gap-4 text-sm">
            <span>
              <span className="font-medium" data-testid="user-name">{user.name}</span>
              <span className="ml-2 text-ink-soft" data-testid="user-role">{ROLE_LABELS[user.role]}</span>
            </span>
            <form action={signOutAction}>
              <button type="submit" className="text-accent underline-offset-2 hover:underline">
                Sign out
              </button>
            </form>
          </div>
        </div>
      </header>
      <div className="mx-auto flex max-w-[1400px] flex-col gap-6 px-5 py-6 md:flex-row">
        <aside className="no-print md:w-48 md:shrink-0">
          <SideNav items={items} />
        </aside>
        <main id="main" className="min-w-0 flex-1">
          {children}
        </main>
      </div>
    </Providers>
  );
}
