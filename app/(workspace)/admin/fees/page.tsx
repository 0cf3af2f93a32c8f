import { FeeScheduleEditor } from "@/components/fees/fee-schedule-editor";
import { PageHeader } from "@/components/ui/page-header";
import { db } from "@/db/client";
import { requirePageUser } from "@/lib/auth/session";
import { env } from "@/lib/env";
import { getFeeSchedule } from "@/lib/fees/service";
import { saveFeeScheduleAction } from "./actions";

export const metadata = { title: "Fee schedule" };

export default async function FeeSchedulePage() {
  await requirePageUser("admin");
  const schedule = await getFeeSchedule(db());
  return (
    <>
      <PageHeader
        title="Fee schedule"
        subtitle={`The building permit fee follows the project's valuation; the plan-review fee, charged when intake accepts an application, is a share of it. ${env().PAYMENT_REQUIRED_BEFORE_REVIEW ? "This department requires payment before review: the review clock starts when the fee is paid." : "Review starts at acceptance; the fee is paid alongside."}`}
      />
      <FeeScheduleEditor initial={schedule} save={saveFeeScheduleAction} />
    </>
  );
}
