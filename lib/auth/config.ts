import "server-only";
import NextAuth, { CredentialsSignin } from "next-auth";
import type {} from "next-auth/jwt";
import Credentials from "next-auth/providers/credentials";
import { db } from "@/db/client";
import { env } from "@/lib/env";
import { signInSchema } from "@/lib/validations/auth";
import { verifyCredentials } from "./credentials";
import { clientIp } from "./request-ip";

declare module "next-auth" {
  interface User {
    uid?: number;
    role?: string;
    sv?: number;
  }
  interface Session {
    uid: number;
    sv: number;
  }
}
declare module "next-auth/jwt" {
  interface JWT {
    uid?: number;
    role?: string;
    sv?: number;
  }
}

class ThrottledSignIn extends CredentialsSignin {
  override code = "throttled";
}

export const { handlers, auth, signIn, signOut } = NextAuth(() => {
  const e = env();
  return {
    secret: e.AUTH_SECRET,
    trustHost: true,
    // Absolute lifetime; the token is also re-checked against the database on every request.
    session: { strategy: "jwt", maxAge: e.SESSION_MAX_AGE_MIN * 60, updateAge: 0 },
    pages: { signIn: "/sign-in" },
    useSecureCookies: e.APP_URL.startsWith("https://"),
    providers: [
      Credentials({
        credentials: { email: {}, password: {} },
        async authorize(raw, request) {
          const parsed = signInSchema.safeParse(raw);
          if (!parsed.success) return null;
          const r = await verifyCredentials(db(), parsed.data.email, parsed.data.password, clientIp(request.headers));
          if (!r.ok) {
            if (r.reason === "throttled") throw new ThrottledSignIn();
            return null;
          }
          return { id: String(r.user.id), uid: r.user.id, email: r.user.email, name: r.user.name, role: r.user.role, sv: r.user.sessionVersion };
        },
      }),
    ],
    callbacks: {
      jwt({ token, user }) {
        if (user) {
          token.uid = user.uid;
          token.role = user.role;
          token.sv = user.sv;
        }
        return token;
      },
      session({ session, token }) {
        session.uid = token.uid ?? 0;
        session.sv = token.sv ?? 0;
        return session;
      },
    },
  };
});
