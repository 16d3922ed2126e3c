import { beforeAll, describe, expect, it } from 'vitest';
import { GET as list, POST as create } from '@/app/api/w/[workspace]/tokens/route';
import { DELETE as revoke } from '@/app/api/w/[workspace]/tokens/[token]/route';
import { GET as v1Studies } from '@/app/api/v1/studies/route';
import { GET as v1File } from '@/app/api/v1/studies/[study]/[file]/route';
import { em } from '@/lib/server/db/orm';
import { callRoute, makeMember, makeWorkspace, signInAs } from '../support/factories';
import { fitNow, makeSimulatedStudy } from '../support/studies';

describe('export API with personal access tokens', () => {
  let a: Awaited<ReturnType<typeof makeWorkspace>>;
  let b: Awaited<ReturnType<typeof makeWorkspace>>;
  let studyA: string, studyB: string;
  beforeAll(async () => {
    a = await makeWorkspace();
    b = await makeWorkspace();
    ({ studyId: studyA } = await makeSimulatedStudy(a.slug, { sim: { respondents: 30 } }));
    ({ studyId: studyB } = await makeSimulatedStudy(b.slug, { sim: { respondents: 30 } }));
    await fitNow(studyA);
  });
  const bearer = (t: string) => ({ authorization: `Bearer ${t}` });

  it('analysts create tokens (shown once, stored hashed); viewers may not', async () => {
    signInAs(await makeMember(a.slug, 'viewer'));
    expect((await callRoute(create, { method: 'POST', params: { workspace: a.slug }, body: { name: 'notebook' } })).status).toBe(403);
    const analyst = await makeMember(a.slug, 'analyst');
    signInAs(analyst);
    const res = await callRoute(create, { method: 'POST', params: { workspace: a.slug }, body: { name: 'notebook' } });
    expect(res.status).toBe(201);
    const t = await res.json();
    expect(t.token).toMatch(/^nw_/);
    expect(t.token.startsWith(t.prefix)).toBe(true);
    const rows = await (await em()).execute<{ token_hash: string }[]>('select token_hash from api_token where id = ?', [t.id]);
    expect(rows[0].token_hash).toHaveLength(64);
    expect(rows[0].token_hash).not.toContain(t.token);
    const listed = await (await callRoute(list, { params: { workspace: a.slug } })).json();
    expect(listed).toHaveLength(1);
    expect(JSON.stringify(listed)).not.toContain(t.token);
  });

  it('a token reads its own workspace only, and stops once revoked', async () => {
    const analyst = await makeMember(a.slug, 'analyst');
    signInAs(analyst);
    const t = await (await callRoute(create, { method: 'POST', params: { workspace: a.slug }, body: { name: 'pipeline' } })).json();
    signInAs(null);
    expect((await callRoute(v1Studies, { params: {} })).status).toBe(401);
    expect((await callRoute(v1Studies, { params: {}, headers: bearer('nw_not-a-real-token') })).status).toBe(401);
    const studies = await (await callRoute(v1Studies, { params: {}, headers: bearer(t.token) })).json();
    expect(studies.studies.map((s: { id: string }) => s.id)).toEqual([studyA]);
    const csv = await callRoute(v1File, { params: { study: studyA, file: 'thresholds.csv' }, headers: bearer(t.token) });
    expect(csv.status).toBe(200);
    expect((await csv.text()).split('\r\n')[0]).toContain('Notice threshold (% of base price)');
    expect((await callRoute(v1File, { params: { study: studyA, file: 'trials.csv' }, headers: bearer(t.token) })).status).toBe(200);
    expect((await callRoute(v1File, { params: { study: studyA, file: 'report.json' }, headers: bearer(t.token) })).status).toBe(200);
    // Workspace B's study does not exist for workspace A's token.
    expect((await callRoute(v1File, { params: { study: studyB, file: 'thresholds.json' }, headers: bearer(t.token) })).status).toBe(404);
    signInAs(analyst);
    expect((await callRoute(revoke, { method: 'DELETE', params: { workspace: a.slug, token: t.id } })).status).toBe(200);
    signInAs(null);
    expect((await callRoute(v1File, { params: { study: studyA, file: 'thresholds.csv' }, headers: bearer(t.token) })).status).toBe(401);
  });

  it('a member of another workspace cannot revoke the token (404)', async () => {
    const analyst = await makeMember(a.slug, 'analyst');
    signInAs(analyst);
    const t = await (await callRoute(create, { method: 'POST', params: { workspace: a.slug }, body: { name: 'kept' } })).json();
    signInAs(b.owner);
    expect((await callRoute(revoke, { method: 'DELETE', params: { workspace: b.slug, token: t.id } })).status).toBe(404);
  });
});
