import { beforeAll, describe, expect, it } from 'vitest';
import { GET as listGET, POST as createPOST } from '@/app/api/w/[workspace]/studies/route';
import { GET as oneGET, PATCH as onePATCH, DELETE as oneDELETE } from '@/app/api/w/[workspace]/studies/[study]/route';
import { em } from '@/lib/server/db/orm';
import { Study } from '@/entities/study';
import { callRoute, makeMember, makeWorkspace, signInAs } from '../support/factories';
import { validDesign } from '../support/study-fixtures';
import { sql } from '@/lib/server/db/sql';

type Issue = { path: string; message: string };

describe('building a study: POST/PATCH validate with the shared design schema', () => {
  let ws: Awaited<ReturnType<typeof makeWorkspace>>;
  beforeAll(async () => {
    ws = await makeWorkspace();
    signInAs(await makeMember(ws.slug, 'analyst'));
  });
  const create = (body: unknown) => callRoute(createPOST, { method: 'POST', params: { workspace: ws.slug }, body });
  const countStudies = async () => (await em()).count(Study, { workspace: { slug: ws.slug } });

  it('stores a valid design, sorted, with the name mirrored on the study', async () => {
    const res = await create(validDesign());
    expect(res.status).toBe(201);
    const s = await res.json();
    expect(s).toMatchObject({ name: 'Olive oil thresholds', state: 'draft' });
    expect(s.design.basePrices).toEqual([2.49, 9.99, 49]);
    expect(s.design.ladder).toEqual([0.02, 0.05, 0.1, 0.2]);
    const got = await (await callRoute(oneGET, { params: { workspace: ws.slug, study: s.id } })).json();
    expect(got.design.itemName).toBe('Extra virgin olive oil, 1 l');
    const list = await (await callRoute(listGET, { params: { workspace: ws.slug } })).json();
    expect(list.studies.map((x: { id: string }) => x.id)).toContain(s.id);
  });

  const bad: [string, Record<string, unknown>, string][] = [
    ['a base price of zero', { basePrices: [0, 9.99] }, 'basePrices.0'],
    ['a negative base price', { basePrices: [-2, 9.99] }, 'basePrices.0'],
    ['a duplicated base price', { basePrices: [9.99, 9.99] }, 'basePrices'],
    ['a rung of 0 %', { ladder: [0, 0.1] }, 'ladder.0'],
    ['a rung of 100 %', { ladder: [0.1, 1] }, 'ladder.1'],
    ['a rung above 100 %', { ladder: [0.1, 1.5] }, 'ladder.1'],
    ['six segment questions', { segmentQuestions: Array.from({ length: 6 }, (_, i) => ({ id: `q${i}`, text: 'How often?', options: ['Often', 'Rarely'] })) }, 'segmentQuestions'],
  ];
  it.each(bad)('refuses %s with 422 naming the field, storing nothing', async (_label, over, path) => {
    const before = await countStudies();
    const res = await create(validDesign(over as never));
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.error.code).toBe('validation_failed');
    expect(body.error.issues.map((i: Issue) => i.path)).toContain(path);
    expect(await countStudies()).toBe(before);
  });

  it('reports several bad fields at once', async () => {
    const res = await create(validDesign({ name: 'x', basePrices: [], ladder: [0.5] }));
    const paths = (await res.json()).error.issues.map((i: Issue) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['name', 'basePrices', 'ladder']));
  });

  it('a picture id from no upload of this workspace is refused', async () => {
    const res = await create(validDesign({ itemPictureId: '00000000-0000-4000-8000-000000000000' }));
    expect(res.status).toBe(422);
    expect((await res.json()).error.issues[0].path).toBe('itemPictureId');
  });

  it('a draft can be edited and deleted', async () => {
    const s = await (await create(validDesign())).json();
    const res = await callRoute(onePATCH, { method: 'PATCH', params: { workspace: ws.slug, study: s.id }, body: validDesign({ name: 'Olive oil, second try', repetitions: 5 }) });
    expect(res.status).toBe(200);
    const updated = await res.json();
    expect(updated).toMatchObject({ name: 'Olive oil, second try', design: { repetitions: 5, name: 'Olive oil, second try' } });
    const badPatch = await callRoute(onePATCH, { method: 'PATCH', params: { workspace: ws.slug, study: s.id }, body: validDesign({ basePrices: [0] }) });
    expect(badPatch.status).toBe(422);
    expect((await (await callRoute(oneGET, { params: { workspace: ws.slug, study: s.id } })).json()).design.repetitions).toBe(5);
    expect((await callRoute(oneDELETE, { method: 'DELETE', params: { workspace: ws.slug, study: s.id } })).status).toBe(204);
    expect((await callRoute(oneGET, { params: { workspace: ws.slug, study: s.id } })).status).toBe(404);
  });

  it('a stored design without the fields that have defaults reads with them filled in; a damaged one is our error (500), not the caller’s', async () => {
    const s = await (await create(validDesign({ locale: 'de-DE', viewMs: 2000 }))).json();
    const db = await em();
    await sql(db, `update study set design = design - 'locale' - 'viewMs' - 'shelfSize' - 'redirectUrl' - 'itemPictureId' where id = ?`, [s.id]);
    const got = await (await callRoute(oneGET, { params: { workspace: ws.slug, study: s.id } })).json();
    expect(got.design).toMatchObject({ locale: 'en-GB', viewMs: 1200, shelfSize: 6, redirectUrl: '', itemPictureId: null, itemName: 'Extra virgin olive oil, 1 l' });
    await sql(db, `update study set design = jsonb_set(design, '{task}', '"guess"') where id = ?`, [s.id]);
    const damaged = await callRoute(oneGET, { params: { workspace: ws.slug, study: s.id } });
    expect(damaged.status).toBe(500);
    expect((await damaged.json()).error.code).toBe('internal');
  });

  it('a malformed study id is a 404, not a database error', async () => {
    expect((await callRoute(oneGET, { params: { workspace: ws.slug, study: 'not-a-uuid' } })).status).toBe(404);
  });
});
