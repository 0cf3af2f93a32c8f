import { sql } from "drizzle-orm";
import {
  bigint,
  boolean,
  char,
  datetime,
  double,
  index,
  int,
  json,
  mysqlEnum,
  mysqlTable,
  text,
  uniqueIndex,
  varchar,
} from "drizzle-orm/mysql-core";
import { ROLES } from "../lib/workflow/roles";
import { STATES } from "../lib/workflow/states";

// Every table has a primary key (replication and Galera need one) and ids are never assumed
// consecutive. Rows that a transition changes carry `version` for conditional updates.

const id = () => bigint("id", { mode: "number", unsigned: true }).autoincrement().primaryKey();
const ref = (name: string) => bigint(name, { mode: "number", unsigned: true });
const at = (name: string) => datetime(name, { mode: "date", fsp: 3 });
const createdAt = () => at("created_at").notNull().default(sql`CURRENT_TIMESTAMP(3)`);

// The workflow module owns the lists of roles and states; the columns follow them.
export const ROLE_VALUES = ROLES;

export const firms = mysqlTable("firms", {
  id: id(),
  name: varchar("name", { length: 160 }).notNull(),
  kind: mysqlEnum("kind", ["design", "contractor", "owner"]).notNull(),
  city: varchar("city", { length: 80 }).notNull().default(""),
  createdAt: createdAt(),
});

