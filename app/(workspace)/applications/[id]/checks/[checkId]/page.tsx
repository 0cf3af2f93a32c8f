import { notFound } from "next/navigation";
import { SavedCheck, type SavedCheckView } from "@/components/checks/saved-check";
import { db } from "@/db/client";
import { requirePageUser } from "@/lib/auth/session";
import { getCheck } from "@/lib/checks/service";
import { AppError } from "@/lib/errors";

export const metadata = { title: "Deflection check" };

// Shows the stored result only: opening a saved check never re-computes it.
export default async function SavedCheckPage({ params }: { params: Promise<{ id: string; checkId: string }> }) {
  const user = await requirePageUser("applicant", "technician", "examiner", "supervisor");
  const { id, checkId } = await params;
  if (!/^\d{1,15}$/.test(id) || !/^\d{1,15}$/.test(checkId)) notFound();
  const view = await getCheck(db(), user, Number(id), Number(checkId)).catch((e: unknown) => {
    if (e instanceof AppError && e.code === "not_found") notFound();
    throw e;
  });
  return <SavedCheck view={JSON.parse(JSON.stringify(view)) as SavedCheckView} />;
}
