import { eq } from "drizzle-orm";
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
});
