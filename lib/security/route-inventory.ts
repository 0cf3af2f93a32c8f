// What the source actually exposes, for comparing with the access matrix: every app/**/route.ts
// with its exported HTTP methods, and every export of a "use server" module. Reads files only;
// used by the tests, never by the app.
import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import { ACTION_MATRIX, ROUTE_MATRIX, actionKey, routeKey } from "./access-matrix";

const METHODS = ["GET", "HEAD", "POST", "PUT", "PATCH", "DELETE", "OPTIONS"] as const;

function walk(dir: string, out: string[] = []): string[] {
  for (const name of readdirSync(dir)) {
    const p = path.join(dir, name);
    if (statSync(p).isDirectory()) walk(p, out);
    else out.push(p);
  }
  return out;
}

/** app/api/(x)/users/[id]/route.ts → /api/users/[id]: route groups leave no trace in the URL. */
export function urlPathOf(file: string, appDir: string): string {
  const rel = path.relative(appDir, path.dirname(file)).split(path.sep).filter((s) => s && !/^\(.*\)$/.test(s));
  return `/${rel.join("/")}`;
}

/** The HTTP methods a route module exports: `export const GET =`, `export async function POST(`, `export const { GET, POST } =`. */
export function exportedMethods(source: string): string[] {
  const found = new Set<string>();
  for (const m of source.matchAll(/export\s+(?:const|let|async\s+function|function)\s+([A-Z]+)\b/g)) found.add(m[1]!);
  for (const m of source.matchAll(/export\s+const\s*\{([^}]*)\}\s*=/g)) {
    for (const part of m[1]!.split(",")) {
      const name = part.split(":").pop()!.trim();
      if (name) found.add(name);
    }
  }
  for (const m of source.matchAll(/export\s*\{([^}]*)\}/g)) {
    for (const part of m[1]!.split(",")) {
      const name = part.split(/\s+as\s+/).pop()!.trim();
      if (name) found.add(name);
    }
  }
  return [...found].filter((n) => (METHODS as readonly string[]).includes(n)).sort();
}

/** The exported functions of a module whose first statement is "use server". */
export function serverActionExports(source: string): string[] | null {
  if (!/^\s*(?:\/\/[^\n]*\n|\/\*[\s\S]*?\*\/\s*)*["']use server["']/.test(source)) return null;
  const names = new Set<string>();
  for (const m of source.matchAll(/export\s+(?:async\s+)?function\s+(\w+)/g)) names.add(m[1]!);
  for (const m of source.matchAll(/export\s+const\s+(\w+)\s*=/g)) names.add(m[1]!);
  return [...names].sort();
}

export interface Inventory {
  routes: { key: string; file: string }[];
  actions: { key: string; file: string }[];
}

export function inventory(root: string): Inventory {
  const appDir = path.join(root, "app");
  const routes: Inventory["routes"] = [];
  const actions: Inventory["actions"] = [];
  for (const file of walk(appDir)) {
    if (!/\.(ts|tsx)$/.test(file)) continue;
    const rel = path.relative(root, file).split(path.sep).join("/");
    const source = readFileSync(file, "utf8");
    if (/\/route\.tsx?$/.test(rel)) {
      for (const method of exportedMethods(source)) routes.push({ key: `${method} ${urlPathOf(file, appDir)}`, file: rel });
    }
    const exported = serverActionExports(source);
    if (exported) for (const name of exported) actions.push({ key: `${rel}#${name}`, file: rel });
  }
  return { routes, actions };
}

/** Every difference between the source and the matrix, one line each, naming the route or action. */
export function matrixGaps(inv: Inventory): string[] {
  const gaps: string[] = [];
  const rows = new Set(ROUTE_MATRIX.map(routeKey));
  const acts = new Set(ACTION_MATRIX.map(actionKey));
  const seenRoutes = new Set(inv.routes.map((r) => r.key));
  const seenActions = new Set(inv.actions.map((a) => a.key));
  for (const r of inv.routes) if (!rows.has(r.key)) gaps.push(`route ${r.key} (${r.file}) has no row in lib/security/access-matrix.ts`);
  for (const a of inv.actions) if (!acts.has(a.key)) gaps.push(`server action ${a.key} has no row in lib/security/access-matrix.ts`);
  for (const k of rows) if (!seenRoutes.has(k)) gaps.push(`matrix row ${k} names no exported route handler`);
  for (const k of acts) if (!seenActions.has(k)) gaps.push(`matrix row ${k} names no exported server action`);
  const dup = ROUTE_MATRIX.map(routeKey).filter((k, i, all) => all.indexOf(k) !== i);
  for (const k of dup) gaps.push(`matrix row ${k} appears twice`);
  return gaps;
}
