import "server-only";
import type Stripe from "stripe";
import { type Db, withTransaction } from "@/db/client";
import { recordAudit } from "@/db/queries/audit";
import { getInvoice, getUserContact, lockApplicationRow, lockInvoice, updateInvoiceIfVersion, type InvoiceRow } from "@/db/queries/invoices";
import { getApplicationRow, toResource } from "@/db/queries/applications";
import type { SessionUser } from "@/db/queries/users";
import { env } from "@/lib/env";
import { AppError, notFound } from "@/lib/errors";
import { checkAccess } from "@/lib/workflow";
import { paymentsClient } from "./client";
import { paymentIdOf, providerMessage } from "./provider";
import { applyPayment, type AfterCommit, type PaymentOutcome } from "./settle";

type Actor = Pick<SessionUser, "id" | "role">;

/** The invoice and its application, when this person may see them; 404 otherwise. */
export async function invoiceForViewer(database: Db, actor: Actor, invoiceId: number) {
  const inv = await getInvoice(database, invoiceId);
  if (!inv) throw notFound("That invoice");
  const app = await getApplicationRow(database, inv.applicationId);
  if (!app || checkAccess(actor, "application.view", toResource(app)) === "not_found") throw notFound("That invoice");
  return { inv, app };
}

function assertPayer(actor: Actor, inv: InvoiceRow, applicantId: number) {
  if (actor.role !== "applicant" || actor.id !== applicantId) throw new AppError("forbidden", "Only the applicant pays the application's fees online.");
  if (inv.status !== "open") throw new AppError("conflict", inv.status === "paid" ? "This invoice is already paid." : `This invoice is ${inv.status}; there is nothing to pay.`);
}

/**
 * Sends the applicant to the provider's hosted checkout for one open invoice. An open checkout
 * for the same invoice is reused, so two clicks never make two ways to pay.
 */
export async function startCheckout(database: Db, actor: Actor, invoiceId: number, ip?: string): Promise<{ url: string }> {
  const { inv, app } = await invoiceForViewer(database, actor, invoiceId);
  assertPayer(actor, inv, app.applicantId);
  const stripe = paymentsClient();

  if (inv.providerSessionId) {
    const existing = await stripe.checkout.sessions.retrieve(inv.providerSessionId).catch(() => null);
    if (existing?.status === "open" && existing.url) return { url: existing.url };
    if (existing?.status === "complete" && existing.payment_status === "paid") {
      await settleReturnedSession(database, inv.id, existing);
      throw new AppError("conflict", "This invoice has just been paid. Reload to see the receipt.");
    }
  }

  const contact = await getUserContact(database, app.applicantId);
  const appUrl = env().APP_URL;
  const metadata = { invoiceId: String(inv.id), invoiceNumber: inv.number ?? "", applicationId: String(app.id), applicationNumber: app.number ?? "" };
  let session: Stripe.Checkout.Session;
  try {
    session = await stripe.checkout.sessions.create(
      {
        mode: "payment",
        client_reference_id: inv.number ?? String(inv.id),
        customer_email: contact?.email,
        line_items: inv.lineItems.map((l) => ({
          quantity: 1,
          price_data: { currency: inv.currency, unit_amount: l.amountCents, product_data: { name: `${l.label} — ${app.number ?? ""}`.trim() } },
        })),
        metadata,
        payment_intent_data: { metadata, description: `${inv.number} for ${app.number}` },
        success_url: `${appUrl}/invoices/${inv.id}?checkout=success&session_id={CHECKOUT_SESSION_ID}`,
        cancel_url: `${appUrl}/invoices/${inv.id}?checkout=cancelled`,
      },
      // Same invoice, same version: the same session, however often the button is pressed. The
      // creation time keeps keys apart when a test or demo database starts its ids again.
      { idempotencyKey: `checkout-invoice-${inv.id}-${inv.createdAt.getTime()}-v${inv.version}` },
    );
  } catch (e) {
    console.error("[payments] checkout session could not be created", e instanceof Error ? e.message : e);
    throw new AppError("unprocessable", `Online payment is not available right now: ${providerMessage(e)} Try again in a few minutes.`);
  }
  if (!session.url) throw new AppError("internal", "The payment provider returned no checkout page.");

  await withTransaction(database, async (tx) => {
    if (session.id === inv.providerSessionId) return;
    const ok = await updateInvoiceIfVersion(tx, inv.id, inv.version, { providerSessionId: session.id });
    if (!ok) throw new AppError("conflict", "This invoice changed meanwhile. Reload and try again.");
    await recordAudit(tx, {
      actor,
      action: "invoice.checkout_started",
      entityType: "invoice",
      entityId: inv.id,
      applicationId: app.id,
      summary: `Online payment of ${inv.number} started.`,
      detail: { sessionId: session.id },
      ip,
    });
  });
  return { url: session.url };
}

/**
 * On the applicant's return from checkout, ask the provider how the session ended. Covers a
 * redirect that arrives before the webhook: the same settle step runs, so whichever comes
 * second changes nothing.
 */
export async function confirmCheckout(database: Db, actor: Actor, invoiceId: number, sessionId: string): Promise<{ status: InvoiceRow["status"]; outcome: PaymentOutcome | "open" | "not_this_invoice" }> {
  const { inv } = await invoiceForViewer(database, actor, invoiceId);
  if (inv.status !== "open") return { status: inv.status, outcome: "already_paid" };
  let session: Stripe.Checkout.Session;
  try {
    session = await paymentsClient().checkout.sessions.retrieve(sessionId);
  } catch (e) {
    throw new AppError("unprocessable", `The payment could not be checked with the provider: ${providerMessage(e)}`);
  }
  if (session.metadata?.invoiceId !== String(inv.id)) return { status: inv.status, outcome: "not_this_invoice" };
  if (session.status !== "complete" || session.payment_status !== "paid") return { status: inv.status, outcome: "open" };
  const outcome = await settleReturnedSession(database, inv.id, session);
  const now = await getInvoice(database, inv.id);
  return { status: now?.status ?? inv.status, outcome };
}

async function settleReturnedSession(database: Db, invoiceId: number, session: Stripe.Checkout.Session): Promise<PaymentOutcome> {
  const after: AfterCommit[] = [];
  const outcome = await withTransaction(database, async (tx) => {
    const peek = await getInvoice(tx, invoiceId);
    const app = peek ? await lockApplicationRow(tx, peek.applicationId) : undefined;
    const inv = await lockInvoice(tx, invoiceId);
    if (!inv || !app) throw notFound("That invoice");
    const paymentId = paymentIdOf(session.payment_intent) ?? session.id;
    return applyPayment(tx, inv, app, { sessionId: session.id, paymentId, amountCents: session.amount_total, currency: session.currency, via: "return" }, new Date(), after);
  });
  for (const task of after) await task(database);
  return outcome;
}
