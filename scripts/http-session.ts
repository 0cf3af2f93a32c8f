// Sign in through the Auth.js credentials endpoint as a script would (benchmarks, system tests):
// the CSRF cookie and token first, then the form post. Returns the Cookie header for later
// requests, valid on every app instance that shares AUTH_SECRET.
export async function signInOverHttp(baseUrl: string, email: string, password: string): Promise<string> {
  const jar = new Map<string, string>();
  const take = (r: Response) => {
    for (const c of r.headers.getSetCookie()) {
      const [pair = ""] = c.split(";");
      const i = pair.indexOf("=");
      jar.set(pair.slice(0, i), pair.slice(i + 1));
    }
  };
  const csrf = await fetch(`${baseUrl}/api/auth/csrf`);
  take(csrf);
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  const res = await fetch(`${baseUrl}/api/auth/callback/credentials`, {
    method: "POST",
    redirect: "manual",
    headers: { "content-type": "application/x-www-form-urlencoded", cookie: [...jar].map(([k, v]) => `${k}=${v}`).join("; "), origin: baseUrl },
    body: new URLSearchParams({ csrfToken, email, password, callbackUrl: `${baseUrl}/` }),
  });
  take(res);
  const session = [...jar.keys()].find((k) => k.includes("session-token"));
  if (!session) throw new Error(`sign-in of ${email} at ${baseUrl} failed (HTTP ${res.status}, ${res.headers.get("location")})`);
  return `${session}=${jar.get(session)}`;
}
