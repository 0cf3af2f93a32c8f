import { NextResponse } from "next/server";
import { db } from "@/db/client";
import { listActiveExaminers } from "@/db/queries/applications";
import { route } from "@/lib/api/handler";
import { requireRole } from "@/lib/auth/session";

// Who can take a review, with their current load (intake and reassignment choose from it).
export const GET = route(async () => {
  await requireRole("technician", "supervisor");
  const rows = await listActiveExaminers(db());
  return NextResponse.json({ examiners: rows.map((r) => ({ ...r, openReviews: Number(r.openReviews) })) });
});
