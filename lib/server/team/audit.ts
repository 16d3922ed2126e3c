import 'server-only';
// The audit trail: who did what, written inside the caller's transaction so an action and its
// record commit together, and read back a page at a time for the workspace's audit screen.
import type { EntityManager } from '@mikro-orm/postgresql';
import { AuditEvent } from '@/entities/audit-event';
import { Membership } from '@/entities/membership';
import { em } from '@/lib/server/db/orm';
import type { WorkspaceContext } from './membership';

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

export const AUDIT_PAGE_SIZE = 50;
/** Account events carry no workspace; they show in every workspace the actor belongs to. */
const ACCOUNT_ACTIONS = ['auth.sign_in', 'auth.password_reset'];

export async function listAuditEvents(ctx: WorkspaceContext, page = 1) {
  const db = await em();
  const members = await db.find(Membership, { workspace: ctx.workspace.id }, { fields: ['user'] });
  const memberIds = members.map((m) => m.user.id);
  const where = { $or: [{ workspace: ctx.workspace.id }, { workspace: null, action: { $in: ACCOUNT_ACTIONS }, actor: { $in: memberIds } }] };
  const total = await db.count(AuditEvent, where);
  const pageCount = Math.max(1, Math.ceil(total / AUDIT_PAGE_SIZE));
  const current = Math.min(Math.max(1, Math.floor(page) || 1), pageCount);
  const rows = await db.find(AuditEvent, where, {
    populate: ['actor'],
    orderBy: { createdAt: 'desc', id: 'desc' },
    limit: AUDIT_PAGE_SIZE,
    offset: (current - 1) * AUDIT_PAGE_SIZE,
  });
  return {
    page: current,
    pageCount,
    total,
    events: rows.map((e) => ({
      id: e.id,
      createdAt: e.createdAt.toISOString(),
      action: e.action,
      actor: e.actor ? { name: e.actor.name, email: e.actor.email } : null,
      target: e.target ?? null,
      detail: e.detail ?? null,
    })),
  };
}
export type AuditPage = Awaited<ReturnType<typeof listAuditEvents>>;
