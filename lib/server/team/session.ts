import 'server-only';
import { cache } from 'react';
import { User } from '@/entities/user';
import { auth } from './auth';
import { em } from '@/lib/server/db/orm';

// Who is signed in, for every route, action and page (through route(), action() and
// requireRole()). The Auth.js cookie alone is not trusted: the user is read again on each
// request (React `cache`, once per render) and a session is void when its user is gone or its
// sessionVersion is older than the user's — a password reset bumps it, signing out every other
// device. Integration tests replace this module (tests/support/integration-setup.ts).

export interface SessionUser {
  id: string;
  email: string;
  name: string;
}

/**
 * The signed-in user, checked against the database on every request: a session from before
 * a password change (older sessionVersion) or of a deleted user counts as signed out.
 */
export const currentUser = cache(async (): Promise<SessionUser | null> => {
  const session = await auth();
  const id = session?.user?.id;
  if (!id) return null;
  const db = await em();
  // refresh: a lookup by id would otherwise answer from the request's identity map, which may
  // hold the user from before a password change bumped sessionVersion.
  const user = await db.findOne(User, { id }, { fields: ['id', 'email', 'name', 'sessionVersion'], refresh: true });
  if (!user || user.sessionVersion !== session.user.sessionVersion) return null;
  return { id: user.id, email: user.email, name: user.name };
});
