import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { startStandIns, mailsTo } from '../support/stand-ins';

// Server actions read the client address from next/headers: one socket address for this file.
vi.mock('next/headers', async () => {
  const { PEER_HEADER, peerStamp } = await import('@/lib/peer-stamp');
  return {
    headers: async () => new Headers({ [PEER_HEADER]: peerStamp(`10.31.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250)}`) }),
    cookies: async () => ({ get: () => undefined, getAll: () => [], has: () => false, set: () => undefined, delete: () => undefined }),
  };
});

import { em } from '@/lib/server/db/orm';
import { signUp } from '@/lib/server/team/accounts';
import { confirmEmail, markEmailConfirmed } from '@/lib/server/team/email-confirmation';
import { resendConfirmation } from '@/lib/server/team/email-confirmation';
import { seatBalance, WELCOME_SEATS } from '@/lib/server/billing/seat-ledger';
import { signUpAction } from '@/app/(auth)/actions';
import { User } from '@/entities/user';
import { Workspace } from '@/entities/workspace';
import { Membership } from '@/entities/membership';
import { uid } from '../support/factories';
import { deliverAndWait, linkFromMail } from '../support/mail-jobs';

let stop: () => void;
beforeAll(async () => (stop = await startStandIns()));
afterAll(() => stop?.());

const input = (email: string) => ({ name: 'Ada Analyst', email, password: 'long-enough-password', workspaceName: `Pricing ${uid()}` });

describe('sign-up', () => {
  it('creates the user, the workspace and the owner membership; no free seats until the address is confirmed', async () => {
    const email = `new-${uid()}@test.example`;
    const r = await signUp(input(email));
    if (!r.created) throw new Error('expected a new account');
    const db = await em();
    const user = await db.findOneOrFail(User, { id: r.userId });
    expect(user.email).toBe(email);
    expect(user.passwordHash).not.toContain('long-enough');
    expect(user.emailConfirmedAt).toBeNull();
    const ws = await db.findOneOrFail(Workspace, { slug: r.workspaceSlug });
    expect((await db.findOneOrFail(Membership, { user: r.userId, workspace: ws })).role).toBe('owner');
    // Issue 13, finding 1: 24 sign-ups made 600 free seats with no address verified.
    expect(await seatBalance(db, ws.id)).toBe(0);

    const token = await linkFromMail(email, 'confirm');
    expect(await confirmEmail(token)).toEqual({ email });
    expect(await seatBalance(await em(), ws.id)).toBe(WELCOME_SEATS);
    const confirmed = await (await em()).findOneOrFail(User, { id: r.userId }, { refresh: true });
    expect(confirmed.emailConfirmedAt).toBeInstanceOf(Date);
  });

  it('the seats are granted exactly once: the same link twice, a second link, a retried confirmation, all at once', async () => {
    const email = `once-${uid()}@test.example`;
    const r = await signUp(input(email));
    if (!r.created) throw new Error('expected a new account');
    const first = await linkFromMail(email, 'confirm');
    await resendConfirmation(r.userId);
    const second = await linkFromMail(email, 'confirm', 2);
    expect(second).not.toBe(first);
    await Promise.all([confirmEmail(first), confirmEmail(first), confirmEmail(second)]);
    await (await em()).transactional((tx) => markEmailConfirmed(tx, r.userId));
    expect(await seatBalance(await em(), r.workspaceId)).toBe(WELCOME_SEATS);
    // A confirmed account gets no further link.
    await resendConfirmation(r.userId);
    await deliverAndWait(email, 3, 1500);
    expect((await mailsTo(email)).length).toBe(2);
  });

  it('an unknown or expired link is refused with 410 and grants nothing', async () => {
    await expect(confirmEmail('not-a-real-token')).rejects.toMatchObject({ status: 410 });
    const email = `late-${uid()}@test.example`;
    const r = await signUp(input(email));
    if (!r.created) throw new Error('expected a new account');
    const token = await linkFromMail(email, 'confirm');
    await (await em()).execute("update email_confirmation set expires_at = now() - interval '1 second' where user_id = ?", [r.userId]);
    await expect(confirmEmail(token)).rejects.toMatchObject({ status: 410 });
    expect(await seatBalance(await em(), r.workspaceId)).toBe(0);
  });

  it('an existing address: the same answer as a new one, nothing written, and its owner is told by e-mail', async () => {
    // Issue 13, finding 7: sign-up said "already exists".
    const email = `dup-${uid()}@test.example`;
    const fresh = await signUpAction(input(email));
    const db = await em();
    const before = await db.count(Workspace, {});
    const again = await signUpAction(input(email));
    expect(fresh).toEqual({ ok: true, data: { message: expect.stringContaining('Check your e-mail') } });
    expect(again).toEqual(fresh);
    expect(await db.count(Workspace, {})).toBe(before);
    expect(await db.count(User, { email })).toBe(1);
    const mails = await deliverAndWait(email, 2);
    expect(mails.map((m) => m.subject).sort()).toEqual(['A sign-up with your Notchwise address', 'Confirm your e-mail address for Notchwise']);
  });

  it('two sign-ups with one address at the same moment: one account, no orphan workspace, neither refused', async () => {
    const email = `race-${uid()}@test.example`;
    const db = await em();
    const before = await db.count(Workspace, {});
    const results = await Promise.all([signUp(input(email)), signUp(input(email)), signUp(input(email))]);
    expect(results.filter((r) => r.created)).toHaveLength(1);
    expect(await db.count(User, { email })).toBe(1);
    expect(await db.count(Workspace, {})).toBe(before + 1);
  });
});
