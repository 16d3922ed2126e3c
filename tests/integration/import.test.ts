import { beforeAll, describe, expect, it } from 'vitest';
import { POST as importInto } from '@/app/api/w/[workspace]/studies/[study]/import/route';
import { POST as importNew } from '@/app/api/w/[workspace]/imports/route';
import { GET as exportGet } from '@/app/api/w/[workspace]/studies/[study]/exports/[file]/route';
import { em } from '@/lib/server/db/orm';
import { refuseRowsWhere } from '../support/failing-rows';
import { callRoute, makeMember, makeWorkspace, signInAs } from '../support/factories';
import { makeSimulatedStudy, multipart } from '../support/studies';

const counts = async (studyId: string) => {
  const [r] = await (await em()).execute<{ n: number; t: number; v: number }[]>(
    'select (select count(*) from respondent where study_id = ?)::int as n, (select count(*) from trial where study_id = ?)::int as t, (select data_version from study where id = ?) as v',
    [studyId, studyId, studyId]);
  return r;
};

const VALID = 'respondent,base_price,discount,response,segment_shop_often\nR1,3.49,0.05,1,Rarely\nR1,3.49,0,0,Rarely\nR2,39,0.12,1,Every month\nR2,449,0.02,0,Every month\n';

describe('response import', () => {
  let ws: Awaited<ReturnType<typeof makeWorkspace>>;
  let studyId: string;
  beforeAll(async () => {
    ws = await makeWorkspace();
    ({ studyId } = await makeSimulatedStudy(ws.slug, { sim: { respondents: 5 } }));
  });
  const post = async (text: string | Uint8Array, dryRun = false) => callRoute(importInto, {
    method: 'POST', params: { workspace: ws.slug, study: studyId }, url: `http://127.0.0.1/x${dryRun ? '?dryRun=1' : ''}`, ...(await multipart(text)),
  });

  it('bad files: row-numbered errors and nothing written', async () => {
    signInAs(ws.owner);
    const before = await counts(studyId);
    const cases: [string | Uint8Array, number, RegExp][] = [
      ['respondent,price,discount,response\nR1,3.49,0.05,1\n', 1, /missing column "base_price"/],
      ['respondent,base_price,discount,response\nR1,3.49,0.05,1\nR1,cheap,0.05,1\n', 3, /base_price is not a number/],
      ['respondent,base_price,discount,response\nR1,3.49,1.2,1\n', 2, /discount must be a fraction below 1/],
      ['', 1, /The file is empty/],
      ['respondent,base_price,discount,response\nR1,3.49,0.05,yes\n', 2, /response must be 0 or 1/],
      ['respondent,base_price,discount,response\nR1,5.00,0.05,1\n', 2, /not one of this study's base prices/],
    ];
    for (const [text, row, message] of cases) {
      const res = await post(text);
      expect(res.status).toBe(422);
      const body = await res.json();
      expect(body.check.ok).toBe(false);
      expect(body.check.errors).toEqual(expect.arrayContaining([expect.objectContaining({ row, message: expect.stringMatching(message) })]));
    }
    expect(await counts(studyId)).toEqual(before);
  });

  it('a 20 MB file is refused with a clear 413 and writes nothing', async () => {
    signInAs(ws.owner);
    const before = await counts(studyId);
    const line = 'R1,3.49,0.05,1\n';
    const big = 'respondent,base_price,discount,response\n' + line.repeat(Math.ceil((20 * 1024 * 1024) / line.length));
    const res = await post(big);
    expect(res.status).toBe(413);
    expect((await res.json()).error.message).toMatch(/larger than 10 MB/);
    expect(await counts(studyId)).toEqual(before);
  });

  it('a valid file: preview on a dry run, then one transaction; a second upload of it is refused', async () => {
    signInAs(await makeMember(ws.slug, 'analyst'));
    const before = await counts(studyId);
    const dry = await post(VALID, true);
    expect(dry.status).toBe(200);
    const d = await dry.json();
    expect(d.check).toMatchObject({ ok: true, rows: 4, respondents: 2 });
    expect(d.check.preview[0]).toMatchObject({ respondent: 'R1', base_price: '3.49' });
    expect(await counts(studyId)).toEqual(before);
    const res = await post(VALID);
    expect(res.status).toBe(201);
    expect(await counts(studyId)).toEqual({ n: before.n + 2, t: before.t + 4, v: before.v + 1 });
    const rows = await (await em()).execute<{ kind: string; idx: number; seg: Record<string, string> }[]>(
      `select t.kind, t.idx, r.segment_answers as seg from trial t join respondent r on r.id = t.respondent_id where r.study_id = ? and r.external_ref = 'R1' order by t.idx`, [studyId]);
    expect(rows.map((r) => [r.kind, r.idx])).toEqual([['test', 1], ['catch', 2]]);
    expect(rows[0].seg).toEqual({ shop_often: 'Rarely' });
    const again = await post(VALID);
    expect(again.status).toBe(422);
    expect((await again.json()).check.errors[0].message).toMatch(/already imported/);
  });

  it('our own raw-trials export imports into a new study of state "imported"', async () => {
    signInAs(ws.owner);
    const csv = await (await callRoute(exportGet, { params: { workspace: ws.slug, study: studyId, file: 'trials.csv' } })).text();
    const body = await multipart(csv, { name: 'Imported copy', itemName: 'Kitchenware', category: 'Kitchen & home', currency: 'EUR', task: 'spot' });
    const res = await callRoute(importNew, { method: 'POST', params: { workspace: ws.slug }, ...body });
    expect(res.status).toBe(201);
    const { imported } = await res.json();
    const [s] = await (await em()).execute<{ state: string; design: { basePrices: number[]; segmentQuestions: { id: string }[] } }[]>('select state, design from study where id = ?', [imported.studyId]);
    expect(s.state).toBe('imported');
    expect(s.design.basePrices).toEqual([3.49, 12.99, 39, 129, 449]);
    expect(s.design.segmentQuestions.map((q) => q.id)).toEqual(['shop_often']);
    const bad = await callRoute(importNew, { method: 'POST', params: { workspace: ws.slug }, ...(await multipart(VALID, { name: 'x' })) });
    expect(bad.status).toBe(422);
  });

  it('a database failure at row 11,000 of 12,000 (past the first bulk statement) writes nothing, into a closed study or a new one', async () => {
    signInAs(ws.owner);
    // 400 respondents × 30 trials; the trial on file row 11,000 is refused by the database.
    const lines = Array.from({ length: 12_000 }, (_, i) => `F${Math.floor(i / 30)},${[3.49, 39, 449][i % 3]},${i % 10 ? 0.05 : 0},${i % 2},${i + 2 === 11_000 ? 3_599_999 : 900}`);
    const file = `respondent,base_price,discount,response,response_ms\n${lines.join('\n')}\n`;
    const before = await counts(studyId);
    const audits = async () => (await (await em()).execute<{ n: number }[]>(
      `select count(*)::int as n from audit_event a join workspace w on w.id = a.workspace_id where w.slug = ? and a.action in ('study.responses_imported', 'study.created_by_import')`, [ws.slug]))[0].n;
    const auditsBefore = await audits();
    await refuseRowsWhere('trial', 'new.response_ms = 3599999', async () => {
      expect((await post(file, true)).status).toBe(200);
      const res = await post(file);
      expect(res.status).toBe(500);
      expect(await counts(studyId)).toEqual(before);
      const body = await multipart(file, { name: 'Failing import', itemName: 'Kitchenware', category: 'Kitchen & home', currency: 'EUR', task: 'spot' });
      expect((await callRoute(importNew, { method: 'POST', params: { workspace: ws.slug }, ...body })).status).toBe(500);
    });
    const [made] = await (await em()).execute<{ n: number }[]>(`select count(*)::int as n from study s join workspace w on w.id = s.workspace_id where w.slug = ? and s.name = 'Failing import'`, [ws.slug]);
    expect(made.n).toBe(0);
    expect(await audits()).toBe(auditsBefore);
    // The same file without the refusal goes in whole, so the refusal above was the only cause.
    expect((await post(file)).status).toBe(201);
    expect(await counts(studyId)).toEqual({ n: before.n + 400, t: before.t + 12_000, v: before.v + 1 });
  });

  it('viewers may not import (403); a live study takes no import (409)', async () => {
    signInAs(await makeMember(ws.slug, 'viewer'));
    expect((await post(VALID)).status).toBe(403);
    const live = await makeSimulatedStudy(ws.slug, { state: 'live', sim: { respondents: 2 } });
    signInAs(ws.owner);
    const res = await callRoute(importInto, { method: 'POST', params: { workspace: ws.slug, study: live.studyId }, ...(await multipart(VALID)) });
    expect(res.status).toBe(409);
  });
});
