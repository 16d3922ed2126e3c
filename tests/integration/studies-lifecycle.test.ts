import { beforeAll, describe, expect, it } from 'vitest';
import { POST as createPOST } from '@/app/api/w/[workspace]/studies/route';
import { GET as oneGET, PATCH as onePATCH, DELETE as oneDELETE } from '@/app/api/w/[workspace]/studies/[study]/route';
import { POST as statePOST } from '@/app/api/w/[workspace]/studies/[study]/state/route';
import { POST as dupPOST } from '@/app/api/w/[workspace]/studies/[study]/duplicate/route';
import { POST as importNew } from '@/app/api/w/[workspace]/imports/route';
import { em } from '@/lib/server/db/orm';
import { AuditEvent } from '@/entities/audit-event';
import { callRoute, makeMember, makeWorkspace, signInAs } from '../support/factories';
import { validDesign } from '../support/study-fixtures';
import { multipart } from '../support/studies';

describe('launching, freezing, pausing, closing and duplicating a study', () => {
  let ws: Awaited<ReturnType<typeof makeWorkspace>>;
  beforeAll(async () => {
    ws = await makeWorkspace();
    signInAs(await makeMember(ws.slug, 'analyst'));
  });
  const p = (study: string) => ({ workspace: ws.slug, study });
  const newStudy = async () => (await (await callRoute(createPOST, { method: 'POST', params: { workspace: ws.slug }, body: validDesign() })).json()).id as string;
  const act = (study: string, action: string) => callRoute(statePOST, { method: 'POST', params: p(study), body: { action } });
  const read = async (study: string) => (await callRoute(oneGET, { params: p(study) })).json();

  it('launch records launchedAt and an audit event "study.launched"', async () => {
    const id = await newStudy();
    const res = await act(id, 'launch');
    expect(res.status).toBe(200);
    const s = await res.json();
    expect(s.state).toBe('live');
    expect(Date.parse(s.launchedAt)).toBeGreaterThan(Date.now() - 60_000);
    const events = await (await em()).find(AuditEvent, { workspace: { slug: ws.slug }, action: 'study.launched' });
    expect(events.map((e) => (e.detail as { studyId: string }).studyId)).toContain(id);
  });

  it('a live study is frozen: PATCH is 409 and the design stays as launched; DELETE is 409', async () => {
    const id = await newStudy();
    await act(id, 'launch');
    const res = await callRoute(onePATCH, { method: 'PATCH', params: p(id), body: validDesign({ name: 'Changed after launch', repetitions: 9 }) });
    expect(res.status).toBe(409);
    expect((await res.json()).error.message).toMatch(/frozen/);
    const s = await read(id);
    expect(s.name).toBe('Olive oil thresholds');
    expect(s.design.repetitions).toBe(3);
    expect((await callRoute(oneDELETE, { method: 'DELETE', params: p(id) })).status).toBe(409);
  });

  it('live → paused → live → closed, with closedAt; paused is frozen too', async () => {
    const id = await newStudy();
    await act(id, 'launch');
    expect((await (await act(id, 'pause')).json()).state).toBe('paused');
    expect((await callRoute(onePATCH, { method: 'PATCH', params: p(id), body: validDesign({ name: 'While paused' }) })).status).toBe(409);
    expect((await (await act(id, 'resume')).json()).state).toBe('live');
    const closed = await (await act(id, 'close')).json();
    expect(closed.state).toBe('closed');
    expect(closed.closedAt).not.toBeNull();
  });

  it('a paused study can be closed directly', async () => {
    const id = await newStudy();
    await act(id, 'launch');
    await act(id, 'pause');
    expect((await (await act(id, 'close')).json()).state).toBe('closed');
  });

  it('illegal moves are 409 and change nothing', async () => {
    const draft = await newStudy();
    for (const a of ['pause', 'resume', 'close']) expect((await act(draft, a)).status).toBe(409);
    expect((await read(draft)).state).toBe('draft');
    const live = await newStudy();
    await act(live, 'launch');
    expect((await act(live, 'launch')).status).toBe(409);
    expect((await act(live, 'resume')).status).toBe(409);
    await act(live, 'close');
    for (const a of ['launch', 'pause', 'resume', 'close']) {
      const res = await act(live, a);
      expect(res.status).toBe(409);
      expect((await res.json()).error.code).toBe('conflict');
    }
    expect((await read(live)).state).toBe('closed');
  });

  it('an unknown action is a 422', async () => {
    const id = await newStudy();
    const res = await act(id, 'explode');
    expect(res.status).toBe(422);
    expect((await res.json()).error.issues[0].path).toBe('action');
  });

  it('two launches at once: one wins, the other is a 409', async () => {
    const id = await newStudy();
    const statuses = (await Promise.all([act(id, 'launch'), act(id, 'launch')])).map((r) => r.status).sort();
    expect(statuses).toEqual([200, 409]);
  });

  it('duplicate gives an editable draft "… (copy)" pointing at its source', async () => {
    const id = await newStudy();
    await act(id, 'launch');
    const res = await callRoute(dupPOST, { method: 'POST', params: p(id) });
    expect(res.status).toBe(201);
    const copy = await res.json();
    expect(copy).toMatchObject({ name: 'Olive oil thresholds (copy)', state: 'draft', copiedFrom: id, launchedAt: null });
    expect(copy.design.name).toBe('Olive oil thresholds (copy)');
    expect(copy.design.basePrices).toEqual([2.49, 9.99, 49]);
    const edit = await callRoute(onePATCH, { method: 'PATCH', params: p(copy.id), body: validDesign({ name: 'Olive oil, deeper ladder', ladder: [0.05, 0.1, 0.3] }) });
    expect(edit.status).toBe(200);
    expect((await read(id)).design.ladder).toEqual([0.02, 0.05, 0.1, 0.2]);
  });

  it('a draft copied from an imported study reads as the file had it, but launches only once the builder’s limits are met', async () => {
    // One depth on the ladder and a segment column with one answer: fine for an import, not for a study that runs.
    const file = 'respondent,base_price,discount,response,segment_household\nR1,2.49,0.1,1,2\nR1,2.49,0,0,2\nR2,9.99,0.1,0,2\n';
    const body = await multipart(file, { name: 'Imported olive oil', itemName: 'Olive oil', category: 'Pantry', currency: 'EUR', task: 'spot' });
    const imported = await callRoute(importNew, { method: 'POST', params: { workspace: ws.slug }, ...body });
    expect(imported.status).toBe(201);
    const source = (await imported.json()).imported.studyId as string;
    expect((await read(source)).design).toMatchObject({ ladder: [0.1], segmentQuestions: [{ id: 'household', options: ['2'] }], locale: 'en-GB', shelfSize: 6 });
    const copy = await (await callRoute(dupPOST, { method: 'POST', params: p(source) })).json();
    expect((await read(copy.id)).design).toMatchObject({ name: 'Imported olive oil (copy)', ladder: [0.1] });
    const launch = await act(copy.id, 'launch');
    expect(launch.status).toBe(409);
    const paths = (await launch.json()).error.issues.map((i: { path: string }) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['ladder', 'segmentQuestions.0.options']));
    expect((await read(copy.id)).state).toBe('draft');
  });
});
