import "server-only";
import { and, asc, eq, lte, sql } from "drizzle-orm";
import type { Transporter } from "nodemailer";
import { messageIdFor } from "@/lib/mail/transport";
import type { Db, Tx } from "../client";
import { outbox } from "../schema";

export interface OutgoingMail {
  dedupeKey: string;
  template: string;
  to: { address: string; name?: string };
  subject: string;
  text: string;
  applicationId?: number | null;
}

/** Called inside the transaction that makes the change the mail announces. */
export async function enqueueMail(tx: Tx | Db, mails: OutgoingMail[]): Promise<void> {
  if (mails.length === 0) return;
  await tx
    .insert(outbox)
    .values(
      mails.map((m) => ({
        dedupeKey: m.dedupeKey,
        template: m.template,
        toAddress: m.to.address,
        toName: m.to.name ?? "",
        subject: m.subject,
        textBody: m.text,
        applicationId: m.applicationId ?? null,
      })),
    )
    // The same notice for the same event is written once even if the caller repeats itself.
    .onDuplicateKeyUpdate({ set: { dedupeKey: sql`dedupe_key` } });
}

/** Exponential backoff, 10 s doubling, capped at one hour. */
export function backoffMs(attempts: number): number {
  return Math.min(10_000 * 2 ** Math.max(0, attempts - 1), 3_600_000);
}

export interface RelayResult {
  sent: number;
  failed: number;
}

/**
 * Sends due messages. Rows are claimed with FOR UPDATE SKIP LOCKED inside one transaction
 * per message, so two workers never send the same row; a crash after SMTP accepted but
 * before COMMIT resends it with the same Message-ID (at-least-once delivery).
 */
export async function relayOutbox(database: Db, transport: Transporter, from: string, batch = 20): Promise<RelayResult> {
  const result: RelayResult = { sent: 0, failed: 0 };
  for (let i = 0; i < batch; i++) {
    const done = await database.transaction(async (tx) => {
      const [row] = await tx
        .select()
        .from(outbox)
        .where(and(eq(outbox.status, "pending"), lte(outbox.nextAttemptAt, sql`CURRENT_TIMESTAMP(3)`)))
        .orderBy(asc(outbox.nextAttemptAt), asc(outbox.id))
        .limit(1)
        .for("update", { skipLocked: true });
      if (!row) return false;
      try {
        await transport.sendMail({
          from,
          to: row.toName ? { name: row.toName, address: row.toAddress } : row.toAddress,
          subject: row.subject,
          text: row.textBody,
          messageId: messageIdFor(row.id),
          headers: { "X-Spanproof-Template": row.template },
        });
        await tx
          .update(outbox)
          .set({ status: "sent", sentAt: new Date(), attempts: row.attempts + 1, lastError: null })
          .where(eq(outbox.id, row.id));
        result.sent++;
      } catch (e) {
        const attempts = row.attempts + 1;
        await tx
          .update(outbox)
          .set({
            attempts,
            nextAttemptAt: new Date(Date.now() + backoffMs(attempts)),
            lastError: (e instanceof Error ? e.message : String(e)).slice(0, 500),
          })
          .where(eq(outbox.id, row.id));
        result.failed++;
        // Stop this round on a transport failure: the relay is probably down for all rows.
        return "stop";
      }
      return true;
    });
    if (done !== true) break;
  }
  return result;
}
