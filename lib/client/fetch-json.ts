// Client-side JSON calls that surface the API's one error shape as an Error with fields.
export class ApiError extends Error {
  constructor(
    message: string,
    readonly status: number,
    readonly code: string,
    readonly fields?: Record<string, string>,
  ) {
    super(message);
  }
}

export async function fetchJson<T>(url: string, init?: RequestInit & { json?: unknown }): Promise<T> {
  const { json, ...rest } = init ?? {};
  const res = await fetch(url, {
    ...rest,
    headers: { ...(json !== undefined ? { "content-type": "application/json" } : {}), ...rest.headers },
    body: json !== undefined ? JSON.stringify(json) : rest.body,
  });
  const body = (await res.json().catch(() => ({}))) as { error?: { message: string; code: string; fields?: Record<string, string> } };
  if (!res.ok) {
    throw new ApiError(body.error?.message ?? `Request failed (${res.status}).`, res.status, body.error?.code ?? "internal", body.error?.fields);
  }
  return body as T;
}
