/** The client's address as the reverse proxy reports it; "local" when served directly. */
export function clientIp(headers: Headers): string {
  const fwd = headers.get("x-forwarded-for")?.split(",")[0]?.trim();
  const ip = fwd || headers.get("x-real-ip") || "local";
  return ip.slice(0, 64);
}
