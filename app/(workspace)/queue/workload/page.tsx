import { WorkloadCharts } from "@/components/queue/workload-charts";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/auth/session";
import { dayInZone, shiftDays } from "@/lib/review-clock";

export const metadata = { title: "Workload and turnaround" };

export default async function WorkloadPage() {
  await requirePageUser("supervisor");
  const today = dayInZone(new Date());
  return (
    <>
      <PageHeader
        title="Workload and turnaround"
        subtitle="Who holds which reviews today, and how the department has kept its review targets over a period. Days are business days with the department; time with the applicant is not counted."
      />
      <WorkloadCharts today={today} defaultFrom={shiftDays(today, -89)} />
    </>
  );
}
