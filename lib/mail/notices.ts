import type { NoticeTemplate } from "@/lib/workflow";
import { mailSignature, type Mail } from "./templates";

export interface NoticeContext {
  number: string;
  siteAddress: string;
  workDescription: string;
  recipientName: string;
  link: string;
  cycle: number;
  examinerName?: string | null;
  reasons?: string[];
  conditions?: string[];
  openComments?: number;
  reason?: string | null;
  /** the department starts the review clock only when the plan-review fee is paid */
  clockWaitsForFee?: boolean;
}

const list = (items: string[] = []) => items.map((r, i) => `  ${i + 1}. ${r}`).join("\n");

// The department's own voice: what happened, what it means, what the reader does next.
const BODIES: Record<NoticeTemplate, (c: NoticeContext) => Mail> = {
  "intake.receipt": (c) => ({
    subject: `${c.number} received — ${c.siteAddress}`,
    text: `We received application ${c.number} for ${c.siteAddress} (${c.workDescription}).\n\nA permit technician will screen it for completeness. The plan-review clock starts once it is accepted; we will write to you either way.\n\nFollow it here: ${c.link}`,
  }),
  "intake.new_submission": (c) => ({
    subject: `Intake: ${c.number} is waiting for a completeness screen`,
    text: `Application ${c.number} for ${c.siteAddress} (${c.workDescription}) was submitted and is in the intake queue.\n\nOpen it: ${c.link}`,
  }),
  "intake.returned_incomplete": (c) => ({
    subject: `${c.number} returned as incomplete — action needed`,
    text: `Application ${c.number} for ${c.siteAddress} cannot be accepted for plan review yet. What is missing:\n\n${list(c.reasons)}\n\nAdd what is listed and submit the application again. The plan-review clock has not started.\n\nOpen the application: ${c.link}`,
  }),
  "intake.accepted": (c) => ({
    subject: `${c.number} accepted for plan review`,
    text: `Application ${c.number} for ${c.siteAddress} is complete and accepted for plan review. Your plans examiner is ${c.examinerName ?? "being assigned"}.\n\n${c.clockWaitsForFee ? "The review clock starts when the plan-review fee is paid; the invoice is in the application." : "The review clock started today."} You can follow the review here: ${c.link}`,
  }),
  "review.assigned": (c) => ({
    subject: `Assigned to you: ${c.number} — ${c.siteAddress}`,
    text: `Application ${c.number} (${c.workDescription}, ${c.siteAddress}) is assigned to you for review, cycle ${c.cycle}.\n\nOpen it: ${c.link}`,
  }),
  "review.reassigned_away": (c) => ({
    subject: `${c.number} was reassigned`,
    text: `The review of ${c.number} (${c.siteAddress}) is now with ${c.examinerName ?? "another examiner"}. No further action is needed from you.\n\n${c.link}`,
  }),
  "review.corrections_issued": (c) => ({
    subject: `${c.number}: correction comments issued (cycle ${c.cycle})`,
    text: `The plan review of ${c.number} for ${c.siteAddress} found items to correct: ${c.openComments ?? 0} open comment(s) in the enclosed correction list.\n\nAnswer each comment by number, saying where the change is (revised sheet or calculation page), upload the revised sheets with changes clouded, and resubmit. The review clock is stopped while the corrections are with you.\n\nCorrection list and comments: ${c.link}`,
  }),
  "review.resubmitted": (c) => ({
    subject: `Resubmittal: ${c.number} (cycle ${c.cycle})`,
    text: `The applicant answered the correction comments on ${c.number} (${c.siteAddress}) and resubmitted. Review cycle ${c.cycle} is on your desk.\n\n${c.link}`,
  }),
  "review.approved": (c) => ({
    subject: `${c.number} approved`,
    text: `The construction documents for ${c.number} at ${c.siteAddress} are approved: reviewed for code compliance.\n\nThe permit is issued separately; keep the approved set on site. ${c.link}`,
  }),
  "review.approved_with_conditions": (c) => ({
    subject: `${c.number} approved with conditions`,
    text: `The construction documents for ${c.number} at ${c.siteAddress} are approved with these conditions:\n\n${list(c.conditions)}\n\nEach condition must be met as stated; deferred submittals go to the department before that work is installed.\n\n${c.link}`,
  }),
  "application.withdrawn": (c) => ({
    subject: `${c.number} withdrawn by the applicant`,
    text: `The applicant withdrew ${c.number} (${c.siteAddress}).${c.reason ? ` Reason given: ${c.reason}` : ""}\n\nNo further work on it is needed. ${c.link}`,
  }),
};

export function renderNotice(template: NoticeTemplate, c: NoticeContext): Mail {
  const m = BODIES[template](c);
  return { subject: m.subject, text: `Dear ${c.recipientName},\n\n${m.text}${mailSignature}` };
}
