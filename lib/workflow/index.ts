// The review workflow: import from "@/lib/workflow".

export { ROLES, ROLE_LABELS, isRole, type Role } from "@/lib/workflow/roles";
export {
  STATES,
  STATE_INFO,
  FINAL_STATES,
  APPLICANT_SIDE_STATES,
  stateLabel,
  isState,
  type State,
  type Holder,
  type StateInfo,
} from "@/lib/workflow/states";
export {
  EVENTS,
  EVENT_LABELS,
  EVENT_REQUIRES,
  isWorkflowEvent,
  type WorkflowEvent,
  type EventInputs,
  type ParsedInputs,
  type ConditionInput,
  type InputField,
} from "@/lib/workflow/events";
export type { Actor, ApplicationFacts, ApplicationResource, OpenComment } from "@/lib/workflow/facts";
export {
  RECIPIENT_KINDS,
  NOTICE_TEMPLATES,
  type RecipientKind,
  type NoticeTemplate,
  type Notice,
  type AuditEffect,
  type TransitionEffects,
} from "@/lib/workflow/effects";
export { WorkflowError, isWorkflowError, type WorkflowErrorCode, type ForbiddenReason } from "@/lib/workflow/errors";
export {
  TRANSITIONS,
  ACTS_ON,
  transition,
  availableActions,
  type TransitionRule,
  type TransitionResult,
  type AvailableAction,
} from "@/lib/workflow/transitions";
export { ACTIONS, PERMISSIONS, can, checkAccess, type Action, type PermissionRule, type Scope } from "@/lib/workflow/permissions";
