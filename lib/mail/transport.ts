import nodemailer, { type Transporter } from "nodemailer";

export interface SmtpSettings {
  host: string;
  port: number;
}

// File and URL access off: a message body can never pull a local file or a remote URL in.
export function createTransport(s: SmtpSettings): Transporter {
  return nodemailer.createTransport({
    host: s.host,
    port: s.port,
    secure: false,
    ignoreTLS: s.host === "127.0.0.1" || s.host === "localhost",
    disableFileAccess: true,
    disableUrlAccess: true,
    connectionTimeout: 5_000,
    greetingTimeout: 5_000,
    socketTimeout: 10_000,
  });
}

/** Recognisable on a resend: the same outbox row always carries the same Message-ID. */
export function messageIdFor(outboxId: number): string {
  return `<outbox-${outboxId}@spanproof.larkspurfalls.example>`;
}
