import Papa from 'papaparse';
import { beforeAll, describe, expect, it } from 'vitest';
import { POST as storeList } from '@/app/api/w/[workspace]/price-lists/route';
import { POST as createPlan } from '@/app/api/w/[workspace]/promo-plans/route';
import { GET as getRows } from '@/app/api/w/[workspace]/promo-plans/[plan]/rows/route';
import { GET as getExport } from '@/app/api/w/[workspace]/promo-plans/[plan]/export/route';
import { getStudyFit } from '@/lib/server/analysis/study-fit';
import { authorise } from '@/lib/server/team/membership';
import { demoPriceListCsv } from '@/scripts/seed/demo-price-list';
import { callRoute, makeWorkspace, signInAs, uid } from '../support/factories';
import { fitNow, makeSimulatedStudy } from '../support/studies';

// A plan's floor basis (point estimate, cautious end of the interval, share of shoppers) is
// stored, applied to every row and named in the exports; an unavailable share is a 422 with
// the reason and nothing stored.

describe('promotion plan floor basis', () => {
  let ws: Awaited<ReturnType<typeof makeWorkspace>>;
  let studyId: string;
  let listId: string;
  const params = () => ({ workspace: ws.slug });
  const create = (body: Record<string, unknown>) => callRoute(createPlan, { method: 'POST', params: params(), body: { name: `Plan ${uid()}`, priceListId: listId, studyId, ending: 'exact', ...body } });
  const rows = async (plan: string) => (await (await callRoute(getRows, { url: 'http://127.0.0.1/x?sort=regularPrice&dir=asc&pageSize=500', params: { ...params(), plan } })).json()).rows as { sku: string; floorFraction: number | null }[];

  beforeAll(async () => {
    ws = await makeWorkspace();
    ({ studyId } = await makeSimulatedStudy(ws.slug));
    signInAs(ws.owner);
    listId = (await (await callRoute(storeList, { method: 'POST', url: `http://127.0.0.1/x?name=${uid()}&currency=EUR`, params: params(), rawBody: demoPriceListCsv(), headers: { 'content-type': 'text/csv' } })).json()).priceList.id;
    await fitNow(studyId);
  });

  it('the cautious end puts every floor at or deeper than the point estimate, and the exports say so', async () => {
    signInAs(ws.owner);
    const point = await create({ model: 'free' });
    const cautious = await create({ model: 'free', basis: 'cautious' });
    expect(point.status).toBe(201);
    expect(cautious.status).toBe(201);
    const p = (await point.json()).plan, c = (await cautious.json()).plan;
    expect(c.settings).toMatchObject({ basis: 'cautious', share: null, tolerance: 0.02 });
    const [pr, cr] = [await rows(p.id), await rows(c.id)];
    let deeper = 0;
    pr.forEach((r, i) => {
      if (r.floorFraction === null) { expect(cr[i].floorFraction).toBeNull(); return; }
      expect(cr[i].floorFraction!).toBeGreaterThanOrEqual(r.floorFraction - 1e-12);
      if (cr[i].floorFraction! > r.floorFraction + 1e-9) deeper++;
    });
    expect(deeper).toBeGreaterThan(0);
    const about = Papa.parse<string[]>((await (await callRoute(getExport, { url: 'http://127.0.0.1/x?format=about-csv', params: { ...params(), plan: c.id } })).text()).trim()).data;
    expect(about.find((r) => r[0] === 'Floor basis')?.[1]).toBe('Cautious end of the 95 % interval of the threshold');
    const json = await (await callRoute(getExport, { url: 'http://127.0.0.1/x?format=json', params: { ...params(), plan: p.id } })).json();
    expect(json.header).toMatchObject({ basis: 'point', basisMeaning: 'Point estimate of the threshold' });
    expect(json.summary).toHaveProperty('totalMarginCost');
  });

  it('a share of shoppers is used when the fit reports it, refused with the reason when it does not', async () => {
    signInAs(ws.owner);
    const ctx = await authorise(ws.owner, ws.slug, 'viewer');
    const fit = await getStudyFit(ctx, studyId);
    if (fit.status !== 'ready') throw new Error('fit should be ready');
    const res = await create({ basis: 'share', share: 0.75 });
    const spread = fit.report.shopperSpread;
    if (spread && spread.bases.some((b) => b.shares.some((s) => s.share === 0.75))) {
      expect(res.status).toBe(201);
      expect((await res.json()).plan.settings).toMatchObject({ basis: 'share', share: 0.75, target: null });
    } else {
      expect(res.status).toBe(422);
      const body = await res.json();
      expect(body.error.issues[0].path).toBe('basis');
      expect(body.error.message).toMatch(/shopper/);
    }
    const none = await create({ basis: 'share', share: 0.33 });
    expect(none.status).toBe(422);
  });
});
