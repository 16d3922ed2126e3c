import { describe, expect, it } from 'vitest';
import { em } from '@/lib/server/db/orm';
import { signUp } from '@/lib/server/team/accounts';
import { seatBalance, WELCOME_SEATS } from '@/lib/server/billing/seat-ledger';
import { User } from '@/entities/user';
import { Workspace } from '@/entities/workspace';
import { Membership } from '@/entities/membership';
import { AppError } from '@/lib/server/http/errors';
import { uid } from '../support/factories';

const input = (email: string) => ({ name: 'Ada Analyst', email, password: 'long-enough-password', workspaceName: `Pricing ${uid()}` });

describe('sign-up', () => {
  it('creates the user, the workspace, the owner membership and the welcome seats', async () => {
    const email = `new-${uid()}@test.example`;
    const { userId, workspaceSlug } = await signUp(input(email));
    const db = await em();
    const user = await db.findOneOrFail(User, { id: userId });
    expect(user.email).toBe(email);
    expect(user.passwordHash).not.toContain('long-enough');
    const ws = await db.findOneOrFail(Workspace, { slug: workspaceSlug });
    const m = await db.findOneOrFail(Membership, { user: userId, workspace: ws });
    expect(m.role).toBe('owner');
    expect(await seatBalance(db, ws.id)).toBe(WELCOME_SEATS);
  });

  it('refuses a duplicate e-mail and writes nothing for it', async () => {
    const email = `dup-${uid()}@test.example`;
    await signUp(input(email));
    const db = await em();
    const before = await db.count(Workspace, {});
    await expect(signUp(input(email))).rejects.toMatchObject({ status: 409, issues: [{ path: 'email' }] });
    expect(await db.count(Workspace, {})).toBe(before);
  });

  it('two sign-ups with one address at the same moment: one account, no orphan workspace', async () => {
    const email = `race-${uid()}@test.example`;
    const db = await em();
    const before = await db.count(Workspace, {});
    const results = await Promise.allSettled([signUp(input(email)), signUp(input(email)), signUp(input(email))]);
    expect(results.filter((r) => r.status === 'fulfilled')).toHaveLength(1);
    for (const r of results) if (r.status === 'rejected') expect(r.reason).toBeInstanceOf(AppError);
    expect(await db.count(User, { email })).toBe(1);
    expect(await db.count(Workspace, {})).toBe(before + 1);
  });
});
