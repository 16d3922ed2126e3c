import { describe, expect, it } from 'vitest';
import { GET as list } from '@/app/api/w/[workspace]/team/route';
import { PATCH, DELETE } from '@/app/api/w/[workspace]/team/[member]/route';
import { GET as audit } from '@/app/api/w/[workspace]/audit/route';
import { em } from '@/lib/server/db/orm';
import { Membership } from '@/entities/membership';
import { AuditEvent } from '@/entities/audit-event';
import { callRoute, makeMember, makeWorkspace, signInAs } from '../support/factories';
import type { SessionUser } from '@/lib/server/team/session';

async function membershipOf(slug: string, user: SessionUser) {
  const db = await em();
  return db.findOneOrFail(Membership, { workspace: { slug }, user: user.id });
}
const patch = (slug: string, member: string, role: string) => callRoute(PATCH, { method: 'PATCH', params: { workspace: slug, member }, body: { role } });
const remove = (slug: string, member: string) => callRoute(DELETE, { method: 'DELETE', params: { workspace: slug, member } });

describe('team: roles, removal and the last-owner rule', () => {
  it('every member reads the list; only an owner changes roles (403 otherwise, 404 for outsiders)', async () => {
    const ws = await makeWorkspace();
    const analyst = await makeMember(ws.slug, 'analyst');
    const viewer = await makeMember(ws.slug, 'viewer');
    signInAs(viewer);
    const body = await (await callRoute(list, { params: { workspace: ws.slug } })).json();
    expect(body.members.map((m: { email: string }) => m.email)).toEqual([ws.owner.email, analyst.email, viewer.email]);
    const target = (await membershipOf(ws.slug, viewer)).id;
    signInAs(analyst);
    expect((await patch(ws.slug, target, 'owner')).status).toBe(403);
    signInAs((await makeWorkspace()).owner);
    expect((await patch(ws.slug, target, 'owner')).status).toBe(404);
    signInAs(ws.owner);
    const ok = await patch(ws.slug, target, 'analyst');
    expect(ok.status).toBe(200);
    expect((await membershipOf(ws.slug, viewer)).role).toBe('analyst');
    expect((await patch(ws.slug, target, 'boss')).status).toBe(422);
  });

  it('the last owner can be neither demoted nor removed (409), another owner first makes it possible', async () => {
    const ws = await makeWorkspace();
    const own = (await membershipOf(ws.slug, ws.owner)).id;
    signInAs(ws.owner);
    const demote = await patch(ws.slug, own, 'analyst');
    expect(demote.status).toBe(409);
    expect((await demote.json()).error.message).toMatch(/at least one owner/);
    const rm = await remove(ws.slug, own);
    expect(rm.status).toBe(409);
    expect((await membershipOf(ws.slug, ws.owner)).role).toBe('owner');

    const second = await makeMember(ws.slug, 'owner');
    expect((await patch(ws.slug, own, 'analyst')).status).toBe(200);
    signInAs(second);
    expect((await remove(ws.slug, (await membershipOf(ws.slug, second)).id)).status).toBe(409);
    expect((await remove(ws.slug, own)).status).toBe(204);
    const db = await em();
    expect(await db.count(Membership, { workspace: { slug: ws.slug } })).toBe(1);
  });

  it('two owners demoted (or removed) at the same moment: exactly one succeeds, one owner remains', async () => {
    for (const kind of ['demote', 'remove', 'demote', 'remove'] as const) {
      const ws = await makeWorkspace();
      const second = await makeMember(ws.slug, 'owner');
      const a = (await membershipOf(ws.slug, ws.owner)).id;
      const b = (await membershipOf(ws.slug, second)).id;
      signInAs(ws.owner);
      const results = await Promise.all(kind === 'demote' ? [patch(ws.slug, a, 'viewer'), patch(ws.slug, b, 'analyst')] : [remove(ws.slug, a), remove(ws.slug, b)]);
      // Exactly one change goes through. The other is refused either by the last-owner rule (409)
      // or, when the caller's own membership was the one just changed, already by the guard:
      // a removed caller is no longer a member (404), a demoted one no longer an owner (403).
      const statuses = results.map((r) => r.status).sort();
      const ok = kind === 'demote' ? 200 : 204;
      expect(statuses.filter((s) => s === ok)).toHaveLength(1);
      expect([409, kind === 'demote' ? 403 : 404]).toContain(statuses.find((s) => s !== ok));
      const db = await em();
      expect(await db.count(Membership, { workspace: { slug: ws.slug }, role: 'owner' })).toBe(1);
    }
  });

  it('role changes and removals show in the audit trail, newest first, owner only', async () => {
    const ws = await makeWorkspace();
    const viewer = await makeMember(ws.slug, 'viewer');
    const m = (await membershipOf(ws.slug, viewer)).id;
    signInAs(ws.owner);
    await patch(ws.slug, m, 'analyst');
    await remove(ws.slug, m);
    const page = await (await callRoute(audit, { params: { workspace: ws.slug } })).json();
    expect(page.events.slice(0, 2).map((e: { action: string }) => e.action)).toEqual(['member.removed', 'member.role_changed']);
    expect(page.events[1]).toMatchObject({ target: viewer.email, actor: { email: ws.owner.email }, detail: { from: 'viewer', to: 'analyst' } });
    signInAs(await makeMember(ws.slug, 'analyst'));
    expect((await callRoute(audit, { params: { workspace: ws.slug } })).status).toBe(403);
  });

  it("the audit trail includes its members' sign-ins but not outsiders'", async () => {
    const ws = await makeWorkspace();
    const outsider = (await makeWorkspace()).owner;
    const db = await em();
    db.create(AuditEvent, { workspace: null, actor: ws.owner.id, action: 'auth.sign_in', target: ws.owner.email });
    db.create(AuditEvent, { workspace: null, actor: outsider.id, action: 'auth.sign_in', target: outsider.email });
    await db.flush();
    signInAs(ws.owner);
    const page = await (await callRoute(audit, { params: { workspace: ws.slug } })).json();
    const signIns = page.events.filter((e: { action: string }) => e.action === 'auth.sign_in');
    expect(signIns.map((e: { target: string }) => e.target)).toEqual([ws.owner.email]);
  });
});
