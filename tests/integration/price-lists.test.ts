import { beforeAll, describe, expect, it } from 'vitest';
import { GET as listGET, POST as storePOST } from '@/app/api/w/[workspace]/price-lists/route';
import { POST as previewPOST } from '@/app/api/w/[workspace]/price-lists/preview/route';
import { DELETE as itemDELETE, GET as itemGET } from '@/app/api/w/[workspace]/price-lists/[list]/route';
import { em } from '@/lib/server/db/orm';
import { callRoute, makeMember, makeWorkspace, signInAs, uid } from '../support/factories';
import { refuseRowsWhere } from '../support/failing-rows';

const HEADER = 'sku,name,regular_price,unit_cost,category';
const csv = (...rows: string[]) => [HEADER, ...rows].join('\n');

async function countItems(slug: string) {
  const db = await em();
  const [r] = await db.execute(
    'select count(i.*)::int as n from price_list_item i join price_list p on p.id = i.price_list_id join workspace w on w.id = p.workspace_id where w.slug = ?', [slug]);
  const [l] = await db.execute('select count(*)::int as n from price_list p join workspace w on w.id = p.workspace_id where w.slug = ?', [slug]);
  return { items: r.n as number, lists: l.n as number };
}

describe('price list upload', () => {
  let ws: Awaited<ReturnType<typeof makeWorkspace>>;
  beforeAll(async () => { ws = await makeWorkspace(); });
  const store = (text: string, name = `List ${uid()}`, currency = 'EUR') =>
    callRoute(storePOST, { method: 'POST', url: `http://127.0.0.1/x?name=${encodeURIComponent(name)}&currency=${currency}`, params: { workspace: ws.slug }, rawBody: text, headers: { 'content-type': 'text/csv' } });

  it('a missing column is one file-level error naming it; nothing stored', async () => {
    signInAs(ws.owner);
    const res = await store('sku,name,unit_cost\nA-1,Tea,1.2\n');
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.error.message).toMatch(/nothing was stored/);
    expect(body.error.issues).toHaveLength(1);
    expect(body.error.issues[0]).toMatchObject({ path: 'file.regular_price' });
    expect(body.error.issues[0].message).toMatch(/regular_price/);
    expect(await countItems(ws.slug)).toEqual({ items: 0, lists: 0 });
  });

  it('a negative price and a duplicated sku are reported with their row numbers; nothing stored', async () => {
    signInAs(ws.owner);
    const text = csv('A-1,Tea,2.49,1.10,Drinks', 'A-2,Mug,-4.99,,Home', 'A-3,Kettle,39,21,Home', 'A-1,Tea again,2.59,,Drinks');
    const preview = await (await callRoute(previewPOST, { method: 'POST', params: { workspace: ws.slug }, rawBody: text, headers: { 'content-type': 'text/csv' } })).json();
    expect(preview.valid).toBe(false);
    expect(preview.rowCount).toBe(4);
    expect(preview.preview.map((r: { sku: string }) => r.sku)).toEqual(['A-1', 'A-3', 'A-1']);
    expect(preview.errors).toEqual([
      { row: 3, column: 'regular_price', message: expect.stringMatching(/cannot be negative/) },
      { row: 5, column: 'sku', message: expect.stringMatching(/A-1 appears again \(first on row 2\)/) },
    ]);
    const res = await store(text);
    expect(res.status).toBe(422);
    const paths = (await res.json()).error.issues.map((i: { path: string }) => i.path);
    expect(paths).toEqual(['rows.3.regular_price', 'rows.5.sku']);
    expect(await countItems(ws.slug)).toEqual({ items: 0, lists: 0 });
  });

  it('a database failure at row 12,000 of 15,000 (past the first bulk statement) stores no list and no item', async () => {
    signInAs(ws.owner);
    const rows = Array.from({ length: 15_000 }, (_, i) => `${i + 2 === 12_000 ? 'REFUSE-ME' : `S-${i}`},Item ${i},${(1 + (i % 500)).toFixed(2)},,`);
    const before = await countItems(ws.slug);
    await refuseRowsWhere('price_list_item', `new.sku = 'REFUSE-ME'`, async () => {
      expect((await store(csv(...rows), 'Refused list')).status).toBe(500);
    });
    expect(await countItems(ws.slug)).toEqual(before);
  });

  it('a 60,000-row file is refused with a clear error; nothing stored', async () => {
    signInAs(ws.owner);
    const rows = Array.from({ length: 60_000 }, (_, i) => `S-${i},Item ${i},${(1 + (i % 500)).toFixed(2)},,`);
    const res = await store(csv(...rows));
    expect(res.status).toBe(422);
    expect((await res.json()).error.issues[0].message).toMatch(/60,000 item rows; a price list holds at most 50,000/);
    expect(await countItems(ws.slug)).toEqual({ items: 0, lists: 0 });
  });

  it('a body over 8 MB is a 413', async () => {
    signInAs(ws.owner);
    const res = await store(HEADER + '\n' + 'x'.repeat(8 * 1024 * 1024 + 10));
    expect(res.status).toBe(413);
    expect((await res.json()).error.code).toBe('payload_too_large');
  });

  it('a valid multipart upload of 50,000 rows is stored in one go, and a second one with the same name is refused', async () => {
    signInAs(ws.owner);
    const rows = Array.from({ length: 50_000 }, (_, i) => `S-${i},Item ${i},${(0.89 + (i % 900)).toFixed(2)},${i % 3 ? (0.4 + (i % 900) / 2).toFixed(2) : ''},Cat ${i % 7}`);
    const form = new FormData();
    form.set('file', new File([csv(...rows)], 'list.csv', { type: 'text/csv' }));
    form.set('name', 'Spring range');
    form.set('currency', 'GBP');
    const started = Date.now();
    const res = await storePOST(new (await import('next/server')).NextRequest('http://127.0.0.1/x', { method: 'POST', body: form }), { params: Promise.resolve({ workspace: ws.slug }) });
    const ms = Date.now() - started;
    expect(res.status).toBe(201);
    const { priceList } = await res.json();
    expect(priceList).toMatchObject({ name: 'Spring range', currency: 'GBP', itemCount: 50_000 });
    expect(await countItems(ws.slug)).toEqual({ items: 50_000, lists: 1 });
    expect(ms).toBeLessThan(10_000);
    const again = await store('sku,name,regular_price\nB,Bread,1.99', 'Spring range');
    expect(again.status).toBe(409);
    expect(await countItems(ws.slug)).toEqual({ items: 50_000, lists: 1 });
    const got = await callRoute(itemGET, { params: { workspace: ws.slug, list: priceList.id } });
    expect((await got.json()).priceList.itemCount).toBe(50_000);
  });

  it('viewers read lists but cannot upload or delete; foreign workspaces see 404', async () => {
    signInAs(ws.owner);
    const stored = await (await store(csv('V-1,Oats,3.29,1.80,Grocery'), 'Viewer test')).json();
    const viewer = await makeMember(ws.slug, 'viewer');
    signInAs(viewer);
    expect((await callRoute(listGET, { params: { workspace: ws.slug } })).status).toBe(200);
    expect((await store(csv('V-2,Rice,2.19,,'))).status).toBe(403);
    expect((await callRoute(itemDELETE, { method: 'DELETE', params: { workspace: ws.slug, list: stored.priceList.id } })).status).toBe(403);
    const other = await makeWorkspace();
    signInAs(other.owner);
    expect((await callRoute(itemGET, { params: { workspace: other.slug, list: stored.priceList.id } })).status).toBe(404);
    expect((await callRoute(itemDELETE, { method: 'DELETE', params: { workspace: other.slug, list: stored.priceList.id } })).status).toBe(404);
    signInAs(ws.owner);
    expect((await callRoute(itemDELETE, { method: 'DELETE', params: { workspace: ws.slug, list: stored.priceList.id } })).status).toBe(204);
  });
});
