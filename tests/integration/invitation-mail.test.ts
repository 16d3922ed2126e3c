import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startStandIns, waitForMail } from '../support/stand-ins';
import { POST as invite } from '@/app/api/w/[workspace]/invitations/route';
import { em } from '@/lib/server/db/orm';
import { Workspace } from '@/entities/workspace';
import { User } from '@/entities/user';
import { callRoute, makeMember, makeWorkspace, signInAs, uid } from '../support/factories';
import type { SessionUser } from '@/lib/server/team/session';

// Issue 13, finding 9: invitations had no rate limit and carried attacker-chosen workspace and
// display names into the subject and body, reading like the app's own words.

let stop: () => void;
beforeAll(async () => (stop = await startStandIns()));
afterAll(() => stop?.());

const send = (slug: string, as: SessionUser, email = `inv-${uid()}@test.example`) => {
  signInAs(as);
  return callRoute(invite, { method: 'POST', params: { workspace: slug }, body: { email, role: 'viewer' } });
};

describe('invitation e-mails', () => {
  it('names typed by users appear only quoted, on one line, with no link, inside our own sentence; never in the subject', async () => {
    const ws = await makeWorkspace();
    const db = await em();
    const lure = 'Acme\n\nYour Notchwise account is suspended. Verify now at https://evil.example/login';
    await db.nativeUpdate(Workspace, { slug: ws.slug }, { name: lure });
    await db.nativeUpdate(User, { id: ws.owner.id }, { name: 'Notchwise Security Team\r\nsupport@evil.example' });
    const email = `lure-${uid()}@test.example`;
    const owner = { ...ws.owner, name: 'Notchwise Security Team\r\nsupport@evil.example' };
    expect((await send(ws.slug, owner, email)).status).toBe(201);
    const [mail] = await waitForMail(email);
    expect(mail.subject).toBe('An invitation to a workspace on Notchwise');
    expect(mail.subject).not.toMatch(/Acme|evil/);
    expect(mail.text).not.toContain('https://evil.example');
    expect(mail.text).not.toContain('evil.example');
    expect(mail.html).not.toMatch(/href="https:\/\/evil/);
    // The lure sits inside one paragraph of ours, in guillemets, flattened to one line.
    const paragraph = mail.text.split('\n\n').find((p) => p.includes('suspended'))!;
    expect(paragraph).toMatch(/^The workspace is named «Acme Your Notchwise account is suspended\. Verify now at hxxps\[:\]\/\/evil\[\.\]example\/login» and the person who sent the invitation gave their name as «Notchwise Security Team support\[at\]evil\[\.\]example»\. Both names were typed by users of Notchwise, not by us/);
  });

  it('one sender may send 20 invitations an hour; the 21st is a 429 with Retry-After, another owner still may', async () => {
    const ws = await makeWorkspace();
    for (let i = 0; i < 20; i++) expect((await send(ws.slug, ws.owner)).status).toBe(201);
    const res = await send(ws.slug, ws.owner);
    expect(res.status).toBe(429);
    expect(Number(res.headers.get('retry-after'))).toBeGreaterThan(0);
    expect((await res.json()).error.message).toMatch(/You have sent many invitations in the last hour/);
    const other = await makeMember(ws.slug, 'owner');
    expect((await send(ws.slug, other)).status).toBe(201);
  }, 120_000);

  it('one workspace may send 50 a day, whoever its owners are; then 429', async () => {
    const ws = await makeWorkspace();
    const owners = [ws.owner, await makeMember(ws.slug, 'owner'), await makeMember(ws.slug, 'owner')];
    for (let i = 0; i < 50; i++) expect((await send(ws.slug, owners[Math.floor(i / 20)])).status).toBe(201);
    const fourth = await makeMember(ws.slug, 'owner');
    const res = await send(ws.slug, fourth);
    expect(res.status).toBe(429);
    expect((await res.json()).error.message).toMatch(/This workspace has sent many invitations today/);
    const elsewhere = await makeWorkspace();
    expect((await send(elsewhere.slug, elsewhere.owner)).status).toBe(201);
  }, 180_000);
});
