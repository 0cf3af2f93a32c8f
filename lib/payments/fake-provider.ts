// A local stand-in for the payment provider: only the calls Spanproof makes through the SDK
// (create, retrieve and expire a checkout session; create a refund), a hosted checkout page on
// loopback where a person pays, declines or walks away, and the provider's signed webhooks,
// signed with the SDK's own generateTestHeaderString. No money, no card data, nothing leaves
// the machine. Switches let tests hold, reorder, duplicate and replay deliveries.
import { randomBytes } from "node:crypto";
import http from "node:http";
import type { AddressInfo } from "node:net";
import Stripe from "stripe";

type Obj = Record<string, unknown>;

export interface FakeEvent {
  id: string;
  type: string;
  payload: string;
  /** HTTP status of each delivery attempt (0 = could not connect) */
  deliveries: number[];
}

export interface DeliveryMode {
  /** "before_redirect": deliver, then send the browser back (the provider's usual order);
   *  "after_redirect": send the browser back first, deliver `delayMs` later;
   *  "hold": keep events until release() (to reorder them, or lose the race on purpose) */
  delivery: "before_redirect" | "after_redirect" | "hold";
  delayMs: number;
  /** deliver every event twice, as providers occasionally do */
  duplicate: boolean;
  /** answer refunds with a provider outage (500), to test the path where a refund cannot be issued */
  failRefunds: boolean;
}

export interface FakeProviderOptions {
  /** 0 picks a free port; the returned url and port say which */
  port: number;
  host?: string;
  secretKey: string;
  webhookSecret: string;
  /** where signed events are POSTed */
  webhookUrl?: string;
  /** in-process delivery instead of HTTP (integration tests); returns the status the app answered */
  deliver?: (payload: string, signature: string) => Promise<number>;
}

export interface FakeProvider {
  url: string;
  port: number;
  events: FakeEvent[];
  sessions: Map<string, Obj>;
  mode: DeliveryMode;
  setMode(m: Partial<DeliveryMode>): void;
  /** delivers held events, in the order they happened or reversed */
  release(order?: "forward" | "reverse"): Promise<void>;
  /** delivers a past event again, byte for byte */
  resend(eventId: string): Promise<number>;
  /** forgets held and past events and restores the usual delivery (between tests) */
  reset(): void;
  /** resolves once every delivery under way has finished */
  idle(): Promise<void>;
  /** the same steps as the hosted page's buttons */
  pay(sessionId: string): Promise<void>;
  decline(sessionId: string): Promise<void>;
  /** an event the provider never sent, signed with the right secret (to build test cases) */
  signed(type: string, object: Obj): { payload: string; signature: string; id: string };
  close(): Promise<void>;
}

const rid = (prefix: string) => `${prefix}_test_${randomBytes(12).toString("hex")}`;
const nowSec = () => Math.floor(Date.now() / 1000);

/** Form bodies the SDK sends, `a[b][0][c]=v`, as nested objects and arrays. */
export function parseProviderForm(body: string): Obj {
  const root: Obj = {};
  for (const pair of body.split("&")) {
    if (!pair) continue;
    const eq = pair.indexOf("=");
    const rawKey = decodeURIComponent((eq < 0 ? pair : pair.slice(0, eq)).replace(/\+/g, " "));
    const value = eq < 0 ? "" : decodeURIComponent(pair.slice(eq + 1).replace(/\+/g, " "));
    const path = rawKey.replace(/\]/g, "").split("[");
    let node: Obj | unknown[] = root;
    for (let i = 0; i < path.length; i++) {
      const key = path[i]!;
      const last = i === path.length - 1;
      const nextIsIndex = !last && /^\d+$/.test(path[i + 1]!);
      const slot = Array.isArray(node) ? Number(key) : key;
      const holder = node as Record<string | number, unknown>;
      if (last) holder[slot] = value;
      else {
        holder[slot] ??= nextIsIndex ? [] : {};
        node = holder[slot] as Obj | unknown[];
      }
    }
  }
  return root;
}

