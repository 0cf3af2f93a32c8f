import { NextResponse, type NextRequest } from "next/server";
import { db } from "@/db/client";
import { receiveWebhook } from "@/lib/payments/webhook";

// The payment provider's signed events. No session and no Origin check: the provider is not a
// browser on our origin. The signature over the raw body is the authentication; a request
// without a valid one gets 400 and changes nothing.
export async function POST(req: NextRequest): Promise<Response> {
  const payload = await req.text();
  const r = await receiveWebhook(db(), payload, req.headers.get("stripe-signature"));
  return NextResponse.json(r.body, { status: r.status });
}
