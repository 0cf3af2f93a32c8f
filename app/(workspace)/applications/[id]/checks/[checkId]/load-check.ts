import "server-only";
import { notFound } from "next/navigation";
import { db } from "@/db/client";
import { requirePageUser } from "@/lib/auth/session";
import { getCheck } from "@/lib/checks/service";
import { AppError } from "@/lib/errors";

/** The stored check for the check page and its printable report: never re-computed; 404 when not visible. */
export async function loadCheckForPage(params: Promise<{ id: string; checkId: string }>) {
  const user = await requirePageUser("applicant", "technician", "examiner", "supervisor");
  const { id, checkId } = await params;
  if (!/^\d{1,15}$/.test(id) || !/^\d{1,15}$/.test(checkId)) notFound();
  return getCheck(db(), user, Number(id), Number(checkId)).catch((e: unknown) => {
    if (e instanceof AppError && e.code === "not_found") notFound();
    throw e;
  });
}
