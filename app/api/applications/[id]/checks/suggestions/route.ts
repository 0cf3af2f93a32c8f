import { NextResponse } from "next/server";
import { db } from "@/db/client";
import { pathId, route } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { calcSuggestions } from "@/lib/checks/service";

// Spans, loads, sizes and claimed deflections found in a calculation package's text layer.
export const GET = route<{ id: string }>(async (req, p) => {
  const user = await requireUser();
  const raw = req.nextUrl.searchParams.get("documentId");
  const documentId = raw ? pathId(raw, "That calculation package") : undefined;
  return NextResponse.json(await calcSuggestions(db(), user, pathId(p.id, "That application"), documentId));
});
