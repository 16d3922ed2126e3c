import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startStandIns, mailsTo } from '../support/stand-ins';
import { linkFromMail } from '../support/mail-jobs';
import { completePasswordReset, requestPasswordReset, resetTokenUsable, RESET_ANSWER } from '@/lib/server/team/password-reset';
import { em } from '@/lib/server/db/orm';
import { User } from '@/entities/user';
import { PasswordReset } from '@/entities/password-reset';
import { verifyPassword } from '@/lib/server/team/passwords';
import { makeWorkspace, uid } from '../support/factories';

let stop: () => void;
beforeAll(async () => (stop = await startStandIns()));
afterAll(() => stop?.());

const tokenFromMail = (email: string, n = 1) => linkFromMail(email, 'reset', n);

describe('password reset', () => {
  it('gives the same answer for an unknown address and sends nothing', async () => {
    const ws = await makeWorkspace();
    const unknown = `nobody-${uid()}@test.example`;
    expect(await requestPasswordReset(unknown)).toBe(RESET_ANSWER);
    expect(await requestPasswordReset(ws.owner.email)).toBe(RESET_ANSWER);
    await linkFromMail(ws.owner.email, 'reset');
    expect(await mailsTo(unknown)).toEqual([]);
  });

  it('the link works once, sets the password and signs out other sessions (sessionVersion bumped)', async () => {
    const ws = await makeWorkspace();
    await requestPasswordReset(ws.owner.email);
    const token = await tokenFromMail(ws.owner.email);
    const db = await em();
    const before = (await db.findOneOrFail(User, { id: ws.owner.id })).sessionVersion;
    expect(await resetTokenUsable(token)).toBe(true);
    expect(await completePasswordReset(token, 'a-brand-new-password')).toEqual({ email: ws.owner.email });
    const after = await (await em()).findOneOrFail(User, { id: ws.owner.id });
    expect(after.sessionVersion).toBe(before + 1);
    expect(await verifyPassword('a-brand-new-password', after.passwordHash)).toBe(true);
    expect(await resetTokenUsable(token)).toBe(false);
    await expect(completePasswordReset(token, 'yet-another-password')).rejects.toMatchObject({ status: 410 });
    expect(await verifyPassword('a-brand-new-password', (await (await em()).findOneOrFail(User, { id: ws.owner.id })).passwordHash)).toBe(true);
  });

  it('an expired link is refused; two concurrent uses let one through', async () => {
    const ws = await makeWorkspace();
    await requestPasswordReset(ws.owner.email);
    const expired = await tokenFromMail(ws.owner.email);
    const db = await em();
    await db.nativeUpdate(PasswordReset, { user: ws.owner.id }, { expiresAt: new Date(Date.now() - 1000) });
    await expect(completePasswordReset(expired, 'a-brand-new-password')).rejects.toMatchObject({ status: 410 });
    await requestPasswordReset(ws.owner.email);
    const fresh = await tokenFromMail(ws.owner.email, 2);
    const results = await Promise.allSettled([completePasswordReset(fresh, 'first-new-password'), completePasswordReset(fresh, 'second-new-password')]);
    expect(results.filter((r) => r.status === 'fulfilled')).toHaveLength(1);
  });
});