const esc = (s: unknown) => String(s ?? "").replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
const money = (cents: number, currency: string) => `${currency === "usd" ? "$" : `${currency.toUpperCase()} `}${(Math.floor(cents / 100)).toLocaleString("en-US")}.${String(cents % 100).padStart(2, "0")}`;

export async function startFakeProvider(opts: FakeProviderOptions): Promise<FakeProvider> {
  const host = opts.host ?? "127.0.0.1";
  // Set once listening, so a port of 0 (any free one) works; requests only arrive after that.
  let base = `http://${host}:${opts.port}`;
  const sessions = new Map<string, Obj>();
  const intents = new Map<string, Obj>();
  const charges = new Map<string, Obj>();
  const events: FakeEvent[] = [];
  const held: FakeEvent[] = [];
  const idempotent = new Map<string, { status: number; body: string }>();
  const mode: DeliveryMode = { delivery: "before_redirect", delayMs: 300, duplicate: false, failRefunds: false };

  function sign(payload: string): string {
    return Stripe.webhooks.generateTestHeaderString({ payload, secret: opts.webhookSecret });
  }

  function makeEvent(type: string, object: Obj): FakeEvent {
    const e = {
      id: rid("evt"),
      object: "event",
      api_version: Stripe.API_VERSION,
      created: nowSec(),
      type,
      livemode: false,
      pending_webhooks: 1,
      request: { id: null, idempotency_key: null },
      data: { object: structuredClone(object) },
    };
    const fe: FakeEvent = { id: e.id, type, payload: JSON.stringify(e), deliveries: [] };
    events.push(fe);
    return fe;
  }

  async function deliverOnce(e: FakeEvent): Promise<number> {
    // Signed at delivery time, as the provider does: a resend carries a fresh timestamp.
    const signature = sign(e.payload);
    let status = 0;
    try {
      if (opts.deliver) status = await opts.deliver(e.payload, signature);
      else if (opts.webhookUrl) {
        const r = await fetch(opts.webhookUrl, { method: "POST", headers: { "content-type": "application/json", "stripe-signature": signature }, body: e.payload });
        status = r.status;
      }
    } catch {
      status = 0;
    }
    e.deliveries.push(status);
    return status;
  }

  async function deliver(e: FakeEvent): Promise<number> {
    // A failed delivery is retried a few times with backoff, like the provider's own retries.
    let status = 0;
    for (let attempt = 0; attempt < 4; attempt++) {
      status = await deliverOnce(e);
      if (status >= 200 && status < 300) break;
      await new Promise((r) => setTimeout(r, 200 * 2 ** attempt));
    }
    if (mode.duplicate) await deliverOnce(e);
    return status;
  }

  const inFlight = new Set<Promise<void>>();
  function later(batch: FakeEvent[], delayMs: number) {
    const p = new Promise<void>((resolve) => setTimeout(resolve, delayMs)).then(async () => {
      for (const e of batch) await deliver(e);
    });
    inFlight.add(p);
    void p.finally(() => inFlight.delete(p));
  }

  /** What happens to freshly created events, per the delivery mode; resolves when the browser may be redirected. */
  async function dispatch(batch: FakeEvent[]): Promise<void> {
    if (mode.delivery === "hold") {
      held.push(...batch);
      return;
    }
    if (mode.delivery === "after_redirect") return later(batch, mode.delayMs);
    for (const e of batch) await deliver(e);
  }

  /** Events caused by an API call go out after the response, as the provider sends them. */
  function dispatchAfterResponse(batch: FakeEvent[]) {
    if (mode.delivery === "hold") held.push(...batch);
    else later(batch, mode.delivery === "after_redirect" ? mode.delayMs : 20);
  }

  async function idle(): Promise<void> {
    while (inFlight.size) await Promise.all([...inFlight]);
  }

  function publicSession(s: Obj): Obj {
    const { line_items: _l, payment_intent_data: _p, ...rest } = s;
    return rest;
  }

  function intentFor(s: Obj): Obj {
    let pi = s.payment_intent ? intents.get(String(s.payment_intent)) : undefined;
    if (!pi) {
      const pid = (s.payment_intent_data ?? {}) as Obj;
      pi = {
        id: rid("pi"),
        object: "payment_intent",
        amount: s.amount_total,
        currency: s.currency,
        status: "requires_payment_method",
        metadata: (pid.metadata as Obj) ?? {},
        description: pid.description ?? null,
        latest_charge: null,
        last_payment_error: null,
        created: nowSec(),
        livemode: false,
      };
      intents.set(String(pi.id), pi);
      s.payment_intent = pi.id;
    }
    return pi;
  }

  async function pay(sessionId: string): Promise<void> {
    const s = sessions.get(sessionId);
    if (!s || s.status !== "open") throw new Error(`session ${sessionId} is not open`);
    const pi = intentFor(s);
    const charge: Obj = {
      id: rid("ch"),
      object: "charge",
      amount: pi.amount,
      amount_refunded: 0,
      currency: pi.currency,
      paid: true,
      refunded: false,
      status: "succeeded",
      payment_intent: pi.id,
      metadata: {},
      created: nowSec(),
      livemode: false,
    };
    charges.set(String(charge.id), charge);
    Object.assign(pi, { status: "succeeded", latest_charge: charge.id, last_payment_error: null });
    Object.assign(s, { status: "complete", payment_status: "paid" });
    await dispatch([makeEvent("payment_intent.succeeded", pi), makeEvent("checkout.session.completed", publicSession(s))]);
  }

  async function decline(sessionId: string): Promise<void> {
    const s = sessions.get(sessionId);
    if (!s || s.status !== "open") throw new Error(`session ${sessionId} is not open`);
    const pi = intentFor(s);
    Object.assign(pi, {
      status: "requires_payment_method",
      last_payment_error: { type: "card_error", code: "card_declined", decline_code: "generic_decline", message: "Your card was declined." },
    });
    // The session stays open: the person may try again with another card.
    await dispatch([makeEvent("payment_intent.payment_failed", pi)]);
  }

  function expire(s: Obj): FakeEvent {
    s.status = "expired";
    return makeEvent("checkout.session.expired", publicSession(s));
  }

  // ---- the provider's API, as the SDK calls it ---------------------------------------

  function apiError(status: number, type: string, message: string, code?: string) {
    return { status, body: { error: { type, message, ...(code ? { code } : {}) } } };
  }

  async function api(method: string, path: string, form: Obj): Promise<{ status: number; body: unknown }> {
    let m: RegExpMatchArray | null;
    if (method === "POST" && path === "/v1/checkout/sessions") {
      const items = (form.line_items as Obj[] | undefined) ?? [];
      if (!items.length) return apiError(400, "invalid_request_error", "line_items is required in payment mode.", "parameter_missing");
      if (!form.success_url) return apiError(400, "invalid_request_error", "success_url is required.", "parameter_missing");
      let total = 0;
      let currency = "";
      for (const it of items) {
        const pd = (it.price_data ?? {}) as Obj;
        const amount = Number(pd.unit_amount);
        const qty = Number(it.quantity ?? 1);
        if (!Number.isSafeInteger(amount) || amount < 0 || !Number.isSafeInteger(qty) || qty < 1) return apiError(400, "invalid_request_error", "Invalid line item amount or quantity.", "parameter_invalid_integer");
        total += amount * qty;
        currency = String(pd.currency ?? currency);
      }
      const id = rid("cs");
      const s: Obj = {
        id,
        object: "checkout.session",
        mode: form.mode ?? "payment",
        status: "open",
        payment_status: "unpaid",
        amount_subtotal: total,
        amount_total: total,
        currency,
        client_reference_id: form.client_reference_id ?? null,
        customer_email: form.customer_email ?? null,
        metadata: form.metadata ?? {},
        success_url: String(form.success_url).replace("{CHECKOUT_SESSION_ID}", id),
        cancel_url: form.cancel_url ?? null,
        url: `${base}/pay/${id}`,
        payment_intent: null,
        created: nowSec(),
        expires_at: nowSec() + 24 * 3600,
        livemode: false,
        line_items: items,
        payment_intent_data: form.payment_intent_data ?? {},
      };
      sessions.set(id, s);
      return { status: 200, body: publicSession(s) };
    }
    if (method === "GET" && (m = path.match(/^\/v1\/checkout\/sessions\/([\w]+)$/))) {
      const s = sessions.get(m[1]!);
      return s ? { status: 200, body: publicSession(s) } : apiError(404, "invalid_request_error", `No such checkout.session: '${m[1]}'`, "resource_missing");
    }
    if (method === "POST" && (m = path.match(/^\/v1\/checkout\/sessions\/([\w]+)\/expire$/))) {
      const s = sessions.get(m[1]!);
      if (!s) return apiError(404, "invalid_request_error", `No such checkout.session: '${m[1]}'`, "resource_missing");
      if (s.status !== "open") return apiError(400, "invalid_request_error", `Only Checkout Sessions with a status of open can be expired; this one is ${s.status}.`);
      dispatchAfterResponse([expire(s)]);
      return { status: 200, body: publicSession(s) };
    }
    if (method === "POST" && path === "/v1/refunds") {
      if (mode.failRefunds) return apiError(500, "api_error", "The refund service is temporarily unavailable.");
      const pi = intents.get(String(form.payment_intent ?? ""));
      if (!pi) return apiError(404, "invalid_request_error", `No such payment_intent: '${String(form.payment_intent ?? "")}'`, "resource_missing");
      const charge = charges.get(String(pi.latest_charge ?? ""));
      if (!charge || pi.status !== "succeeded") return apiError(400, "invalid_request_error", "This PaymentIntent does not have a successful charge to refund.");
      const left = Number(charge.amount) - Number(charge.amount_refunded);
      if (left <= 0) return apiError(400, "invalid_request_error", `Charge ${String(charge.id)} has already been refunded.`, "charge_already_refunded");
      const amount = form.amount ? Number(form.amount) : left;
      if (!Number.isSafeInteger(amount) || amount < 1 || amount > left) return apiError(400, "invalid_request_error", "Refund amount is greater than the unrefunded amount on the charge.", "amount_too_large");
      const refund: Obj = {
        id: rid("re"),
        object: "refund",
        amount,
        currency: charge.currency,
        charge: charge.id,
        payment_intent: pi.id,
        reason: form.reason ?? null,
        metadata: form.metadata ?? {},
        status: "succeeded",
        created: nowSec(),
      };
      Object.assign(charge, { amount_refunded: Number(charge.amount_refunded) + amount });
      charge.refunded = Number(charge.amount_refunded) >= Number(charge.amount);
      dispatchAfterResponse([makeEvent("charge.refunded", charge)]);
      return { status: 200, body: refund };
    }
    return apiError(404, "invalid_request_error", `Unrecognized request URL (${method}: ${path}). The local fake implements only the calls Spanproof makes.`);
  }

  // ---- the hosted checkout page ------------------------------------------------------

  function page(s: Obj, notice?: string): string {
    const items = (s.line_items as Obj[]) ?? [];
    const rows = items
      .map((it) => {
        const pd = (it.price_data ?? {}) as Obj;
        const name = ((pd.product_data ?? {}) as Obj).name;
        return `<tr><td>${esc(name)}</td><td class="amt">${esc(money(Number(pd.unit_amount) * Number(it.quantity ?? 1), String(pd.currency)))}</td></tr>`;
      })
      .join("");
    const total = money(Number(s.amount_total), String(s.currency));
    const open = s.status === "open";
    const closed =
      s.status === "complete"
        ? `<p role="status">This checkout is paid. <a href="${esc(s.success_url)}">Return to the department</a></p>`
        : s.status === "expired"
          ? `<p role="status">This checkout has expired. ${s.cancel_url ? `<a href="${esc(s.cancel_url)}">Return to the department</a>` : ""}</p>`
          : "";
    return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Test checkout — ${esc(total)}</title>
<style>body{font:15px/1.45 system-ui,sans-serif;max-width:34rem;margin:2.5rem auto;padding:0 1rem;color:#222}
.band{border:2px dashed #9a6b00;background:#fff8e6;padding:.5rem .75rem;margin-bottom:1.25rem;font-size:13px}
table{width:100%;border-collapse:collapse;margin:1rem 0}td{padding:.35rem 0;border-bottom:1px solid #ddd}.amt{text-align:right;font-variant-numeric:tabular-nums}
tfoot td{font-weight:600;border-bottom:0}form{display:inline}button{font:inherit;padding:.5rem 1rem;margin-right:.5rem;cursor:pointer}
.pay{background:#1d4ed8;color:#fff;border:1px solid #1e3a8a}.decline{background:#fff;border:1px solid #888}.notice{color:#9b1c1c;font-weight:600}</style></head>
<body><div class="band">Local test checkout: a stand-in for the payment provider. No card is charged and no data leaves this computer.</div>
<h1>Pay ${esc(total)}</h1><p>Reference ${esc(s.client_reference_id)}${s.customer_email ? ` · receipt to ${esc(s.customer_email)}` : ""}</p>
<table aria-label="What you are paying for"><tbody>${rows}</tbody><tfoot><tr><td>Total</td><td class="amt">${esc(total)}</td></tr></tfoot></table>
${notice ? `<p class="notice" role="alert">${esc(notice)}</p>` : ""}${closed}
${open ? `<form method="post" action="/pay/${esc(s.id)}/pay"><button class="pay" type="submit">Pay ${esc(total)}</button></form><form method="post" action="/pay/${esc(s.id)}/decline"><button class="decline" type="submit">Decline (simulate a refused card)</button></form>
${s.cancel_url ? `<p><a href="${esc(s.cancel_url)}">Cancel and return to the department</a></p>` : ""}` : ""}
</body></html>`;
  }

  async function hosted(req: http.IncomingMessage, res: http.ServerResponse, path: string): Promise<boolean> {
    const m = path.match(/^\/pay\/([\w]+)(?:\/(pay|decline))?$/);
    if (!m) return false;
    const s = sessions.get(m[1]!);
    if (!s) {
      res.writeHead(404, { "content-type": "text/html; charset=utf-8" }).end("<!doctype html><p>No such checkout.</p>");
      return true;
    }
    if (req.method === "GET" && !m[2]) {
      res.writeHead(200, { "content-type": "text/html; charset=utf-8", "cache-control": "no-store" }).end(page(s));
      return true;
    }
    if (req.method === "POST" && m[2] && s.status === "open") {
      if (m[2] === "pay") await pay(String(s.id));
      else await decline(String(s.id));
      // The brief's simplification of a real decline (which keeps the person on the page): back to the department either way.
      const to = m[2] === "pay" ? String(s.success_url) : String(s.cancel_url ?? s.success_url);
      res.writeHead(303, { location: to }).end();
      return true;
    }
    res.writeHead(409, { "content-type": "text/html; charset=utf-8" }).end(page(s, "This checkout is no longer open."));
    return true;
  }

  // ---- test switches -----------------------------------------------------------------

  async function control(req: http.IncomingMessage, path: string, json: Obj): Promise<{ status: number; body: unknown } | null> {
    if (path === "/_fake/health") return { status: 200, body: { ok: true } };
    if (path === "/_fake/mode" && req.method === "GET") return { status: 200, body: mode };
    if (path === "/_fake/mode" && req.method === "POST") {
      setMode(json as Partial<DeliveryMode>);
      return { status: 200, body: mode };
    }
    if (path === "/_fake/reset" && req.method === "POST") {
      reset();
      return { status: 200, body: mode };
    }
    if (path === "/_fake/release" && req.method === "POST") {
      await release(json.order === "reverse" ? "reverse" : "forward");
      return { status: 200, body: { released: true } };
    }
    if (path === "/_fake/events" && req.method === "GET") return { status: 200, body: events.map((e) => ({ id: e.id, type: e.type, deliveries: e.deliveries })) };
    const m = path.match(/^\/_fake\/events\/([\w]+)\/resend$/);
    if (m && req.method === "POST") return { status: 200, body: { status: await resend(m[1]!) } };
    return null;
  }

  function reset() {
    held.length = 0;
    events.length = 0;
    Object.assign(mode, { delivery: "before_redirect", delayMs: 300, duplicate: false, failRefunds: false });
  }

  function setMode(m: Partial<DeliveryMode>) {
    if (m.delivery === "before_redirect" || m.delivery === "after_redirect" || m.delivery === "hold") mode.delivery = m.delivery;
    if (typeof m.delayMs === "number" && m.delayMs >= 0 && m.delayMs <= 60_000) mode.delayMs = m.delayMs;
    if (typeof m.duplicate === "boolean") mode.duplicate = m.duplicate;
    if (typeof m.failRefunds === "boolean") mode.failRefunds = m.failRefunds;
  }

  async function release(order: "forward" | "reverse" = "forward") {
    const batch = held.splice(0, held.length);
    if (order === "reverse") batch.reverse();
    for (const e of batch) await deliver(e);
  }

  async function resend(eventId: string): Promise<number> {
    const e = events.find((x) => x.id === eventId);
    if (!e) throw new Error(`no event ${eventId}`);
    return deliverOnce(e);
  }

  const server = http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on("data", (c: Buffer) => chunks.push(c));
    req.on("end", () => {
      void (async () => {
        const url = new URL(req.url ?? "/", base);
        const raw = Buffer.concat(chunks).toString("utf8");
        const send = (status: number, body: unknown) => {
          res.writeHead(status, { "content-type": "application/json", "request-id": rid("req") }).end(JSON.stringify(body));
        };
        try {
          if (await hosted(req, res, url.pathname)) return;
          if (url.pathname.startsWith("/_fake/")) {
            const r = await control(req, url.pathname, raw ? (JSON.parse(raw) as Obj) : {});
            if (r) return send(r.status, r.body);
            return send(404, { error: "unknown control" });
          }
          if (!url.pathname.startsWith("/v1/")) return send(404, { error: { type: "invalid_request_error", message: "Not found." } });
          const auth = req.headers.authorization ?? "";
          if (auth !== `Bearer ${opts.secretKey}`) {
            return send(401, { error: { type: "invalid_request_error", message: `Invalid API Key provided: ${auth.replace(/^Bearer /, "").slice(0, 12)}…` } });
          }
          const key = req.method === "POST" ? req.headers["idempotency-key"] : undefined;
          const cacheKey = typeof key === "string" ? `${url.pathname}|${key}` : null;
          const cached = cacheKey ? idempotent.get(cacheKey) : undefined;
          if (cached) {
            res.writeHead(cached.status, { "content-type": "application/json", "idempotent-replayed": "true" }).end(cached.body);
            return;
          }
          const form = req.method === "GET" ? parseProviderForm(url.search.slice(1)) : parseProviderForm(raw);
          const r = await api(req.method ?? "GET", url.pathname, form);
          const body = JSON.stringify(r.body);
          if (cacheKey && r.status < 500) idempotent.set(cacheKey, { status: r.status, body });
          res.writeHead(r.status, { "content-type": "application/json", "request-id": rid("req") }).end(body);
        } catch (e) {
          send(500, { error: { type: "api_error", message: e instanceof Error ? e.message : "fake provider error" } });
        }
      })();
    });
  });

  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(opts.port, host, () => resolve());
  });
  const port = (server.address() as AddressInfo).port;
  base = `http://${host}:${port}`;

  return {
    url: base,
    port,
    events,
    sessions,
    mode,
    setMode,
    reset,
    idle,
    release,
    resend,
    pay,
    decline,
    signed(type, object) {
      const e = makeEvent(type, object);
      return { payload: e.payload, signature: sign(e.payload), id: e.id };
    },
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        // The SDK keeps connections alive; without this, close() would wait for them to time out.
        server.closeAllConnections();
      }),
  };
}
