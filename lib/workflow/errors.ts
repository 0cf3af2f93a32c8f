// One error type for every refusal, with a code the caller maps to a status:
// forbidden → 403 (404 when the actor may not see the application at all),
// invalid_transition → 409, guard_failed → 422, invalid_input → 400.

export type WorkflowErrorCode = "forbidden" | "invalid_transition" | "guard_failed" | "invalid_input";

/** Why a `forbidden` was raised: the role never may, or the application is someone else's. */
export type ForbiddenReason = "role" | "not_owner" | "not_assigned";

export class WorkflowError extends Error {
  override readonly name = "WorkflowError";

  constructor(
    readonly code: WorkflowErrorCode,
    message: string,
    readonly reason?: ForbiddenReason,
  ) {
    super(message);
  }
}

export function isWorkflowError(error: unknown): error is WorkflowError {
  return error instanceof WorkflowError;
}
