// Runs the local mail receiver until stopped: SMTP on SMTP_PORT, captured mail on MAIL_HTTP_PORT.
import { startMailReceiver } from "@/lib/mail/receiver";

const smtpPort = Number(process.env.SMTP_PORT ?? 2525);
const httpPort = Number(process.env.MAIL_HTTP_PORT ?? 2580);
const file = process.env.MAIL_FILE ?? ".data/mail/messages.jsonl";

try {
  const r = await startMailReceiver({ smtpPort, httpPort, file });
  console.log(`[mail] receiving on smtp://127.0.0.1:${smtpPort}, mailbox at http://127.0.0.1:${httpPort}/messages`);
  const stop = () => void r.close().then(() => process.exit(0));
  process.on("SIGINT", stop);
  process.on("SIGTERM", stop);
} catch (e) {
  const err = e as NodeJS.ErrnoException;
  if (err.code === "EADDRINUSE") {
    console.error(`[mail] port ${err.message.match(/:(\d+)/)?.[1] ?? "?"} is taken; set SMTP_PORT / MAIL_HTTP_PORT to free ports`);
  } else console.error("[mail] failed to start:", err.message);
  process.exit(1);
}
