import Link from "next/link";
import { QueueTable, type QueueFilters } from "@/components/queue/queue-table";
import { PageHeader } from "@/components/ui/page-header";
import { db } from "@/db/client";
import { getReviewTargets } from "@/db/queries/settings";
import { requirePageUser } from "@/lib/auth/session";

export const metadata = { title: "Queue" };

const one = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v) ?? "";

export default async function QueuePage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  await requirePageUser("supervisor");
  const sp = await searchParams;
  const targets = await getReviewTargets(db());
  // Links from reminder e-mails open the queue filtered (e.g. ?due=overdue); anything unknown is ignored.
  const initial: QueueFilters = {
    examinerId: /^\d{1,10}$/.test(one(sp.examinerId)) ? one(sp.examinerId) : "",
    state: one(sp.state) === "in_review" || one(sp.state) === "resubmitted" ? (one(sp.state) as QueueFilters["state"]) : "",
    due: one(sp.due) === "overdue" || one(sp.due) === "this_week" ? (one(sp.due) as QueueFilters["due"]) : "",
    sort: one(sp.sort) === "received" || one(sp.sort) === "number" ? (one(sp.sort) as QueueFilters["sort"]) : "due",
    dir: one(sp.dir) === "desc" ? "desc" : "asc",
  };
  return (
    <>
      <PageHeader
        title="Queue"
        subtitle={
          <>
            Every open review, soonest due first. Targets: {targets.firstReviewDays} business days for a first review, {targets.resubmittalDays} for a resubmittal; the clock stops while corrections are with the applicant.{" "}
            <Link href="/queue/workload" className="text-accent underline-offset-2 hover:underline">
              Workload and turnaround
            </Link>
          </>
        }
      />
      <QueueTable initial={initial} />
    </>
  );
}
