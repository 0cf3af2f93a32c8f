import { NextResponse, type NextRequest } from "next/server";

// Convenience only: send visitors without a session cookie to sign-in. Every page, route
// handler and server action authorizes on its own; this is never the guard.
const PUBLIC = [/^\/sign-in/, /^\/invite\//, /^\/reset/, /^\/api\//, /^\/_next\//, /^\/favicon/, /^\/pdf\.worker/];

export function proxy(req: NextRequest) {
  const path = req.nextUrl.pathname;
  if (PUBLIC.some((r) => r.test(path))) return NextResponse.next();
  const hasSession = req.cookies.getAll().some((c) => c.name.endsWith("authjs.session-token"));
  if (!hasSession) return NextResponse.redirect(new URL("/sign-in", req.url));
  return NextResponse.next();
}

export const config = { matcher: ["/((?!_next/static|_next/image|fonts/).*)"] };
