import 'server-only';
// Pages guard themselves (a layout's check is a convenience, never the guard): signed out goes
// to sign-in, an outsider sees the not-found page, a weaker role the "not allowed" page.
import { redirect } from 'next/navigation';
import type { Role } from '@/lib/roles';
import { AppError } from './errors';
import { orNotFound } from './not-found';
import { authorise, type WorkspaceContext } from '@/lib/server/team/membership';
import { currentUser, type SessionUser } from '@/lib/server/team/session';

/** Pages: the signed-in user, or a redirect to sign-in. */
export async function requireUser(next?: string): Promise<SessionUser> {
  const user = await currentUser();
  if (!user) redirect(next ? `/sign-in?next=${encodeURIComponent(next)}` : '/sign-in');
  return user;
}

/**
 * Pages: membership with at least `minimum`. Outsiders get the not-found page, members with
 * a weaker role the plain "not allowed" page.
 */
export async function requireRole(slug: string, minimum: Role, next?: string): Promise<WorkspaceContext> {
  const user = await requireUser(next ?? `/w/${slug}`);
  try {
    return await orNotFound(authorise(user, slug, minimum));
  } catch (err) {
    if (err instanceof AppError && err.status === 403) redirect(`/w/${encodeURIComponent(slug)}/not-allowed`);
    throw err;
  }
}
