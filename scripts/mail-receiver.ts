// Runs the local mail receiver until stopped: SMTP on SMTP_PORT, captured mail on MAIL_HTTP_PORT.
import { startMailReceiver } from "@/lib/mail/receiver";
import { runLocalFake } from "./run-local-fake";

const smtpPort = Number(process.env.SMTP_PORT ?? 2525);
const httpPort = Number(process.env.MAIL_HTTP_PORT ?? 2580);
const file = process.env.MAIL_FILE ?? ".data/mail/messages.jsonl";

await runLocalFake("mail", "SMTP_PORT / MAIL_HTTP_PORT", async () => {
  const r = await startMailReceiver({ smtpPort, httpPort, file });
  console.log(`[mail] receiving on smtp://127.0.0.1:${smtpPort}, mailbox at http://127.0.0.1:${httpPort}/messages`);
  return r;
});