export const users = mysqlTable(
  "users",
  {
    id: id(),
    email: varchar("email", { length: 254 }).notNull(),
    name: varchar("name", { length: 120 }).notNull(),
    role: mysqlEnum("role", ROLE_VALUES).notNull(),
    status: mysqlEnum("status", ["invited", "active", "deactivated"]).notNull().default("invited"),
    passwordHash: varchar("password_hash", { length: 100 }),
    // Bumped on deactivation, role change and password change: every older session token dies.
    sessionVersion: int("session_version").notNull().default(1),
    firmId: ref("firm_id").references(() => firms.id),
    title: varchar("title", { length: 120 }).notNull().default(""),
    version: int("version").notNull().default(1),
    createdAt: createdAt(),
    updatedAt: at("updated_at").notNull().default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [uniqueIndex("users_email_uq").on(t.email), index("users_role_idx").on(t.role, t.status)],
);

export const authTokens = mysqlTable(
  "auth_tokens",
  {
    id: id(),
    userId: ref("user_id").notNull().references(() => users.id),
    purpose: mysqlEnum("purpose", ["invite", "reset"]).notNull(),
    // SHA-256 of the token in the e-mailed link; the token itself is never stored.
    tokenHash: char("token_hash", { length: 64 }).notNull(),
    expiresAt: at("expires_at").notNull(),
    usedAt: at("used_at"),
    createdBy: ref("created_by").references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("auth_tokens_hash_uq").on(t.tokenHash), index("auth_tokens_user_idx").on(t.userId, t.purpose)],
);

export const loginAttempts = mysqlTable(
  "login_attempts",
  {
    id: id(),
    email: varchar("email", { length: 254 }).notNull(),
    ip: varchar("ip", { length: 64 }).notNull(),
    success: boolean("success").notNull(),
    at: createdAt(),
  },
  (t) => [index("login_attempts_email_idx").on(t.email, t.at), index("login_attempts_ip_idx").on(t.ip, t.at)],
);

export const APPLICATION_STATES = STATES;

export const applications = mysqlTable(
  "applications",
  {
    id: id(),
    // Department number, e.g. LFB-26-00042; set in the same transaction as the insert.
    number: varchar("number", { length: 24 }),
    applicantId: ref("applicant_id").notNull().references(() => users.id),
    firmId: ref("firm_id").references(() => firms.id),
    state: mysqlEnum("state", APPLICATION_STATES).notNull().default("draft"),
    cycle: int("cycle").notNull().default(0),
    workDescription: varchar("work_description", { length: 2000 }).notNull(),
    siteAddress: varchar("site_address", { length: 200 }).notNull(),
    parcelNumber: varchar("parcel_number", { length: 40 }).notNull(),
    occupancyGroup: varchar("occupancy_group", { length: 8 }).notNull(),
    constructionType: varchar("construction_type", { length: 8 }).notNull(),
    valuationCents: bigint("valuation_cents", { mode: "number" }).notNull(),
    dporName: varchar("dpor_name", { length: 120 }).notNull(),
    dporLicence: varchar("dpor_licence", { length: 40 }).notNull(),
    assignedExaminerId: ref("assigned_examiner_id").references(() => users.id),
    conditions: json("conditions").$type<string[]>(),
    returnReasons: json("return_reasons").$type<string[]>(),
    submittedAt: at("submitted_at"),
    acceptedAt: at("accepted_at"),
    // Receipt and due date of the current review cycle, copied from review_cycles so the queue
    // can filter and sort on an index at any size.
    receivedAt: at("received_at"),
    dueAt: at("due_at"),
    decidedAt: at("decided_at"),
    version: int("version").notNull().default(1),
    createdAt: createdAt(),
    updatedAt: at("updated_at").notNull().default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [
    uniqueIndex("applications_number_uq").on(t.number),
    index("applications_applicant_idx").on(t.applicantId, t.updatedAt),
    index("applications_state_idx").on(t.state, t.submittedAt, t.id),
    index("applications_examiner_idx").on(t.assignedExaminerId, t.state, t.id),
    index("applications_queue_due_idx").on(t.state, t.dueAt, t.id),
    index("applications_examiner_due_idx").on(t.assignedExaminerId, t.state, t.dueAt, t.id),
    index("applications_queue_received_idx").on(t.state, t.receivedAt, t.id),
    index("applications_examiner_received_idx").on(t.assignedExaminerId, t.state, t.receivedAt, t.id),
    // Approvals in a period (turnaround statistics): covering, so a year's range is read off the
    // index instead of a table scan (id comes with every secondary index).
    index("applications_decided_idx").on(t.state, t.decidedAt, t.cycle),
  ],
);

export const reviewCycles = mysqlTable(
  "review_cycles",
  {
    id: id(),
    applicationId: ref("application_id").notNull().references(() => applications.id),
    number: int("number").notNull(),
    examinerId: ref("examiner_id").references(() => users.id),
    // The clock runs from receivedAt until the cycle's decision (corrections or approval).
    receivedAt: at("received_at").notNull(),
    // Target date for the decision, in business days from receipt (set when the cycle starts).
    dueAt: at("due_at"),
    decidedAt: at("decided_at"),
    outcome: mysqlEnum("outcome", ["corrections_issued", "approved", "approved_with_conditions", "withdrawn"]),
    version: int("version").notNull().default(1),
  },
  (t) => [
    uniqueIndex("review_cycles_app_number_uq").on(t.applicationId, t.number),
    // Cycles decided in a period (turnaround statistics): every column the query reads, so a
    // year's range stays an index range (with decided_at alone MariaDB scanned the table for 365 days).
    index("review_cycles_decided_idx").on(t.decidedAt, t.outcome, t.applicationId, t.number, t.receivedAt, t.dueAt),
  ],
);

export const DOCUMENT_KINDS = ["drawings", "calculations", "response_letter", "member_model"] as const;

export const documents = mysqlTable(
  "documents",
  {
    id: id(),
    applicationId: ref("application_id").notNull().references(() => applications.id),
    cycle: int("cycle").notNull(),
    kind: mysqlEnum("kind", DOCUMENT_KINDS).notNull(),
    originalName: varchar("original_name", { length: 255 }).notNull(),
    contentType: varchar("content_type", { length: 80 }).notNull(),
    byteSize: bigint("byte_size", { mode: "number" }).notNull(),
    sha256: char("sha256", { length: 64 }).notNull(),
    pageCount: int("page_count").notNull().default(0),
    storageKey: varchar("storage_key", { length: 120 }).notNull(),
    uploadedBy: ref("uploaded_by").notNull().references(() => users.id),
    uploadedAt: createdAt(),
  },
  (t) => [
    uniqueIndex("documents_app_sha_uq").on(t.applicationId, t.sha256),
    index("documents_app_idx").on(t.applicationId, t.cycle),
  ],
);

export const sheets = mysqlTable(
  "sheets",
  {
    id: id(),
    documentId: ref("document_id").notNull().references(() => documents.id),
    applicationId: ref("application_id").notNull().references(() => applications.id),
    page: int("page").notNull(),
    sheetNumber: varchar("sheet_number", { length: 24 }),
    title: varchar("title", { length: 200 }).notNull(),
  },
  (t) => [uniqueIndex("sheets_doc_page_uq").on(t.documentId, t.page), index("sheets_app_number_idx").on(t.applicationId, t.sheetNumber)],
);

export const comments = mysqlTable(
  "comments",
  {
    id: id(),
    applicationId: ref("application_id").notNull().references(() => applications.id),
    // Per-application comment number, as it appears on the correction letter.
    number: int("number").notNull(),
    cycle: int("cycle").notNull(),
    discipline: varchar("discipline", { length: 24 }).notNull(),
    sheetId: ref("sheet_id").references(() => sheets.id),
    // Pin position as a fraction of the page (0..1 from the top-left corner).
    pinX: double("pin_x"),
    pinY: double("pin_y"),
    codeSection: varchar("code_section", { length: 60 }).notNull(),
    codeEdition: varchar("code_edition", { length: 30 }).notNull(),
    body: text("body").notNull(),
    status: mysqlEnum("status", ["draft", "open", "resolved"]).notNull().default("draft"),
    checkId: ref("check_id"),
    createdBy: ref("created_by").notNull().references(() => users.id),
    createdAt: createdAt(),
    resolvedAt: at("resolved_at"),
    resolvedBy: ref("resolved_by").references(() => users.id),
    version: int("version").notNull().default(1),
  },
  (t) => [uniqueIndex("comments_app_number_uq").on(t.applicationId, t.number), index("comments_app_status_idx").on(t.applicationId, t.status)],
);

export const responses = mysqlTable(
  "responses",
  {
    id: id(),
    commentId: ref("comment_id").notNull().references(() => comments.id),
    cycle: int("cycle").notNull(),
    body: text("body").notNull(),
    // Where the change is: revised sheet number or calc page, as the applicant states it.
    changeReference: varchar("change_reference", { length: 120 }).notNull().default(""),
    documentId: ref("document_id").references(() => documents.id),
    verdict: mysqlEnum("verdict", ["pending", "resolved", "not_resolved"]).notNull().default("pending"),
    createdBy: ref("created_by").notNull().references(() => users.id),
    createdAt: createdAt(),
    reviewedBy: ref("reviewed_by").references(() => users.id),
    reviewedAt: at("reviewed_at"),
    version: int("version").notNull().default(1),
  },
  (t) => [uniqueIndex("responses_comment_cycle_uq").on(t.commentId, t.cycle)],
);

export const assignments = mysqlTable(
  "assignments",
  {
    id: id(),
    applicationId: ref("application_id").notNull().references(() => applications.id),
    examinerId: ref("examiner_id").notNull().references(() => users.id),
    assignedBy: ref("assigned_by").notNull().references(() => users.id),
    // Internal: never shown to the applicant.
    reason: varchar("reason", { length: 500 }).notNull().default(""),
    assignedAt: createdAt(),
    endedAt: at("ended_at"),
  },
  (t) => [index("assignments_app_idx").on(t.applicationId, t.assignedAt)],
);

// Append-only: the code has no update or delete path for this table.
export const auditEvents = mysqlTable(
  "audit_events",
  {
    id: id(),
    at: createdAt(),
    actorId: ref("actor_id"),
    actorRole: varchar("actor_role", { length: 20 }),
    action: varchar("action", { length: 64 }).notNull(),
    entityType: varchar("entity_type", { length: 32 }).notNull(),
    entityId: varchar("entity_id", { length: 64 }).notNull(),
    applicationId: ref("application_id"),
    summary: varchar("summary", { length: 500 }).notNull(),
    detail: json("detail").$type<Record<string, unknown>>(),
    ip: varchar("ip", { length: 64 }),
  },
  (t) => [index("audit_app_idx").on(t.applicationId, t.at), index("audit_action_idx").on(t.action, t.at)],
);

// Transactional outbox: written in the same transaction as the change it announces;
// the worker sends and marks it. Message-ID is derived from the row id.
export const outbox = mysqlTable(
  "outbox",
  {
    id: id(),
    dedupeKey: varchar("dedupe_key", { length: 191 }).notNull(),
    template: varchar("template", { length: 64 }).notNull(),
    toAddress: varchar("to_address", { length: 254 }).notNull(),
    toName: varchar("to_name", { length: 120 }).notNull().default(""),
    subject: varchar("subject", { length: 250 }).notNull(),
    textBody: text("text_body").notNull(),
    applicationId: ref("application_id"),
    status: mysqlEnum("status", ["pending", "sent", "failed"]).notNull().default("pending"),
    attempts: int("attempts").notNull().default(0),
    nextAttemptAt: at("next_attempt_at").notNull().default(sql`CURRENT_TIMESTAMP(3)`),
    lastError: varchar("last_error", { length: 500 }),
    createdAt: createdAt(),
    sentAt: at("sent_at"),
    // A worker's lease on a row it is sending: claimed by a conditional update (certified across a
    // Galera cluster), cleared when it is marked; once claimed_until passes, another worker may resend.
    claimToken: varchar("claim_token", { length: 36 }),
    claimedUntil: at("claimed_until"),
  },
  (t) => [uniqueIndex("outbox_dedupe_uq").on(t.dedupeKey), index("outbox_pending_idx").on(t.status, t.nextAttemptAt, t.id)],
);

// ---- deflection checks (the examiner's re-run of a claimed member, or an applicant's pre-check)

export const deflectionChecks = mysqlTable(
  "deflection_checks",
  {
    id: id(),
    applicationId: ref("application_id").notNull().references(() => applications.id),
    cycle: int("cycle").notNull(),
    purpose: mysqlEnum("purpose", ["review", "precheck"]).notNull(),
    memberMark: varchar("member_mark", { length: 40 }).notNull(),
    sheetId: ref("sheet_id").references(() => sheets.id),
    calcDocumentId: ref("calc_document_id").references(() => documents.id),
    calcPage: int("calc_page"),
    // The model file verbatim, the options and the solver version: a re-run years later gives the same answer.
    model: json("model").$type<unknown>().notNull(),
    options: json("options").$type<Record<string, unknown>>().notNull(),
    solverVersion: varchar("solver_version", { length: 40 }).notNull(),
    result: json("result").$type<unknown>().notNull(),
    verdict: mysqlEnum("verdict", ["pass", "fail", "near_limit", "disputed", "no_limit"]).notNull(),
    summary: varchar("summary", { length: 500 }).notNull(),
    status: mysqlEnum("status", ["current", "reverify"]).notNull().default("current"),
    createdBy: ref("created_by").notNull().references(() => users.id),
    createdAt: createdAt(),
    version: int("version").notNull().default(1),
  },
  (t) => [index("checks_app_idx").on(t.applicationId, t.cycle), index("checks_calc_idx").on(t.calcDocumentId)],
);

// ---- review clock settings, holidays and reminder bookkeeping

export const settings = mysqlTable("settings", {
  key: varchar("key", { length: 64 }).primaryKey(),
  value: json("value").$type<unknown>().notNull(),
  updatedBy: ref("updated_by").references(() => users.id),
  updatedAt: at("updated_at").notNull().default(sql`CURRENT_TIMESTAMP(3)`),
});

export const holidays = mysqlTable("holidays", {
  // Calendar date in the department's time zone, YYYY-MM-DD.
  day: varchar("day", { length: 10 }).primaryKey(),
  name: varchar("name", { length: 80 }).notNull(),
});

// One row per reminder sent, so the job sends each once, across runs and restarts.
export const remindersSent = mysqlTable(
  "reminders_sent",
  {
    id: id(),
    applicationId: ref("application_id").notNull().references(() => applications.id),
    cycle: int("cycle").notNull(),
    kind: mysqlEnum("kind", ["due_tomorrow", "overdue"]).notNull(),
    sentAt: createdAt(),
  },
  (t) => [uniqueIndex("reminders_once_uq").on(t.applicationId, t.cycle, t.kind)],
);

// ---- plan-review fees: invoices in integer cents, and the payment provider's events

export const invoices = mysqlTable(
  "invoices",
  {
    id: id(),
    applicationId: ref("application_id").notNull().references(() => applications.id),
    // Department invoice number, e.g. INV-26-00042.
    number: varchar("number", { length: 24 }),
    // What the invoice is for: the first plan-review fee, or a fee for a later resubmittal.
    purpose: varchar("purpose", { length: 40 }).notNull(),
    cycle: int("cycle").notNull(),
    status: mysqlEnum("status", ["open", "paid", "void", "refunded"]).notNull().default("open"),
    totalCents: bigint("total_cents", { mode: "number" }).notNull(),
    currency: char("currency", { length: 3 }).notNull().default("usd"),
    // [{ code, label, amountCents, basis }] and the arithmetic shown to the applicant.
    lineItems: json("line_items").$type<{ code: string; label: string; amountCents: number; basis: string }[]>().notNull(),
    scheduleVersion: varchar("schedule_version", { length: 40 }).notNull(),
    providerSessionId: varchar("provider_session_id", { length: 255 }),
    providerPaymentId: varchar("provider_payment_id", { length: 255 }),
    // A payment taken at the department's counter (cheque, cash, card terminal) and recorded by staff;
    // the recorder's name as it stood then, as on a paper receipt (the id finds the account today).
    counterPayment: json("counter_payment").$type<{ method: "cheque" | "cash" | "card_terminal"; reference: string; recordedById: number; recordedBy: string }>(),
    createdAt: createdAt(),
    paidAt: at("paid_at"),
    closedAt: at("closed_at"),
    version: int("version").notNull().default(1),
  },
  (t) => [
    uniqueIndex("invoices_number_uq").on(t.number),
    uniqueIndex("invoices_app_purpose_cycle_uq").on(t.applicationId, t.purpose, t.cycle),
    index("invoices_session_idx").on(t.providerSessionId),
  ],
);

// Every webhook event once: the provider's event id is the idempotency key.
export const paymentEvents = mysqlTable(
  "payment_events",
  {
    id: id(),
    providerEventId: varchar("provider_event_id", { length: 255 }).notNull(),
    type: varchar("type", { length: 80 }).notNull(),
    invoiceId: ref("invoice_id").references(() => invoices.id),
    payload: json("payload").$type<unknown>().notNull(),
    receivedAt: createdAt(),
  },
  (t) => [uniqueIndex("payment_events_provider_uq").on(t.providerEventId)],
);

export type User = typeof users.$inferSelect;
export type Application = typeof applications.$inferSelect;
export type DocumentRow = typeof documents.$inferSelect;
export type CommentRow = typeof comments.$inferSelect;
export type OutboxRow = typeof outbox.$inferSelect;
