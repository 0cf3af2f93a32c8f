"use server";

import { revalidatePath } from "next/cache";
import { headers } from "next/headers";
import { db } from "@/db/client";
import { fieldErrors } from "@/lib/api/handler";
import { clientIp } from "@/lib/auth/request-ip";
import { requireRole } from "@/lib/auth/session";
import { AppError } from "@/lib/errors";
import { feeScheduleInputSchema, type FeeSchedule } from "@/lib/fees/schedule";
import { saveFeeSchedule } from "@/lib/fees/service";
import { refuseForgedAction } from "@/lib/security/action-guard";

export type SaveFeeScheduleResult = { ok: true; schedule: FeeSchedule } | { ok: false; message: string; fields?: Record<string, string> };

/** The administrator saves a new revision of the fee schedule. */
export async function saveFeeScheduleAction(input: unknown): Promise<SaveFeeScheduleResult> {
  const refused = await refuseForgedAction("saveFeeScheduleAction");
  if (refused) return { ok: false, message: refused };
  try {
    const user = await requireRole("admin");
    const parsed = feeScheduleInputSchema.safeParse(input);
    if (!parsed.success) return { ok: false, message: "Some fields need attention.", fields: fieldErrors(parsed.error) };
    const schedule = await saveFeeSchedule(db(), user, parsed.data, clientIp(await headers()));
    revalidatePath("/admin/fees");
    return { ok: true, schedule };
  } catch (e) {
    if (e instanceof AppError) return { ok: false, message: e.message };
    console.error("[fees] saving the schedule failed", e);
    return { ok: false, message: "The schedule could not be saved. Try again." };
  }
}
