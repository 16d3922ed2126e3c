import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { Membership } from '@/entities/membership';
import { ROLE_LABELS, type Role } from '@/lib/roles';
import { recordAudit } from './audit';
import { em } from '@/lib/server/db/orm';
import { sql } from '@/lib/server/db/sql';
import { AppError, notFoundError } from '@/lib/server/http/errors';
import type { WorkspaceContext } from './membership';

// The team screen: list members, change a role, remove a member (owners only; the routes and
// actions check). A workspace always keeps one owner: both changes first lock the workspace's
// owner memberships `for update`, so two owners demoting or removing each other at once queue,
// and the second is refused with 409 (LAST_OWNER). Each change writes its audit event in the
// same transaction. Tests: tests/integration/team-members.test.ts.

export const LAST_OWNER = 'A workspace needs at least one owner. Make another member an owner first.';

export async function listMembers(ctx: WorkspaceContext) {
  const db = await em();
  const rows = await db.find(Membership, { workspace: ctx.workspace.id }, { populate: ['user'], orderBy: { createdAt: 'asc', id: 'asc' } });
  return rows.map((m) => ({
    id: m.id,
    name: m.user.name,
    email: m.user.email,
    role: m.role,
    joinedAt: m.createdAt.toISOString(),
    isYou: m.user.id === ctx.user.id,
  }));
}
export type MemberRow = Awaited<ReturnType<typeof listMembers>>[number];

/**
 * Locks the workspace's owner memberships, then loads the target: two concurrent demotions
 * or removals of the last two owners queue on the lock, and the second sees one owner left.
 */
async function lockedTarget(tx: EntityManager, workspaceId: string, membershipId: string) {
  const owners = await sql(tx, `select id from membership where workspace_id = ? and role = 'owner' for update`, [workspaceId]);
  const m = await tx.findOne(Membership, { id: membershipId, workspace: workspaceId }, { populate: ['user'], refresh: true });
  if (!m) throw notFoundError('That member');
  return { m, ownerCount: owners.length };
}

export async function changeRole(ctx: WorkspaceContext, membershipId: string, role: Role) {
  const db = await em();
  return db.transactional(async (tx) => {
    const { m, ownerCount } = await lockedTarget(tx, ctx.workspace.id, membershipId);
    if (m.role === role) return { id: m.id, role };
    if (m.role === 'owner' && ownerCount <= 1) throw new AppError(409, 'conflict', LAST_OWNER);
    const from = m.role;
    m.role = role;
    await tx.flush();
    await recordAudit(tx, { workspace: ctx.workspace.id, actor: ctx.user.id, action: 'member.role_changed', target: m.user.email, detail: { from, to: role, label: `${ROLE_LABELS[from]} → ${ROLE_LABELS[role]}` } });
    return { id: m.id, role };
  });
}

export async function removeMember(ctx: WorkspaceContext, membershipId: string) {
  const db = await em();
  await db.transactional(async (tx) => {
    const { m, ownerCount } = await lockedTarget(tx, ctx.workspace.id, membershipId);
    if (m.role === 'owner' && ownerCount <= 1) throw new AppError(409, 'conflict', LAST_OWNER);
    const email = m.user.email;
    const role = m.role;
    tx.remove(m);
    await tx.flush();
    await recordAudit(tx, { workspace: ctx.workspace.id, actor: ctx.user.id, action: 'member.removed', target: email, detail: { role } });
  });
}
