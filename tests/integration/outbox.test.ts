import { eq, sql } from "drizzle-orm";
import type { Transporter } from "nodemailer";
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { enqueueMail, relayOutbox } from "@/db/queries/outbox";
import { outbox } from "@/db/schema";
import { startMailReceiver, type Receiver } from "@/lib/mail/receiver";
import { createTransport, messageIdFor } from "@/lib/mail/transport";
import { resetDb } from "./db-helpers";

const SMTP = 2725;
const HTTP = 2780;
let receiver: Receiver | undefined;

beforeEach(resetDb);
afterEach(async () => {
  await receiver?.close();
  receiver = undefined;
});

const mail = (n: number) => ({
  dedupeKey: `test:${n}`,
  template: "test",
  to: { address: `person${n}@test.example`, name: `Person ${n}` },
  subject: `Notice ${n}`,
  text: `Body ${n}`,
});

describe("e-mail outbox", () => {
  it("sends each message once, with a Message-ID derived from the row", async () => {
    receiver = await startMailReceiver({ smtpPort: SMTP, httpPort: HTTP });
    await enqueueMail(db(), [mail(1), mail(2), mail(3)]);
    await enqueueMail(db(), [mail(2)]); // same dedupe key: not written twice
    const transport = createTransport({ host: "127.0.0.1", port: SMTP });
    const first = await relayOutbox(db(), transport, "dept@test.example");
    const second = await relayOutbox(db(), transport, "dept@test.example");
    expect(first).toEqual({ sent: 3, failed: 0 });
    expect(second).toEqual({ sent: 0, failed: 0 });
    expect(receiver.messages.map((m) => m.subject).sort()).toEqual(["Notice 1", "Notice 2", "Notice 3"]);
    const rows = await db().select().from(outbox);
    for (const r of rows) {
      expect(r.status).toBe("sent");
      expect(receiver.messages.find((m) => m.to[0] === r.toAddress)?.messageId).toBe(messageIdFor(r.id));
    }
  });

  it("keeps a message when the receiver is down and sends it after it comes back", async () => {
    await enqueueMail(db(), [mail(7)]);
    const transport = createTransport({ host: "127.0.0.1", port: SMTP });
    const down = await relayOutbox(db(), transport, "dept@test.example");
    expect(down).toEqual({ sent: 0, failed: 1 });
    const [row] = await db().select().from(outbox);
    expect(row).toMatchObject({ status: "pending", attempts: 1 });
    expect(row!.lastError).toBeTruthy();
    expect(row!.nextAttemptAt.getTime()).toBeGreaterThan(Date.now() + 5_000);

    receiver = await startMailReceiver({ smtpPort: SMTP, httpPort: HTTP });
    // Backoff holds it until it is due; make it due now, as time passing would.
    await db().update(outbox).set({ nextAttemptAt: new Date(Date.now() - 1000) }).where(eq(outbox.id, row!.id));
    expect(await relayOutbox(db(), transport, "dept@test.example")).toEqual({ sent: 1, failed: 0 });
    expect(receiver.messages).toHaveLength(1);
    expect(receiver.messages[0]!.messageId).toBe(messageIdFor(row!.id));
  });

  it("two workers relaying at once send every message exactly once", async () => {
    receiver = await startMailReceiver({ smtpPort: SMTP, httpPort: HTTP });
    await enqueueMail(db(), Array.from({ length: 30 }, (_, i) => mail(100 + i)));
    // Each worker drains in rounds of 4 until a round finds nothing, as the worker process does.
    const drain = async (t: Transporter) => {
      let sent = 0;
      for (let r = await relayOutbox(db(), t, "dept@test.example", 4); r.sent > 0; r = await relayOutbox(db(), t, "dept@test.example", 4)) sent += r.sent;
      return sent;
    };
    const [a, b] = await Promise.all([drain(createTransport({ host: "127.0.0.1", port: SMTP })), drain(createTransport({ host: "127.0.0.1", port: SMTP }))]);
    expect(a + b).toBe(30);
    // Both took part: the claims interleave rather than one worker draining the queue alone.
    expect(Math.min(a, b)).toBeGreaterThan(0);
    const ids = receiver.messages.map((m) => m.messageId);
    expect(ids).toHaveLength(30);
    expect(new Set(ids).size).toBe(30);
    const rows = await db().select().from(outbox);
    expect(rows.every((r) => r.status === "sent" && r.claimToken === null && r.claimedUntil === null)).toBe(true);
  });

  it("leaves a message another worker holds, and resends it with the same Message-ID once that lease runs out", async () => {
    receiver = await startMailReceiver({ smtpPort: SMTP, httpPort: HTTP });
    await enqueueMail(db(), [mail(8)]);
    const [row] = await db().select().from(outbox);
    // What a worker killed between SMTP and its mark leaves behind: a live lease on a pending row.
    await db()
      .update(outbox)
      .set({ claimToken: "crashed-worker", claimedUntil: sql`CURRENT_TIMESTAMP(3) + INTERVAL 1 HOUR` })
      .where(eq(outbox.id, row!.id));
    const transport = createTransport({ host: "127.0.0.1", port: SMTP });
    expect(await relayOutbox(db(), transport, "dept@test.example")).toEqual({ sent: 0, failed: 0 });
    expect(receiver.messages).toHaveLength(0);

    await db().update(outbox).set({ claimedUntil: new Date(Date.now() - 1000) }).where(eq(outbox.id, row!.id));
    expect(await relayOutbox(db(), transport, "dept@test.example")).toEqual({ sent: 1, failed: 0 });
    expect(receiver.messages.map((m) => m.messageId)).toEqual([messageIdFor(row!.id)]);
    const [after] = await db().select().from(outbox);
    expect(after).toMatchObject({ status: "sent", attempts: 1, claimToken: null });
  });

  it("a worker whose lease ran out mid-send cannot mark the row the next worker now holds", async () => {
    receiver = await startMailReceiver({ smtpPort: SMTP, httpPort: HTTP });
    await enqueueMail(db(), [mail(9)]);
    const real = createTransport({ host: "127.0.0.1", port: SMTP });
    let overtaken: { sent: number; failed: number } | undefined;
    // A slow first send: while it hangs, the 400 ms lease runs out and a second worker claims the row.
    const slow = {
      sendMail: async (m: Parameters<Transporter["sendMail"]>[0]) => {
        await new Promise((r) => setTimeout(r, 500));
        const [held] = await db().select().from(outbox);
        overtaken = await relayOutbox(db(), real, "dept@test.example");
        const [now] = await db().select().from(outbox);
        expect(now!.status).toBe("sent");
        expect(held!.claimToken).not.toBeNull();
        return real.sendMail(m);
      },
    } as unknown as Transporter;
    expect(await relayOutbox(db(), slow, "dept@test.example", 20, { leaseMs: 400 })).toEqual({ sent: 1, failed: 0 });
    expect(overtaken).toEqual({ sent: 1, failed: 0 });
    // At-least-once: the in-flight message went twice, under one Message-ID; the row was marked once.
    const [row] = await db().select().from(outbox);
    expect(receiver.messages.map((m) => m.messageId)).toEqual([messageIdFor(row!.id), messageIdFor(row!.id)]);
    expect(row).toMatchObject({ status: "sent", attempts: 1, claimToken: null, claimedUntil: null });
  });

  it("gives the rest of a batch back once half the lease has gone, for another worker to send", async () => {
    receiver = await startMailReceiver({ smtpPort: SMTP, httpPort: HTTP });
    await enqueueMail(db(), [mail(21), mail(22), mail(23)]);
    const real = createTransport({ host: "127.0.0.1", port: SMTP });
    const slow = {
      sendMail: async (m: Parameters<Transporter["sendMail"]>[0]) => {
        await new Promise((r) => setTimeout(r, 300));
        return real.sendMail(m);
      },
    } as unknown as Transporter;
    // Lease 400 ms: the first send ends at ≈ 300 ms, the second would start past 200 ms.
    expect(await relayOutbox(db(), slow, "dept@test.example", 20, { leaseMs: 400 })).toEqual({ sent: 1, failed: 0 });
    const rows = await db().select().from(outbox).orderBy(outbox.id);
    expect(rows.map((r) => [r.status, r.claimToken])).toEqual([
      ["sent", null],
      ["pending", null],
      ["pending", null],
    ]);
    expect(await relayOutbox(db(), real, "dept@test.example")).toEqual({ sent: 2, failed: 0 });
    expect(receiver.messages).toHaveLength(3);
  });
});
