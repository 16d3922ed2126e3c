import 'server-only';
import { Membership } from '@/entities/membership';
import { hasRole, type Role } from '@/lib/roles';
import { em } from '@/lib/server/db/orm';
import { AppError, forbiddenError, notFoundError } from '@/lib/server/http/errors';
import type { SessionUser } from './session';

export interface WorkspaceContext {
  user: SessionUser;
  workspace: { id: string; slug: string; name: string };
  role: Role;
}

/** The user's membership in the workspace with this slug, or null when there is none. */
export async function findMembership(userId: string, slug: string): Promise<WorkspaceContext['workspace'] & { role: Role } | null> {
  const db = await em();
  const m = await db.findOne(Membership, { user: userId, workspace: { slug } }, { populate: ['workspace'] });
  if (!m) return null;
  return { id: m.workspace.id, slug: m.workspace.slug, name: m.workspace.name, role: m.role };
}

/**
 * The one authorisation check: the user must be a member of the workspace (else 404, so a
 * foreign workspace's existence does not leak) with at least `minimum` (else 403).
 */
export async function authorise(user: SessionUser | null, slug: string, minimum: Role): Promise<WorkspaceContext> {
  if (!user) throw new AppError(401, 'unauthenticated', 'Sign in first.');
  return checkMembership(user, await findMembership(user.id, slug), minimum);
}

/** The decision itself, apart from the lookup (unit-tested). */
export function checkMembership(user: SessionUser, m: (WorkspaceContext['workspace'] & { role: Role }) | null, minimum: Role): WorkspaceContext {
  if (!m) throw notFoundError('That workspace');
  if (!hasRole(m.role, minimum)) throw forbiddenError();
  return { user, workspace: { id: m.id, slug: m.slug, name: m.name }, role: m.role };
}

export async function listWorkspaces(userId: string) {
  const db = await em();
  const rows = await db.find(Membership, { user: userId }, { populate: ['workspace'], orderBy: { workspace: { name: 'asc' } } });
  return rows.map((m) => ({ slug: m.workspace.slug, name: m.workspace.name, role: m.role }));
}

export async function listWorkspacesByEmail(email: string) {
  const db = await em();
  const rows = await db.find(Membership, { user: { email } }, { populate: ['workspace'], orderBy: { workspace: { name: 'asc' } } });
  return rows.map((m) => ({ slug: m.workspace.slug, name: m.workspace.name, role: m.role }));
}
