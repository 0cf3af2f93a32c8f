// Background worker: relays the e-mail outbox. Runs beside the app in the start and test commands.
import http from "node:http";
import { closeDb, db } from "@/db/client";
import { relayOutbox } from "@/db/queries/outbox";
import { env } from "@/lib/env";
import { createTransport } from "@/lib/mail/transport";
import { remindersTick } from "@/lib/review-clock/reminders";

const e = env();
const transport = createTransport({ host: e.SMTP_HOST, port: e.SMTP_PORT });
const intervalMs = Number(process.env.WORKER_INTERVAL_MS ?? 1000);
let stopping = false;

async function loop() {
  console.log(`[worker] relaying mail to ${e.SMTP_HOST}:${e.SMTP_PORT} every ${intervalMs} ms`);
  while (!stopping) {
    try {
      const r = await relayOutbox(db(), transport, e.MAIL_FROM);
      if (r.sent || r.failed) console.log(`[worker] sent ${r.sent}, failed ${r.failed}`);
      await remindersTick(db());
    } catch (err) {
      console.error("[worker] relay round failed:", err instanceof Error ? err.message : err);
    }
    await new Promise((r) => setTimeout(r, intervalMs));
  }
  await closeDb();
  transport.close();
}

// Optional liveness port, so a supervisor (or the browser-test runner) can wait for the worker.
const healthPort = process.env.WORKER_HEALTH_PORT ? Number(process.env.WORKER_HEALTH_PORT) : undefined;
const health = healthPort ? http.createServer((_q, r) => r.writeHead(200).end("ok")).listen(healthPort, "127.0.0.1") : undefined;

const stop = () => {
  health?.close();
  stopping = true;
};
process.on("SIGINT", stop);
process.on("SIGTERM", stop);
await loop();
