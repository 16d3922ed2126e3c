import 'server-only';
import { cache } from 'react';
import { User } from '@/entities/user';
import { auth } from './auth';
import { em } from '@/lib/server/db/orm';

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
