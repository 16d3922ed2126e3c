import 'server-only';
// Opening an account: a new user who owns a new workspace. Nothing here tells a caller whether
// an address has an account (see signUp). Tests: tests/integration/sign-up.test.ts.
import { randomBytes } from 'node:crypto';
import { UniqueConstraintViolationException, type EntityManager } from '@mikro-orm/postgresql';
import { User } from '@/entities/user';
import { Workspace } from '@/entities/workspace';
import { Membership } from '@/entities/membership';
import { AuditEvent } from '@/entities/audit-event';
import type { SignUpInput } from '@/lib/schemas/auth.schema';
import { slugify } from '@/lib/slug';
import { em } from '@/lib/server/db/orm';
import { hashPassword } from './passwords';
import { queueAccountMail } from './account-mail';
import { markEmailConfirmed } from './email-confirmation';

async function freeSlug(db: EntityManager, name: string): Promise<string> {
  const base = slugify(name);
  if (!(await db.count(Workspace, { slug: base }))) return base;
  return `${base}-${randomBytes(3).toString('hex')}`;
}

/** The one answer to a sign-up, whether or not the address has an account already. */
export const SIGN_UP_ANSWER = (email: string) =>
  `Check your e-mail: we sent a message to ${email}. Follow its link to confirm the address, then sign in. If the address has an account already, the message says so.`;

export type SignUpResult = { created: true; userId: string; workspaceSlug: string; workspaceId: string } | { created: false };

/**
 * Sign-up: user, workspace, owner membership and audit in one transaction; the free seats wait
 * for the address to be confirmed (./email-confirmation.ts). An address that has an account
 * gets no second one and no different answer: the caller shows SIGN_UP_ANSWER either way, and
 * the mailbox is told what happened (a confirmation link, or "someone tried to sign up with
 * your address"). The password is hashed in both cases, so timing tells nothing either.
 * `addressProven` is for callers that proved the mailbox another way (test factories, tools):
 * the account is confirmed, with its seats, in the same transaction and no link is mailed.
 */
export async function signUp(input: SignUpInput, opts: { addressProven?: boolean } = {}): Promise<SignUpResult> {
  const db = await em();
  const passwordHash = await hashPassword(input.password);
  let result: SignUpResult;
  try {
    result = await db.transactional(async (tx): Promise<SignUpResult> => {
      if (await tx.count(User, { email: input.email })) return { created: false };
      const workspace = tx.create(Workspace, { slug: await freeSlug(tx, input.workspaceName), name: input.workspaceName });
      await tx.flush();
      const user = tx.create(User, { email: input.email, name: input.name, passwordHash, welcomeWorkspaceId: workspace.id });
      await tx.flush();
      tx.create(Membership, { workspace, user, role: 'owner' });
      tx.create(AuditEvent, { workspace, actor: user, action: 'workspace.created', target: workspace.name });
      await tx.flush();
      if (opts.addressProven) await markEmailConfirmed(tx, user.id);
      return { created: true, userId: user.id, workspaceSlug: workspace.slug, workspaceId: workspace.id };
    });
  } catch (err) {
    // Two sign-ups with one address at the same moment: the unique index decides.
    if (!(err instanceof UniqueConstraintViolationException && String(err.message).includes('email'))) throw err;
    result = { created: false };
  }
  if (!result.created) await queueAccountMail({ mail: 'sign-up-attempt', email: input.email });
  else if (!opts.addressProven) await queueAccountMail({ mail: 'confirm', userId: result.userId });
  return result;
}
