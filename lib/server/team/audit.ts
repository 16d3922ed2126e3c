import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { AuditEvent } from '@/entities/audit-event';

export interface AuditInput {
  workspace?: string | null;
  actor?: string | null;
  action: string;
  target?: string | null;
  detail?: Record<string, unknown> | null;
}

/** Writes one audit event (inside the caller's transaction when there is one). */
export async function recordAudit(db: EntityManager, input: AuditInput): Promise<void> {
  db.create(AuditEvent, {
    workspace: input.workspace ?? null,
    actor: input.actor ?? null,
    action: input.action,
    target: input.target?.slice(0, 200) ?? null,
    detail: input.detail ?? null,
  });
  await db.flush();
}
