import { notFound } from "next/navigation";
import { ApplicationWorkspace } from "@/components/applications/workspace/application-workspace";
import type { View } from "@/components/applications/workspace/types";
import { db } from "@/db/client";
import { applicationView } from "@/lib/applications/view";
import { requirePageUser } from "@/lib/auth/session";
import { AppError } from "@/lib/errors";

export const metadata = { title: "Application" };

export default async function ApplicationPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageUser("applicant", "technician", "examiner", "supervisor");
  const { id } = await params;
  if (!/^\d{1,15}$/.test(id)) notFound();
  const view = await applicationView(db(), user, Number(id)).catch((e: unknown) => {
    if (e instanceof AppError && e.code === "not_found") notFound();
    throw e;
  });
  // Serialised once so the client receives exactly what the API would send.
  return <ApplicationWorkspace initial={JSON.parse(JSON.stringify(view)) as View} />;
}
