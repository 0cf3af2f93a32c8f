import "server-only";
import { and, asc, eq } from "drizzle-orm";
import type { Db, Tx } from "../client";
import { auditEvents, users } from "../schema";

export interface AuditInput {
  actor: { id: number; role: string } | null;
  action: string;
  entityType: string;
  entityId: string | number;
  applicationId?: number | null;
  summary: string;
  detail?: Record<string, unknown>;
  ip?: string | null;
}

// Control characters out: a summary can never forge a line in an exported log.
const clean = (s: string) => s.replace(/[\u0000-\u001f\u007f]/g, " ").slice(0, 500);

/** Append-only: there is deliberately no update or delete for audit events anywhere. */
export async function recordAudit(tx: Tx | Db, e: AuditInput): Promise<void> {
  await tx.insert(auditEvents).values({
    actorId: e.actor?.id ?? null,
    actorRole: e.actor?.role ?? null,
    action: e.action,
    entityType: e.entityType,
    entityId: String(e.entityId),
    applicationId: e.applicationId ?? null,
    summary: clean(e.summary),
    detail: e.detail ?? null,
    ip: e.ip ?? null,
  });
}

export async function listAuditForApplication(database: Db, applicationId: number) {
  return database
    .select({
      id: auditEvents.id,
      at: auditEvents.at,
      action: auditEvents.action,
      summary: auditEvents.summary,
      actorName: users.name,
      actorRole: auditEvents.actorRole,
    })
    .from(auditEvents)
    .leftJoin(users, eq(users.id, auditEvents.actorId))
    .where(eq(auditEvents.applicationId, applicationId))
    .orderBy(asc(auditEvents.at), asc(auditEvents.id));
}

export async function listAuditByAction(database: Db, action: string) {
  return database.select().from(auditEvents).where(and(eq(auditEvents.action, action))).orderBy(asc(auditEvents.id));
}
