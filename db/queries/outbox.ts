import "server-only";
import { randomUUID } from "node:crypto";
import { and, asc, eq, isNull, lte, or, sql } from "drizzle-orm";
import type { Transporter } from "nodemailer";
import { messageIdFor } from "@/lib/mail/transport";
import { env } from "@/lib/env";
import { isUnreachable, retryableErrno, type Db, type Tx } from "../client";
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

export interface RelayOptions {
  /** How long a claim holds (ms); default OUTBOX_LEASE_SEC. */
  leaseMs?: number;
}

const isConflict = (e: unknown) => retryableErrno(e) !== undefined;

async function markWithRetry(mark: () => Promise<unknown>, attempts = 5): Promise<void> {
  for (let i = 1; ; i++) {
    try {
      await mark();
      return;
    } catch (e) {
      const cause = (e as { cause?: unknown }).cause ?? e;
      if (i >= attempts || !(isUnreachable(cause) || isConflict(e))) throw e;
      await new Promise((r) => setTimeout(r, 200 * i));
    }
  }
}

/**
 * Sends due messages, at least once each. Up to `batch` messages are claimed by one short
 * conditional update in autocommit (on a Galera cluster it is certified cluster-wide, where
 * SELECT … FOR UPDATE SKIP LOCKED would lock on one node only: two relays on two nodes never
 * hold the same row), sent outside any transaction, then marked one by one with the claim
 * token. A relay that dies after SMTP accepted but before the mark leaves the lease to run out;
 * the message is then resent with the same Message-ID. A relay whose lease ran out mid-send
 * cannot mark a row another relay now holds, and stops sending from a batch at half its lease.
 */
export async function relayOutbox(database: Db, transport: Transporter, from: string, batch = 20, o: RelayOptions = {}): Promise<RelayResult> {
  const result: RelayResult = { sent: 0, failed: 0 };
  const leaseMs = o.leaseMs ?? env().OUTBOX_LEASE_SEC * 1000;
  const token = randomUUID();
  const claimedAt = Date.now();
  try {
    await database
      .update(outbox)
      .set({ claimToken: token, claimedUntil: sql`CURRENT_TIMESTAMP(3) + INTERVAL ${leaseMs * 1000} MICROSECOND` })
      .where(
        and(
          eq(outbox.status, "pending"),
          lte(outbox.nextAttemptAt, sql`CURRENT_TIMESTAMP(3)`),
          or(isNull(outbox.claimedUntil), lte(outbox.claimedUntil, sql`CURRENT_TIMESTAMP(3)`)),
        ),
      )
      .orderBy(asc(outbox.nextAttemptAt), asc(outbox.id))
      .limit(batch);
  } catch (e) {
    // Galera's autocommit retry can still give up when another relay claimed the same rows: next round.
    if (isConflict(e)) return result;
    throw e;
  }
  const rows = await database
    .select()
    .from(outbox)
    .where(and(eq(outbox.claimToken, token), eq(outbox.status, "pending")))
    .orderBy(asc(outbox.nextAttemptAt), asc(outbox.id));
  const release = () =>
    markWithRetry(() =>
      database
        .update(outbox)
        .set({ claimToken: null, claimedUntil: null })
        .where(and(eq(outbox.claimToken, token), eq(outbox.status, "pending"))),
    );
  for (const row of rows) {
    // The rest of the batch goes back rather than risk a send after the lease.
    if (Date.now() - claimedAt > leaseMs / 2) {
      await release();
      break;
    }
    const mine = and(eq(outbox.id, row.id), eq(outbox.claimToken, token));
    try {
      await transport.sendMail({
        from,
        to: row.toName ? { name: row.toName, address: row.toAddress } : row.toAddress,
        subject: row.subject,
        text: row.textBody,
        messageId: messageIdFor(row.id),
        headers: { "X-Spanproof-Template": row.template },
      });
    } catch (e) {
      const attempts = row.attempts + 1;
      await database
        .update(outbox)
        .set({
          attempts,
          nextAttemptAt: new Date(Date.now() + backoffMs(attempts)),
          lastError: (e instanceof Error ? e.message : String(e)).slice(0, 500),
          claimToken: null,
          claimedUntil: null,
        })
        .where(mine);
      result.failed++;
      // Stop this round on a transport failure: the relay is probably down for all rows.
      await release();
      break;
    }
    const sentAt = new Date();
    // The message is out: a lost connection here (the node died, the pool moves to the next
    // host) must not leave the row to be sent again when the lease runs out.
    await markWithRetry(() =>
      database
        .update(outbox)
        .set({ status: "sent", sentAt, attempts: row.attempts + 1, lastError: null, claimToken: null, claimedUntil: null })
        .where(mine),
    );
    result.sent++;
  }
  return result;
}
