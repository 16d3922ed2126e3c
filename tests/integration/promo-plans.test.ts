import Papa from 'papaparse';
import { beforeAll, describe, expect, it } from 'vitest';
import { POST as storeList } from '@/app/api/w/[workspace]/price-lists/route';
import { GET as listPlans, POST as createPlan } from '@/app/api/w/[workspace]/promo-plans/route';
import { DELETE as deletePlan, GET as getPlan } from '@/app/api/w/[workspace]/promo-plans/[plan]/route';
import { GET as getRows } from '@/app/api/w/[workspace]/promo-plans/[plan]/rows/route';
import { GET as getExport } from '@/app/api/w/[workspace]/promo-plans/[plan]/export/route';
import { fitCacheKey, getStudyFit, runFitJob } from '@/lib/server/analysis/study-fit';
import { authorise } from '@/lib/server/team/membership';
import { em } from '@/lib/server/db/orm';
import { findStudy } from '@/lib/server/analysis/cells';
import { makeFloorCalculator } from '@/lib/psychometrics/promo-floor';
import { PRICE_CLAIM_CAUTIONS } from '@/lib/promo/cautions';
import { demoPriceListCsv } from '@/scripts/seed/demo-price-list';
import { callRoute, makeMember, makeWorkspace, signInAs, uid } from '../support/factories';
import { makeSimulatedStudy } from '../support/studies';

