// Guards: conditions on the facts that must hold before a transition, each with the
// message the examiner or applicant reads when it does not. Messages name what is missing.

import type { ParsedInputs } from "@/lib/workflow/events";
import { formatCents } from "@/lib/fees/money";
import type { ApplicationFacts, OpenComment } from "@/lib/workflow/facts";

/** "comment 3", "comments 2 and 5", "comments 2, 5 and 7" — in list order. */
export function describeComments(comments: readonly OpenComment[]): string {
  const numbers = comments.map((c) => c.number).sort((a, b) => a - b);
  if (numbers.length === 1) return `comment ${numbers[0]}`;
  const head = numbers.slice(0, -1).join(", ");
  return `comments ${head} and ${numbers[numbers.length - 1]}`;
}

function isAre(comments: readonly OpenComment[]): string {
  return comments.length === 1 ? "is" : "are";
}

/** issue_corrections: a correction list needs at least one open comment (carried ones count). */
export function hasOpenComment(facts: ApplicationFacts): string | null {
  return facts.openComments.length > 0
    ? null
    : "Write at least one correction comment before issuing corrections.";
}

/** resubmit: the response letter answers every open comment by number (common practice, no source). */
export function everyOpenCommentAnswered(facts: ApplicationFacts): string | null {
  const unanswered = facts.openComments.filter((c) => !c.answered);
  if (unanswered.length === 0) return null;
  const verb = unanswered.length === 1 ? "has" : "have";
  return `Respond to every open comment before resubmitting: ${describeComments(unanswered)} ${verb} no response.`;
}

/** approve: a plain approval leaves nothing open. */
export function noOpenComments(facts: ApplicationFacts): string | null {
  const open = facts.openComments;
  if (open.length === 0) return null;
  return (
    `Resolve every open comment before approving: ${describeComments(open)} ${isAre(open)} still open. ` +
    `To approve with open comments, approve with conditions and carry each one as a condition.`
  );
}

/**
 * approve_with_conditions: an open comment may stay open only when a condition carries it,
 * so nothing the examiner raised disappears from the approved record.
 */
export function everyOpenCommentCarried(
  facts: ApplicationFacts,
  input: ParsedInputs["approve_with_conditions"],
): string | null {
  const carried = new Set(input.conditions.map((c) => c.carriesCommentId));
  const loose = facts.openComments.filter((c) => !carried.has(c.id));
  if (loose.length === 0) return null;
  return (
    `Carry every open comment as a condition, or resolve it, before approving with conditions: ` +
    `${describeComments(loose)} ${isAre(loose)} still open and not carried by any condition.`
  );
}

/**
 * Review steps wait for the fee where the department requires payment first: the examiner may
 * read and draft comments, but begins, issues and approves nothing until the invoice is paid.
 */
export function feePaid(facts: ApplicationFacts): string | null {
  const fee = facts.unpaidFee;
  if (!fee) return null;
  return `Plan review waits for the fee: invoice ${fee.invoiceNumber} (${formatCents(fee.totalCents)}) is not paid yet, and this department reviews only after payment.`;
}

type Guard = (facts: ApplicationFacts) => string | null;

/** The first guard that blocks, in the order given (the fee first: it is what unblocks the rest). */
export function firstBlocking(...guards: Guard[]): Guard {
  return (facts) => {
    for (const g of guards) {
      const blocked = g(facts);
      if (blocked !== null) return blocked;
    }
    return null;
  };
}
