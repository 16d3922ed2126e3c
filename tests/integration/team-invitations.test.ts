import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startStandIns, waitForMail } from '../support/stand-ins';
import { GET as pending, POST as invite } from '@/app/api/w/[workspace]/invitations/route';
import { DELETE as revoke } from '@/app/api/w/[workspace]/invitations/[invitation]/route';
import { acceptInvitation, describeInvitation, signUpWithInvitation } from '@/lib/server/team/invitations';
import { em } from '@/lib/server/db/orm';
import { Invitation } from '@/entities/invitation';
import { Membership } from '@/entities/membership';
import { AuditEvent } from '@/entities/audit-event';
import { hashToken } from '@/lib/server/platform/tokens';
import { callRoute, makeMember, makeWorkspace, signInAs, uid } from '../support/factories';

let stop: () => void;
beforeAll(async () => (stop = await startStandIns()));
afterAll(() => stop?.());

type Ws = Awaited<ReturnType<typeof makeWorkspace>>;

/** Invites through the route, then reads the token out of the e-mail maildev caught. */
async function inviteByMail(ws: Ws, email: string, role = 'analyst') {
  signInAs(ws.owner);
  const res = await callRoute(invite, { method: 'POST', params: { workspace: ws.slug }, body: { email, role } });
  expect(res.status).toBe(201);
  const mails = await waitForMail(email);
  const link = mails.at(-1)!.text.match(/\/invite\/([\w-]+)/);
  expect(link).not.toBeNull();
  return { token: link![1], id: (await res.json()).id as string };
}

describe('invitations', () => {
  it('the e-mail holds a link whose token is stored only as its SHA-256 hash, expiring in 7 days', async () => {
    const ws = await makeWorkspace();
    const email = `new-${uid()}@test.example`;
    const { token, id } = await inviteByMail(ws, email);
    const db = await em();
    const inv = await db.findOneOrFail(Invitation, { id });
    expect(inv.tokenHash).toBe(hashToken(token));
    expect(inv.tokenHash).not.toContain(token);
    expect(Math.round((inv.expiresAt.getTime() - Date.now()) / 864e5)).toBe(7);
    const [mail] = await waitForMail(email);
    expect(mail.subject).toBe('An invitation to a workspace on Notchwise');
    expect(mail.text).toMatch(/The workspace is named «Test \w+»/);
    expect(mail.html).toContain(`/invite/${token}`);
    signInAs(ws.owner);
    const list = await (await callRoute(pending, { params: { workspace: ws.slug } })).json();
    expect(list.invitations.map((i: { email: string }) => i.email)).toEqual([email]);
  });

  it('signs up through the link once; a second use is refused and creates nothing', async () => {
    const ws = await makeWorkspace();
    const email = `join-${uid()}@test.example`;
    const { token } = await inviteByMail(ws, email, 'analyst');
    expect((await describeInvitation(token)).state).toBe('valid');
    const joined = await signUpWithInvitation(token, { name: 'Noor Elst', password: 'long-enough-password' });
    expect(joined).toMatchObject({ workspaceSlug: ws.slug, role: 'analyst', email });
    const db = await em();
    const m = await db.findOneOrFail(Membership, { workspace: { slug: ws.slug }, user: { email } });
    expect(m.role).toBe('analyst');
    expect(await db.count(AuditEvent, { workspace: m.workspace, action: 'member.joined', target: email })).toBe(1);
    expect((await describeInvitation(token)).state).toBe('used');
    await expect(signUpWithInvitation(token, { name: 'Again', password: 'long-enough-password' })).rejects.toMatchObject({ status: 410 });
    await expect(acceptInvitation(token, { id: m.user.id, email, name: 'Noor' })).rejects.toMatchObject({ status: 410, message: expect.stringMatching(/already been used/) });
  });

  it('an existing account accepts while signed in, exactly once even when two tabs accept at the same moment', async () => {
    const ws = await makeWorkspace();
    const other = await makeWorkspace();
    const person = await makeMember(other.slug, 'viewer');
    const { token } = await inviteByMail(ws, person.email, 'viewer');
    const results = await Promise.allSettled([acceptInvitation(token, person), acceptInvitation(token, person), acceptInvitation(token, person)]);
    expect(results.filter((r) => r.status === 'fulfilled')).toHaveLength(1);
    const db = await em();
    expect(await db.count(Membership, { workspace: { slug: ws.slug }, user: person.id })).toBe(1);
  });

  it('someone signed in with another address cannot use it (and it stays usable)', async () => {
    const ws = await makeWorkspace();
    const { token } = await inviteByMail(ws, `meant-${uid()}@test.example`);
    const stranger = await makeMember((await makeWorkspace()).slug, 'viewer');
    await expect(acceptInvitation(token, stranger)).rejects.toMatchObject({ status: 403 });
    expect((await describeInvitation(token)).state).toBe('valid');
  });

  it('an expired invitation is refused', async () => {
    const ws = await makeWorkspace();
    const email = `late-${uid()}@test.example`;
    const { token, id } = await inviteByMail(ws, email);
    const db = await em();
    await db.nativeUpdate(Invitation, { id }, { expiresAt: new Date(Date.now() - 1000) });
    expect((await describeInvitation(token)).state).toBe('expired');
    await expect(signUpWithInvitation(token, { name: 'Late', password: 'long-enough-password' })).rejects.toMatchObject({ status: 410, message: expect.stringMatching(/expired/) });
    expect(await db.count(Membership, { user: { email } })).toBe(0);
  });

  it('a revoked invitation is refused; only owners revoke; a foreign id is 404', async () => {
    const ws = await makeWorkspace();
    const email = `gone-${uid()}@test.example`;
    const { token, id } = await inviteByMail(ws, email);
    signInAs(await makeMember(ws.slug, 'analyst'));
    expect((await callRoute(revoke, { method: 'DELETE', params: { workspace: ws.slug, invitation: id } })).status).toBe(403);
    const other = await makeWorkspace();
    signInAs(other.owner);
    expect((await callRoute(revoke, { method: 'DELETE', params: { workspace: other.slug, invitation: id } })).status).toBe(404);
    signInAs(ws.owner);
    expect((await callRoute(revoke, { method: 'DELETE', params: { workspace: ws.slug, invitation: id } })).status).toBe(204);
    expect((await describeInvitation(token)).state).toBe('revoked');
    await expect(signUpWithInvitation(token, { name: 'Gone', password: 'long-enough-password' })).rejects.toMatchObject({ status: 410, message: expect.stringMatching(/withdrawn/) });
    const list = await (await callRoute(pending, { params: { workspace: ws.slug } })).json();
    expect(list.invitations).toEqual([]);
  });

  it('inviting a current member is a 409 on the e-mail field; bad input 422; non-owners 403', async () => {
    const ws = await makeWorkspace();
    signInAs(ws.owner);
    const dup = await callRoute(invite, { method: 'POST', params: { workspace: ws.slug }, body: { email: ws.owner.email, role: 'viewer' } });
    expect(dup.status).toBe(409);
    expect((await dup.json()).error.issues[0].path).toBe('email');
    const bad = await callRoute(invite, { method: 'POST', params: { workspace: ws.slug }, body: { email: 'nope', role: 'chief' } });
    expect(bad.status).toBe(422);
    signInAs(await makeMember(ws.slug, 'viewer'));
    expect((await callRoute(invite, { method: 'POST', params: { workspace: ws.slug }, body: { email: `x-${uid()}@test.example`, role: 'viewer' } })).status).toBe(403);
  });
});
