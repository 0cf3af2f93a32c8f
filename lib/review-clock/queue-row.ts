// What the queue API sends for one open review: dates as ISO instants and department days,
// and where its clock stands today.
import type { QueueRow, QueueState } from "@/db/queries/queue";
import type { BusinessCalendar, Day } from "./calendar";
import { clockStatus } from "./clock";
import { dayInZone } from "./zone";

/** `feeBeforeReview`: the department reviews only after payment, so an unpaid fee holds the review. */
export function presentQueueRow(r: QueueRow, today: Day, cal: BusinessCalendar, { feeBeforeReview }: { feeBeforeReview: boolean }) {
  const dueDay = r.dueAt ? dayInZone(r.dueAt) : null;
  return {
    id: r.id,
    number: r.number,
    siteAddress: r.siteAddress,
    state: r.state as QueueState,
    cycle: r.cycle,
    version: r.version,
    examiner: r.examinerId ? { id: r.examinerId, name: r.examinerName ?? `#${r.examinerId}` } : null,
    receivedAt: r.receivedAt?.toISOString() ?? null,
    receivedDay: r.receivedAt ? dayInZone(r.receivedAt) : null,
    dueAt: r.dueAt?.toISOString() ?? null,
    dueDay,
    clock: clockStatus(dueDay, today, cal),
    waitingForFee: feeBeforeReview && r.unpaidFee === 1,
  };
}

export type QueueApiRow = ReturnType<typeof presentQueueRow>;

export interface QueueApiPage {
  rows: QueueApiRow[];
  nextCursor: string | null;
  /** only on the first page (no cursor); counted up to a cap */
  total: { n: number; capped: boolean } | null;
  today: Day;
}
