import path from "node:path";
import { describe, expect, it } from "vitest";
import { ACTION_MATRIX, ACCESS_ACTORS, ROUTE_MATRIX, compilePattern, isAllowed, matchRoute, paramObject } from "@/lib/security/access-matrix";
import { exportedMethods, inventory, matrixGaps, serverActionExports, urlPathOf } from "@/lib/security/route-inventory";

const root = path.resolve(import.meta.dirname, "../../..");

describe("the access matrix covers the source", () => {
  it("has a row for every route handler method and server action, and no row without one", () => {
    const inv = inventory(root);
    // The app has dozens of handlers; an empty inventory would make the comparison vacuous.
    expect(inv.routes.length).toBeGreaterThanOrEqual(40);
    expect(inv.actions.length).toBeGreaterThanOrEqual(6);
    expect(matrixGaps(inv)).toEqual([]);
  });

  it("names a missing route, a missing method and a stale row", () => {
    const inv = inventory(root);
    const withNew = { ...inv, routes: [...inv.routes, { key: "POST /api/new-thing", file: "app/api/new-thing/route.ts" }] };
    expect(matrixGaps(withNew)).toEqual(["route POST /api/new-thing (app/api/new-thing/route.ts) has no row in lib/security/access-matrix.ts"]);
    const withoutMe = { ...inv, routes: inv.routes.filter((r) => r.key !== "GET /api/me") };
    expect(matrixGaps(withoutMe)).toEqual(["matrix row GET /api/me names no exported route handler"]);
    const newAction = { ...inv, actions: [...inv.actions, { key: "app/(x)/actions.ts#wipeAction", file: "app/(x)/actions.ts" }] };
    expect(matrixGaps(newAction)).toEqual(["server action app/(x)/actions.ts#wipeAction has no row in lib/security/access-matrix.ts"]);
  });
});

describe("reading exports from source", () => {
  it("finds every export form Next accepts for methods", () => {
    expect(exportedMethods("export const GET = route(async () => x);\nexport async function POST(req) {}")).toEqual(["GET", "POST"]);
    expect(exportedMethods("export const { GET, POST } = handlers;")).toEqual(["GET", "POST"]);
    expect(exportedMethods("const a = 1; export { a as DELETE, helper };")).toEqual(["DELETE"]);
    expect(exportedMethods("export const dynamic = 'force-dynamic'; export type GETX = 1;")).toEqual([]);
  });

  it("treats only modules that start with the directive as server actions", () => {
    expect(serverActionExports('"use server";\n\nexport async function a() {}\nexport async function b() {}')).toEqual(["a", "b"]);
    expect(serverActionExports("// why\n'use server';\nexport async function c() {}")).toEqual(["c"]);
    expect(serverActionExports('import x from "y";\n"use server";\nexport async function d() {}')).toBeNull();
  });

  it("drops route groups from URL paths", () => {
    expect(urlPathOf("/r/app/(staff)/api/x/[id]/route.ts", "/r/app")).toBe("/api/x/[id]");
  });
});

describe("matching requests to rows", () => {
  it("prefers a static segment over a parameter", () => {
    expect(matchRoute("GET", "/api/applications/12/checks/suggestions")?.row.path).toBe("/api/applications/[id]/checks/suggestions");
    expect(matchRoute("GET", "/api/applications/12/checks/34")).toEqual({ row: expect.objectContaining({ path: "/api/applications/[id]/checks/[checkId]" }), params: { id: "12", checkId: "34" } });
    expect(matchRoute("POST", "/api/auth/callback/credentials")?.row.path).toBe("/api/auth/[...nextauth]");
    expect(matchRoute("GET", "/api/nothing-here")).toBeNull();
    expect(matchRoute("PUT", "/api/me")).toBeNull();
  });

  it("compiles patterns without letting dots or parentheses through as regex", () => {
    expect(compilePattern("/a.b/[id]").re.test("/aXb/1")).toBe(false);
    expect(compilePattern("/a.b/[id]").params).toEqual(["id"]);
  });

  it("knows which object each path parameter names", () => {
    expect(paramObject("/api/applications/[id]/comments/[commentId]", "id")).toBe("application");
    expect(paramObject("/api/applications/[id]/comments/[commentId]", "commentId")).toBe("comment");
    expect(paramObject("/api/invoices/[id]", "id")).toBe("invoice");
    expect(paramObject("/api/settings/holidays/[day]", "day")).toBeNull();
  });
});

describe("the rows themselves", () => {
  it("never lets a deactivated or signed-out account through a row that needs a session", () => {
    for (const r of [...ROUTE_MATRIX, ...ACTION_MATRIX]) {
      if (r.allow === "public") continue;
      expect(isAllowed(r.allow, "deactivated"), JSON.stringify(r)).toBe(false);
      expect(isAllowed(r.allow, "signed_out"), JSON.stringify(r)).toBe(false);
    }
  });

  it("never lets another applicant at an object-scoped row", () => {
    for (const r of ROUTE_MATRIX) if (r.scope !== "none" && r.allow !== "public") expect(r.allow.includes("other_applicant"), `${r.method} ${r.path}`).toBe(false);
  });

  it("names only known actors", () => {
    for (const r of [...ROUTE_MATRIX, ...ACTION_MATRIX]) if (r.allow !== "public") for (const a of r.allow) expect(ACCESS_ACTORS).toContain(a);
  });
});
