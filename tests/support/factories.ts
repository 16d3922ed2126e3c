// Test data: every test makes its own users and workspaces with unique names (data isolated per
// test), so tests share one database and may run in any order without cleaning up. Accounts go
// through the real sign-up (welcome seats, owner membership, audit) so they look like production
// ones; `signInAs` says who the mocked session returns (see ./integration-setup.ts).
import { randomUUID } from 'node:crypto';
import { NextRequest } from 'next/server';
import { em } from '@/lib/server/db/orm';
import { signUp } from '@/lib/server/team/accounts';
import { User } from '@/entities/user';
import { Membership } from '@/entities/membership';
import { Workspace } from '@/entities/workspace';
import type { Role } from '@/lib/roles';
import type { SessionUser } from '@/lib/server/team/session';
import { hashPassword } from '@/lib/server/team/passwords';

export const uid = () => randomUUID().slice(0, 8);

/** Who the route handlers and actions under test see as signed in (see integration-setup.ts). */
export function signInAs(user: SessionUser | null) {
  (globalThis as { __testUser?: SessionUser | null }).__testUser = user;
}

/**
 * A new workspace with its owner, whose address is confirmed (so the workspace has its free
 * seats, as after following the e-mailed link); `confirmed: false` leaves it waiting.
 */
export async function makeWorkspace(name = `Test ${uid()}`, { confirmed = true }: { confirmed?: boolean } = {}) {
  const email = `owner-${uid()}@test.example`;
  // A proven address sends no confirmation mail: tests that count an owner's mails see none.
  const result = await signUp({ name: 'Owner', email, password: 'long-enough-password', workspaceName: name }, { addressProven: confirmed });
  if (!result.created) throw new Error('makeWorkspace: the fresh address had an account');
  return { slug: result.workspaceSlug, workspaceId: result.workspaceId, owner: { id: result.userId, email, name: 'Owner' } as SessionUser };
}

/** A new user who is a member of `slug` with `role`. */
export async function makeMember(slug: string, role: Role): Promise<SessionUser> {
  const db = await em();
  const email = `${role}-${uid()}@test.example`;
  const user = db.create(User, { email, name: role, passwordHash: await hashPassword('long-enough-password'), emailConfirmedAt: new Date() });
  await db.flush();
  const ws = await db.findOneOrFail(Workspace, { slug });
  db.create(Membership, { user, workspace: ws, role });
  await db.flush();
  return { id: user.id, email, name: role };
}

/** Calls a route handler the way Next.js does. */
export function callRoute<P extends Record<string, string>>(
  handler: (req: NextRequest, ctx: { params: Promise<P> }) => Promise<Response>,
  { method = 'GET', url = 'http://127.0.0.1/test', params, body, rawBody, headers }: { method?: string; url?: string; params: P; body?: unknown; rawBody?: string | Uint8Array; headers?: Record<string, string> },
) {
  const init: RequestInit = { method, headers: { 'content-type': 'application/json', ...headers } };
  if (rawBody !== undefined) init.body = rawBody as BodyInit;
  else if (body !== undefined) init.body = JSON.stringify(body);
  return handler(new NextRequest(url, init as ConstructorParameters<typeof NextRequest>[1]), { params: Promise.resolve(params) });
}
