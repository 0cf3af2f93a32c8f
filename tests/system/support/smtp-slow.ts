// A mail sink that is slow to answer DATA: it keeps the message as soon as the last byte has
// arrived, then waits before its 250 reply. A sender killed in that window has delivered the
// message without knowing it, which is exactly the case a resend must be recognisable in.
import { simpleParser, type AddressObject } from "mailparser";
import { SMTPServer } from "smtp-server";

export interface Delivery {
  seq: number;
  messageId: string;
  envelopeTo: string[];
  headerTo: string[];
  subject: string;
  text: string;
  /** Date.now() when the message was kept */
  at: number;
}

export interface SlowSink {
  deliveries: Delivery[];
  /**
   * The next message is kept as usual but its 250 reply waits until release(): a sender killed
   * before then has delivered it without knowing. `kept` resolves once it has been kept.
   */
  holdNextReply: () => { kept: Promise<Delivery>; release: () => void };
  close: () => Promise<void>;
}

const addresses = (a: AddressObject | AddressObject[] | undefined) =>
  (Array.isArray(a) ? a : a ? [a] : []).flatMap((x) => x.value.map((v) => (v.address ?? "").toLowerCase()));

export async function startSlowSink(o: { port: number; host?: string; replyDelayMs: () => number }): Promise<SlowSink> {
  const deliveries: Delivery[] = [];
  let hold: { kept: (d: Delivery) => void; released: Promise<void> } | null = null;
  const smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS"],
    logger: false,
    // No reverse DNS for 127.0.0.1 on every connection: the only delay is the one we choose.
    disableReverseLookup: true,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then(async (parsed) => {
          const d: Delivery = {
            seq: deliveries.length + 1,
            messageId: parsed.messageId ?? "",
            envelopeTo: session.envelope.rcptTo.map((r) => r.address.toLowerCase()),
            headerTo: addresses(parsed.to),
            subject: parsed.subject ?? "",
            text: parsed.text ?? "",
            at: Date.now(),
          };
          deliveries.push(d);
          const h = hold;
          hold = null;
          if (h) {
            h.kept(d);
            await h.released;
          }
          setTimeout(callback, o.replyDelayMs());
        })
        .catch((e: Error) => callback(e));
    },
  });
  // A sender killed mid-session resets the connection; that is expected here.
  smtp.on("error", () => undefined);
  await new Promise<void>((resolve, reject) => {
    smtp.once("error", reject);
    smtp.listen(o.port, o.host ?? "127.0.0.1", () => resolve());
  });
  return {
    deliveries,
    holdNextReply() {
      let release = () => undefined as void;
      const released = new Promise<void>((r) => (release = r));
      const kept = new Promise<Delivery>((r) => (hold = { kept: r, released }));
      return { kept, release };
    },
    close: () => new Promise<void>((resolve) => smtp.close(() => resolve())),
  };
}
