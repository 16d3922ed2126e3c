// Borrowing, labelled (issue 15): a plan whose price list holds categories its study did not
// measure says "borrowed from …" in its stored source, every export (a Fit basis column per item,
// the about file, the JSON header) and its cautions; a pooled fit across chosen studies is
// computed by the engine as a job and labelled the same way; bad pools are refused, nothing stored.
import Papa from 'papaparse';
import { beforeAll, describe, expect, it } from 'vitest';
import { POST as storeList } from '@/app/api/w/[workspace]/price-lists/route';
import { POST as createPlan } from '@/app/api/w/[workspace]/promo-plans/route';
import { GET as getExport } from '@/app/api/w/[workspace]/promo-plans/[plan]/export/route';
import { readCache } from '@/lib/server/analysis/cache';
import { runPooledFitJob } from '@/lib/server/analysis/pooled-fit';
import { em } from '@/lib/server/db/orm';
import { callRoute, makeWorkspace, signInAs, uid } from '../support/factories';
import { fitNow, makeSimulatedStudy } from '../support/studies';

describe('borrowed and pooled fits on promotion plans', () => {
  let ws: Awaited<ReturnType<typeof makeWorkspace>>;
  let other: Awaited<ReturnType<typeof makeWorkspace>>;
  let kitchen: string, drinks: string, pickStudy: string, foreign: string, listId: string;
  const params = () => ({ workspace: ws.slug });
  const create = (body: Record<string, unknown>) => callRoute(createPlan, { method: 'POST', params: params(), body: { name: `Plan ${uid()}`, priceListId: listId, studyId: kitchen, ending: 'ends-99', ...body } });
  const plans = async () => (await (await em()).execute('select count(*)::int as n from promo_plan where workspace_id = (select id from workspace where slug = ?)', [ws.slug]))[0].n as number;
  const exportOf = async (planId: string, format: string) => (await callRoute(getExport, { url: `http://127.0.0.1/x?format=${format}`, params: { workspace: ws.slug, plan: planId } })).text();

  beforeAll(async () => {
    ws = await makeWorkspace();
    other = await makeWorkspace();
    kitchen = (await makeSimulatedStudy(ws.slug, { name: 'Kitchen' })).studyId;
    drinks = (await makeSimulatedStudy(ws.slug, { name: 'Drinks', design: { category: 'Groceries — drinks' }, sim: { refFraction: 0.1 } })).studyId;
    pickStudy = (await makeSimulatedStudy(ws.slug, { name: 'Pick', design: { category: 'Household', task: 'pick' } })).studyId;
    foreign = (await makeSimulatedStudy(other.slug, { name: 'Foreign' })).studyId;
    for (const id of [kitchen, drinks, pickStudy]) await fitNow(id);
    signInAs(ws.owner);
    const csv = 'sku,name,regular_price,category\r\nK1,Peeler,4.99,Kitchen & home\r\nK2,Pan,39.00,Kitchen & home\r\nG1,Hose,19.99,Garden\r\nG2,Rake,24.99,Garden\r\n';
    const res = await callRoute(storeList, { method: 'POST', url: 'http://127.0.0.1/x?name=Mixed&currency=EUR', params: params(), rawBody: csv, headers: { 'content-type': 'text/csv' } });
    listId = (await res.json()).priceList.id;
  }, 300_000);

  it('a study fit used for an unmeasured category is labelled borrowed on the plan and in every export', async () => {
    const res = await create({});
    expect(res.status).toBe(201);
    const plan = (await res.json()).plan;
    expect(plan.fit.source).toMatchObject({ kind: 'study', borrowedFor: ['Garden'], studies: [{ id: kitchen, name: 'Kitchen', category: 'Kitchen & home' }] });
    const rows = Papa.parse<Record<string, string>>((await exportOf(plan.id, 'csv')).trim(), { header: true }).data;
    expect(rows.find((r) => r.SKU === 'G1')!['Fit basis']).toBe('borrowed from “Kitchen” (Kitchen & home)');
    expect(rows.find((r) => r.SKU === 'K1')!['Fit basis']).toBe('measured: “Kitchen” (Kitchen & home)');
    const about = await exportOf(plan.id, 'about-csv');
    expect(about).toContain('Fit basis,Borrowed from “Kitchen” (Kitchen & home) for Garden');
    expect(about).toMatch(/Caution,"Borrowed fit: the floors for Garden come from shoppers asked about Kitchen & home/);
    const json = JSON.parse(await exportOf(plan.id, 'json'));
    expect(json.header.fitBasis).toBe('Borrowed from “Kitchen” (Kitchen & home) for Garden');
    expect(json.header.cautions[0]).toMatch(/^Borrowed fit/);
    expect(json.items.find((i: { sku: string }) => i.sku === 'G2').fitBasis).toBe('borrowed from “Kitchen” (Kitchen & home)');
  });

  it('a pooled fit is computed as a job (nothing stored while it runs), then labelled pooled', async () => {
    const before = await plans();
    const name = `Pooled ${uid()}`;
    const first = await create({ name, pooledStudyIds: [drinks] });
    expect(first.status).toBe(202);
    expect(await plans()).toBe(before);
    const row = (await (await em()).execute(`select cache_key, study_id from analysis_result where kind = 'pooled-fit' and study_id = any(?::uuid[])`, [`{${kitchen},${drinks}}`]))[0];
    const ids = [kitchen, drinks].sort();
    await runPooledFitJob({ studyId: row.study_id, kind: 'pooled-fit', cacheKey: row.cache_key, dataVersion: 1, studies: ids.map((id) => ({ id, dataVersion: 1 })) });
    for (let i = 0; i < 600 && (await readCache(row.study_id, 'pooled-fit', row.cache_key))?.status !== 'done'; i++) await new Promise((r) => setTimeout(r, 100));
    const res = await create({ name, pooledStudyIds: [drinks] });
    expect(res.status).toBe(201);
    const plan = (await res.json()).plan;
    expect(plan.fit.source.kind).toBe('pooled');
    expect(plan.fit.source.studies.map((s: { id: string }) => s.id)).toEqual([kitchen, drinks]);
    expect(plan.fit.warnings.join(' ')).toContain('pooled fit of 2 studies');
    const json = JSON.parse(await exportOf(plan.id, 'json'));
    expect(json.header.cautions.some((c: string) => c.startsWith('Pooled fit: the floors come from the shoppers of 2 studies'))).toBe(true);
    // the retried create stored one plan only (409 for the same name)
    expect((await create({ name, pooledStudyIds: [drinks] })).status).toBe(409);
  });

  it('refuses pools it cannot fit, storing nothing', async () => {
    const before = await plans();
    expect((await create({ pooledStudyIds: [pickStudy] })).status).toBe(422);
    expect((await create({ pooledStudyIds: [drinks], segment: { questionId: 'shop_often', answer: 'Rarely' } })).status).toBe(422);
    expect((await create({ pooledStudyIds: [foreign] })).status).toBe(404);
    expect((await create({ pooledStudyIds: ['not-a-uuid'] })).status).toBe(422);
    expect(await plans()).toBe(before);
  });
});
