// The narrow view of an application the workflow decides on. The caller loads it in the
// same transaction that will write the outcome (and guards the write with the row version).

import type { Role } from "@/lib/workflow/roles";
import type { State } from "@/lib/workflow/states";

export interface Actor {
  id: number;
  role: Role;
}

/** A correction comment not yet resolved, whichever cycle it was written in (unresolved comments carry forward). */
export interface OpenComment {
  id: number;
  /** the number printed on the correction list, e.g. 3 for "Comment 3" */
  number: number;
  /** true when the applicant has responded to it in the current cycle */
  answered: boolean;
}

export interface ApplicationFacts {
  state: State;
  /** user id of the applicant who owns the application */
  applicantId: number;
  /** user id of the plans examiner it is assigned to; null before intake accepts it */
  assignedExaminerId: number | null;
  /** current review cycle: 0 until accepted, then 1, 2, … (one per resubmittal) */
  cycle: number;
  openComments: readonly OpenComment[];
  /**
   * A fee invoice left unpaid where the department reviews only after payment
   * (PAYMENT_REQUIRED_BEFORE_REVIEW); null when nothing is owed or payment may follow review.
   */
  unpaidFee: UnpaidFee | null;
}

export interface UnpaidFee {
  invoiceNumber: string;
  totalCents: number;
}

/** What the permission rules look at: who owns it, who reviews it, where it stands. */
export type ApplicationResource = Pick<ApplicationFacts, "state" | "applicantId" | "assignedExaminerId">;
