import { ReviewClockSettings } from "@/components/review-clock/review-clock-settings";
import { PageHeader } from "@/components/ui/page-header";
import { db } from "@/db/client";
import { requirePageUser } from "@/lib/auth/session";
import { getClockSettings } from "@/lib/review-clock/server";

export const metadata = { title: "Review clock" };

export default async function ReviewClockPage() {
  await requirePageUser("admin");
  const s = await getClockSettings(db());
  return (
    <>
      <PageHeader
        title="Review clock"
        subtitle={`Review targets in business days and the days the department is closed. A due date is the receipt date plus the target, the receipt day not counted, weekends and holidays skipped (time zone ${s.timeZone}).`}
      />
      <ReviewClockSettings initialTargets={s.targets} initialHolidays={s.holidays} />
    </>
  );
}
