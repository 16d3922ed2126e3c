// Demo workspace and accounts for an invented scenario: "Harbourline Market", a fictional
// regional grocery and home-goods chain. No real company, person or data set.
import type { EntityManager } from '@mikro-orm/postgresql';
import { User } from '@/entities/user';
import { Workspace } from '@/entities/workspace';
import { Membership } from '@/entities/membership';
import { hashPassword } from '@/lib/server/team/passwords';
import { addWelcomeSeats } from '@/lib/server/billing/seat-ledger';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../lib/project.mjs';
import type { Role } from '@/lib/roles';

export const DEMO_WORKSPACE = { slug: 'harbourline', name: 'Harbourline Market — Pricing' };

export async function seedAccounts(db: EntityManager) {
  let workspace = await db.findOne(Workspace, { slug: DEMO_WORKSPACE.slug });
  if (!workspace) {
    workspace = db.create(Workspace, { slug: DEMO_WORKSPACE.slug, name: DEMO_WORKSPACE.name });
    await db.flush();
    await addWelcomeSeats(db, workspace.id);
  }
  const hash = await hashPassword(DEMO_PASSWORD);
  for (const a of DEMO_ACCOUNTS as { email: string; name: string; role: Role }[]) {
    let user = await db.findOne(User, { email: a.email });
    // Demo accounts count as confirmed: the workspace has its free seats already.
    user ??= db.create(User, { email: a.email, name: a.name, passwordHash: hash, emailConfirmedAt: new Date() });
    await db.flush();
    if (!(await db.count(Membership, { user, workspace }))) db.create(Membership, { user, workspace, role: a.role });
  }
  await db.flush();
  return workspace;
}