describe('promotion plans', () => {
  let ws: Awaited<ReturnType<typeof makeWorkspace>>;
  let studyId: string;
  let listId: string;
  let usdListId: string;
  let planId: string;
  const params = () => ({ workspace: ws.slug });
  const upload = async (currency: string) => {
    const res = await callRoute(storeList, { method: 'POST', url: `http://127.0.0.1/x?name=${uid()}&currency=${currency}`, params: params(), rawBody: demoPriceListCsv(), headers: { 'content-type': 'text/csv' } });
    return (await res.json()).priceList.id as string;
  };
  const create = (body: Record<string, unknown>) => callRoute(createPlan, { method: 'POST', params: params(), body: { name: `Plan ${uid()}`, priceListId: listId, studyId, ending: 'ends-99', ...body } });
  const countPlans = async () => (await (await em()).execute('select count(*)::int as n from promo_plan p join workspace w on w.id = p.workspace_id where w.slug = ?', [ws.slug]))[0].n as number;

  beforeAll(async () => {
    ws = await makeWorkspace();
    ({ studyId } = await makeSimulatedStudy(ws.slug));
    signInAs(ws.owner);
    listId = await upload('EUR');
    usdListId = await upload('USD');
  });

  it('while the fit is computing: 202 with a message, nothing stored', async () => {
    signInAs(await makeMember(ws.slug, 'analyst'));
    const res = await create({});
    expect(res.status).toBe(202);
    expect((await res.json()).message).toMatch(/still being computed.*try again/);
    expect(await countPlans()).toBe(0);
  });

  it('once fitted: stores settings, fit version, exclusion rules and the floor parameters', async () => {
    const ctx = await authorise(ws.owner, ws.slug, 'viewer');
    const study = await findStudy(await em(), ctx.workspace.id, studyId);
    await runFitJob({ studyId, kind: 'fit', cacheKey: fitCacheKey(study, {}).cacheKey, dataVersion: study.dataVersion, segment: null, target: null });
    signInAs(ws.owner);
    const res = await create({ name: 'Spring floors', target: 0.75 });
    expect(res.status).toBe(201);
    const { plan } = await res.json();
    planId = plan.id;
    const fit = await getStudyFit(ctx, studyId);
    if (fit.status !== 'ready') throw new Error('fit should be ready');
    const expectedModel = fit.report.preferredModel === 'constantAmount' ? 'power' : fit.report.preferredModel;
    expect(plan.settings).toEqual({ model: expectedModel, modelChoice: 'preferred', target: 0.75, ending: 'ends-99', segment: null, basis: 'point', share: null, tolerance: 0.02 });
    expect(plan.fitVersion).toBe(study.dataVersion);
    expect(plan.exclusionRules).toEqual(fit.exclusionRules);
    expect(plan.poorFit).toBe(fit.poorFit);
    expect(plan.fit.testedBasePrices).toEqual([3.49, 12.99, 39, 129, 449]);

    // Floors come from the stored parameters and equal the engine's on the same report.
    const calc = makeFloorCalculator(fit.report, expectedModel, 0.75);
    const page = await (await callRoute(getRows, { url: 'http://127.0.0.1/x?sort=regularPrice&dir=asc&pageSize=500', params: { ...params(), plan: planId } })).json();
    expect(page.total).toBe(200);
    for (const r of page.rows.slice(0, 50)) {
      const e = calc(r.regularPrice, 'ends-99');
      expect(r.floorFraction).toBeCloseTo(e.floorFraction, 12);
      expect(r.outsideRange).toBe(e.extrapolated);
      // The .99 ending only where it deepens the discount by at most 2 points; else the exact floor price.
      if (r.promoPrice !== null) expect(r.discountAfterEnding - r.floorFraction).toBeLessThanOrEqual(0.02 + 1e-9);
      if (r.endingSkipped) expect(Math.round(r.promoPrice * 100) % 100).not.toBe(99);
    }
    expect(page.rows[0]).toMatchObject({ sku: 'HL-10001', regularPrice: 0.89, outsideRange: true });
    const flagged = await (await callRoute(getRows, { url: 'http://127.0.0.1/x?flag=outsideRange&pageSize=500', params: { ...params(), plan: planId } })).json();
    expect(flagged.total).toBeGreaterThan(0);
    expect(flagged.rows.every((r: { outsideRange: boolean }) => r.outsideRange)).toBe(true);
  });

  it('refuses a list in another currency, an unreachable target and a duplicate name, storing nothing', async () => {
    signInAs(ws.owner);
    const before = await countPlans();
    const usd = await create({ priceListId: usdListId });
    expect(usd.status).toBe(422);
    expect((await usd.json()).error.issues[0]).toMatchObject({ path: 'priceListId', message: expect.stringMatching(/USD.*EUR/) });
    const low = await create({ target: 0.02 });
    expect(low.status).toBe(422);
    expect((await low.json()).error.issues[0].path).toBe('target');
    const dup = await create({ name: 'Spring floors' });
    expect(dup.status).toBe(409);
    const bad = await create({ ending: 'ends-77', target: 2 });
    expect(bad.status).toBe(422);
    expect((await bad.json()).error.issues.map((i: { path: string }) => i.path)).toEqual(expect.arrayContaining(['ending', 'target']));
    expect(await countPlans()).toBe(before);
  });

  it('a viewer cannot create or delete a plan (403) but can open it and download every export', async () => {
    signInAs(await makeMember(ws.slug, 'viewer'));
    const before = await countPlans();
    expect((await create({})).status).toBe(403);
    expect((await callRoute(deletePlan, { method: 'DELETE', params: { ...params(), plan: planId } })).status).toBe(403);
    expect(await countPlans()).toBe(before);
    expect((await (await callRoute(listPlans, { params: params() })).json()).plans).toHaveLength(1);
    const detail = await (await callRoute(getPlan, { params: { ...params(), plan: planId } })).json();
    expect(detail.summary.items).toBe(200);
    expect(detail.chart.testedBasePrices).toEqual([3.49, 12.99, 39, 129, 449]);

    const csvRes = await callRoute(getExport, { url: 'http://127.0.0.1/x?format=csv', params: { ...params(), plan: planId } });
    expect(csvRes.headers.get('content-type')).toMatch(/text\/csv/);
    expect(csvRes.headers.get('content-disposition')).toMatch(/promo-plan-spring-floors\.csv/);
    const csv = Papa.parse<string[]>((await csvRes.text()).trim()).data;
    expect(csv[0].slice(3, 9)).toEqual(['Regular price (EUR)', 'Unit cost (EUR)', 'Promo floor (% off)', 'Promo floor (EUR off)', 'Promo price (EUR)', 'Discount at promo price (% off)']);
    expect(csv).toHaveLength(201);

    const about = await (await callRoute(getExport, { url: 'http://127.0.0.1/x?format=about-csv', params: { ...params(), plan: planId } })).text();
    for (const c of PRICE_CLAIM_CAUTIONS) expect(about).toContain(c.split(',')[0]);
    const json = await (await callRoute(getExport, { url: 'http://127.0.0.1/x?format=json', params: { ...params(), plan: planId } })).json();
    expect(json.header).toMatchObject({ study: { id: studyId }, fitVersion: 1, target: 0.75, ending: 'Ends in .99' });
    expect(json.header.cautions).toEqual(expect.arrayContaining([...PRICE_CLAIM_CAUTIONS]));
    expect(json.header.generatedAt).toMatch(/^\d{4}-/);
    expect(json.items).toHaveLength(200);
    expect((await callRoute(getExport, { url: 'http://127.0.0.1/x?format=xlsx', params: { ...params(), plan: planId } })).status).toBe(422);
  });

  it('a foreign workspace sees 404 for the plan, and cannot build on this workspace’s list or study', async () => {
    const other = await makeWorkspace();
    signInAs(other.owner);
    expect((await callRoute(getPlan, { params: { workspace: other.slug, plan: planId } })).status).toBe(404);
    expect((await callRoute(getExport, { url: 'http://127.0.0.1/x?format=csv', params: { workspace: other.slug, plan: planId } })).status).toBe(404);
    expect((await callRoute(deletePlan, { method: 'DELETE', params: { workspace: other.slug, plan: planId } })).status).toBe(404);
    const res = await callRoute(createPlan, { method: 'POST', params: { workspace: other.slug }, body: { name: 'Borrowed', priceListId: listId, studyId, ending: 'exact' } });
    expect(res.status).toBe(404);
    signInAs(ws.owner);
    expect((await callRoute(deletePlan, { method: 'DELETE', params: { ...params(), plan: planId } })).status).toBe(204);
    expect((await callRoute(getPlan, { params: { ...params(), plan: planId } })).status).toBe(404);
  });
});
