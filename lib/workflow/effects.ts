// What a transition owes besides the state change, as data: the caller writes the audit
// row and the outbox rows in the same transaction as the state change.

/** Who gets a notice. Group kinds ("technicians", "supervisors") are resolved by the caller. */
export const RECIPIENT_KINDS = [
  "applicant",
  "assigned_examiner",
  "previous_examiner",
  "technicians",
  "supervisors",
] as const;

export type RecipientKind = (typeof RECIPIENT_KINDS)[number];

/** E-mail templates, with what each one must tell its reader. */
export const NOTICE_TEMPLATES = {
  "intake.receipt": "To the applicant: we received the application; a permit technician will screen it for completeness.",
  "intake.new_submission": "To permit technicians: a new application is waiting in the intake queue.",
  "intake.returned_incomplete": "To the applicant: the application is incomplete; the reasons, and what to add before submitting again.",
  "intake.accepted": "To the applicant: accepted for plan review; the examiner assigned; the review clock has started.",
  "review.assigned": "To the plans examiner: an application has been assigned to you for review.",
  "review.reassigned_away": "To the previous examiner: the review was reassigned; no further action from you.",
  "review.corrections_issued": "To the applicant: corrections were issued; answer each comment and resubmit revised sheets.",
  "review.resubmitted": "To the plans examiner: the applicant answered the corrections and resubmitted.",
  "review.approved": "To the applicant: the plans are approved.",
  "review.approved_with_conditions": "To the applicant: the plans are approved with the conditions listed.",
  "application.withdrawn": "To the department: the applicant withdrew the application; stop work on it.",
} as const;

export type NoticeTemplate = keyof typeof NOTICE_TEMPLATES;

export interface Notice {
  template: NoticeTemplate;
  to: RecipientKind;
  /** the user for person kinds (applicant, assigned/previous examiner); null for groups */
  userId: number | null;
}

export interface AuditEffect {
  /** dotted type, e.g. "review.corrections_issued" */
  type: string;
  /** one plain sentence for the timeline */
  summary: string;
}

export interface TransitionEffects {
  audit: AuditEffect;
  notices: readonly Notice[];
  /** review clock: follows STATE_INFO.reviewClock of the states before and after */
  clock: "start" | "stop" | null;
  /** a new review cycle begins with this number */
  cycle: { start: number } | null;
  /** the application's examiner changes */
  assignment: { examinerId: number; previousExaminerId: number | null } | null;
}
