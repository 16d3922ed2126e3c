import 'server-only';
import { randomBytes } from 'node:crypto';
import { UniqueConstraintViolationException, type EntityManager } from '@mikro-orm/postgresql';
import { User } from '@/entities/user';
import { Workspace } from '@/entities/workspace';
import { Membership } from '@/entities/membership';
import { AuditEvent } from '@/entities/audit-event';
import type { SignUpInput } from '@/lib/schemas/auth.schema';
import { slugify } from '@/lib/slug';
import { em } from '@/lib/server/db/orm';
import { AppError } from '@/lib/server/http/errors';
import { hashPassword } from './passwords';
import { addWelcomeSeats } from '@/lib/server/billing/seat-ledger';

async function freeSlug(db: EntityManager, name: string): Promise<string> {
  const base = slugify(name);
  if (!(await db.count(Workspace, { slug: base }))) return base;
  return `${base}-${randomBytes(3).toString('hex')}`;
}

export const DUPLICATE_EMAIL = 'An account with this e-mail address already exists. Sign in instead.';

/** Sign-up: user, workspace, owner membership, welcome seats and audit, in one transaction. */
export async function signUp(input: SignUpInput): Promise<{ userId: string; workspaceSlug: string }> {
  const db = await em();
  const passwordHash = await hashPassword(input.password);
  try {
    return await db.transactional(async (tx) => {
      if (await tx.count(User, { email: input.email })) {
        throw new AppError(409, 'conflict', DUPLICATE_EMAIL, [{ path: 'email', message: DUPLICATE_EMAIL }]);
      }
      const user = tx.create(User, { email: input.email, name: input.name, passwordHash });
      const workspace = tx.create(Workspace, { slug: await freeSlug(tx, input.workspaceName), name: input.workspaceName });
      await tx.flush();
      tx.create(Membership, { workspace, user, role: 'owner' });
      await addWelcomeSeats(tx, workspace.id);
      tx.create(AuditEvent, { workspace, actor: user, action: 'workspace.created', target: workspace.name });
      await tx.flush();
      return { userId: user.id, workspaceSlug: workspace.slug };
    });
  } catch (err) {
    // Two sign-ups with one address at the same moment: the unique index decides.
    if (err instanceof UniqueConstraintViolationException && String(err.message).includes('email')) {
      throw new AppError(409, 'conflict', DUPLICATE_EMAIL, [{ path: 'email', message: DUPLICATE_EMAIL }]);
    }
    throw err;
  }
}
