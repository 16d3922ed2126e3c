import { beforeAll, describe, expect, it } from 'vitest';
import { GET, PATCH } from '@/app/api/w/[workspace]/route';
import { callRoute, makeMember, makeWorkspace, signInAs } from '../support/factories';

describe('workspace settings route: the guard in a route handler', () => {
  let ws: Awaited<ReturnType<typeof makeWorkspace>>;
  let other: Awaited<ReturnType<typeof makeWorkspace>>;
  beforeAll(async () => {
    ws = await makeWorkspace();
    other = await makeWorkspace();
  });
  const patch = (body: unknown) => callRoute(PATCH, { method: 'PATCH', params: { workspace: ws.slug }, body });

  it('signed out: 401 JSON', async () => {
    signInAs(null);
    const res = await callRoute(GET, { params: { workspace: ws.slug } });
    expect(res.status).toBe(401);
    expect((await res.json()).error.code).toBe('unauthenticated');
  });

  it('a member of another workspace gets 404, as if it did not exist', async () => {
    signInAs(other.owner);
    const res = await patch({ name: 'Taken over', retentionDays: 90 });
    expect(res.status).toBe(404);
    signInAs(ws.owner);
    expect((await (await callRoute(GET, { params: { workspace: ws.slug } })).json()).name).not.toBe('Taken over');
  });

  it('viewer and analyst may read but not change the settings (403)', async () => {
    for (const role of ['viewer', 'analyst'] as const) {
      signInAs(await makeMember(ws.slug, role));
      expect((await callRoute(GET, { params: { workspace: ws.slug } })).status).toBe(200);
      const res = await patch({ name: 'Changed', retentionDays: 90 });
      expect(res.status).toBe(403);
      expect((await res.json()).error.code).toBe('forbidden');
    }
  });

  it('malformed JSON is a 400, a bad field a 422 with the field named', async () => {
    signInAs(ws.owner);
    const bad = await callRoute(PATCH, { method: 'PATCH', params: { workspace: ws.slug }, rawBody: '{"name": ' });
    expect(bad.status).toBe(400);
    expect((await bad.json()).error.message).toMatch(/not valid JSON/);
    const invalid = await patch({ name: 'x', retentionDays: 5 });
    expect(invalid.status).toBe(422);
    const paths = (await invalid.json()).error.issues.map((i: { path: string }) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['name', 'retentionDays']));
  });

  it('the owner changes the settings', async () => {
    signInAs(ws.owner);
    const res = await patch({ name: 'Renamed team', retentionDays: 180 });
    expect(res.status).toBe(200);
    expect(await res.json()).toMatchObject({ name: 'Renamed team', retentionDays: 180 });
  });
});
