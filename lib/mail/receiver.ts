// The local stand-in for a mail relay: accepts SMTP on loopback, keeps every message and
// shows them over a small HTTP API. Used by the start command, the tests and the demo mailbox.
// No message ever leaves the machine.
import { appendFileSync, existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import http from "node:http";
import path from "node:path";
import { simpleParser } from "mailparser";
import { SMTPServer } from "smtp-server";

export interface CapturedMail {
  seq: number;
  messageId: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  receivedAt: string;
}

export interface ReceiverOptions {
  smtpPort: number;
  httpPort: number;
  /** keep messages in this file (JSON lines) so a restart keeps the mailbox */
  file?: string;
  host?: string;
}

export interface Receiver {
  messages: CapturedMail[];
  close(): Promise<void>;
}

export async function startMailReceiver(opts: ReceiverOptions): Promise<Receiver> {
  const host = opts.host ?? "127.0.0.1";
  const messages: CapturedMail[] = [];
  if (opts.file && existsSync(opts.file)) {
    for (const line of readFileSync(opts.file, "utf8").split("\n")) if (line.trim()) messages.push(JSON.parse(line));
  }
  if (opts.file) mkdirSync(path.dirname(opts.file), { recursive: true });

  const smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS"],
    logger: false,
    size: 10 * 1024 * 1024,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          const to = session.envelope.rcptTo.map((r) => r.address);
          const mail: CapturedMail = {
            seq: (messages.at(-1)?.seq ?? 0) + 1,
            messageId: parsed.messageId ?? "",
            from: session.envelope.mailFrom ? session.envelope.mailFrom.address : "",
            to,
            subject: parsed.subject ?? "",
            text: parsed.text ?? "",
            receivedAt: new Date().toISOString(),
          };
          messages.push(mail);
          if (opts.file) appendFileSync(opts.file, JSON.stringify(mail) + "\n");
          callback();
        })
        .catch((e: Error) => callback(e));
    },
  });

  const api = http.createServer((req, res) => {
    const url = new URL(req.url ?? "/", `http://${host}`);
    if (url.pathname !== "/messages") {
      res.writeHead(404).end();
      return;
    }
    if (req.method === "DELETE") {
      messages.length = 0;
      if (opts.file) writeFileSync(opts.file, "");
      res.writeHead(204).end();
      return;
    }
    const to = url.searchParams.get("to")?.toLowerCase();
    const list = to ? messages.filter((m) => m.to.some((a) => a.toLowerCase() === to)) : messages;
    res.writeHead(200, { "content-type": "application/json" }).end(JSON.stringify(list));
  });

  await new Promise<void>((resolve, reject) => {
    smtp.once("error", reject);
    smtp.listen(opts.smtpPort, host, () => resolve());
  });
  await new Promise<void>((resolve, reject) => {
    api.once("error", reject);
    api.listen(opts.httpPort, host, () => resolve());
  });

  return {
    messages,
    close: () =>
      new Promise<void>((resolve) => {
        api.close();
        smtp.close(() => resolve());
      }),
  };
}
