import fc from 'fast-check';
import { beforeAll, describe, expect, it } from 'vitest';
import { POST as uploadList } from '@/app/api/w/[workspace]/price-lists/route';
import { POST as importInto } from '@/app/api/w/[workspace]/studies/[study]/import/route';
import { POST as importNew } from '@/app/api/w/[workspace]/imports/route';
import { callRoute, makeWorkspace, signInAs, uid } from '../support/factories';
import { makeSimulatedStudy, multipart } from '../support/studies';
import { countRows, expectCleanResponse, fuzzRuns } from '../support/fuzz';

// The CSV importers with random text: random and real headers, quotes, separators, line ends,
// unicode, empty lines and huge fields. Never a 500; a refusal is a clear 4xx and writes
// nothing; an accepted file writes exactly one list / one import.

const PRICE_COLUMNS = ['sku', 'name', 'regular_price', 'unit_cost', 'category'];
const RESPONSE_COLUMNS = ['respondent', 'base_price', 'discount', 'response', 'response_ms', 'segment_shop_often', 'kind'];

const cell = fc.oneof(
  { weight: 3, arbitrary: fc.constantFrom('', '0', '1', '2.49', '9.99', '0.05', '0.12', '-1', '1e309', 'NaN', ' 1 ', 'Every month', 'r-1', 'r-2', 'SKU-1') },
  { weight: 2, arbitrary: fc.string({ maxLength: 12 }) },
  { weight: 1, arbitrary: fc.string({ unit: 'grapheme', maxLength: 12 }) },
  { weight: 1, arbitrary: fc.double().map(String) },
  { weight: 1, arbitrary: fc.constantFrom('"', '""', '"a,b"', 'a"b', '\u0000', '\uFEFF', '=cmd|x', 'x'.repeat(70_000)) },
);

function csvText(columns: string[]) {
  return fc
    .record({
      header: fc.array(fc.oneof({ weight: 4, arbitrary: fc.constantFrom(...columns) }, { weight: 1, arbitrary: fc.string({ maxLength: 10 }) }), { maxLength: 8 }),
      rows: fc.array(fc.array(cell, { maxLength: 9 }), { maxLength: 12 }),
      sep: fc.constantFrom(',', ';', '\t', '|'),
      eol: fc.constantFrom('\n', '\r\n', '\r'),
      quoteAll: fc.boolean(),
      blankLines: fc.boolean(),
      bom: fc.boolean(),
    })
    .map(({ header, rows, sep, eol, quoteAll, blankLines, bom }) => {
      const q = (v: string) => (quoteAll ? `"${v.replace(/"/g, '""')}"` : v);
      const lines = [header, ...rows].map((r) => r.map(q).join(sep));
      if (blankLines) lines.splice(1, 0, '', '   ');
      return (bom ? '\uFEFF' : '') + lines.join(eol);
    });
}
const anyCsv = (columns: string[]) => fc.oneof({ weight: 4, arbitrary: csvText(columns) }, { weight: 1, arbitrary: fc.string({ maxLength: 400 }) });

describe('fuzz: the CSV importers', () => {
  let ws: Awaited<ReturnType<typeof makeWorkspace>>;
  let studyId: string;
  beforeAll(async () => {
    ws = await makeWorkspace();
    ({ studyId } = await makeSimulatedStudy(ws.slug, { state: 'closed', sim: { respondents: 5 } }));
  });
  const wsCount = (table: string) => countRows(`select count(*)::int as n from ${table} x join workspace w on w.id = x.workspace_id where w.slug = ?`, [ws.slug]);

  it('price-list upload (text/csv body): no 5xx; refused → no list and no items; accepted → one list', async () => {
    await fc.assert(
      fc.asyncProperty(anyCsv(PRICE_COLUMNS), async (text) => {
        signInAs(ws.owner);
        const [lists, items] = [await wsCount('price_list'), await countRows('select count(*)::int as n from price_list_item i join price_list l on l.id = i.price_list_id join workspace w on w.id = l.workspace_id where w.slug = ?', [ws.slug])];
        const res = await callRoute(uploadList, { method: 'POST', url: `http://127.0.0.1/x?name=${encodeURIComponent(`Fuzz ${uid()}`)}&currency=EUR`, params: { workspace: ws.slug }, rawBody: text, headers: { 'content-type': 'text/csv' } });
        await expectCleanResponse(res);
        expect(await wsCount('price_list')).toBe(lists + (res.status === 201 ? 1 : 0));
        if (res.status !== 201) expect(await countRows('select count(*)::int as n from price_list_item i join price_list l on l.id = i.price_list_id join workspace w on w.id = l.workspace_id where w.slug = ?', [ws.slug])).toBe(items);
      }),
      { numRuns: fuzzRuns(150) },
    );
  });

  it('response import into a closed study (multipart): no 5xx; refused → no respondents or trials added', async () => {
    const respondents = () => countRows('select count(*)::int as n from respondent where study_id = ?', [studyId]);
    const trials = () => countRows('select count(*)::int as n from trial where study_id = ?', [studyId]);
    await fc.assert(
      fc.asyncProperty(anyCsv(RESPONSE_COLUMNS), fc.boolean(), async (text, dryRun) => {
        signInAs(ws.owner);
        const [r0, t0] = [await respondents(), await trials()];
        const res = await callRoute(importInto, { method: 'POST', url: `http://127.0.0.1/x${dryRun ? '?dryRun=1' : ''}`, params: { workspace: ws.slug, study: studyId }, ...(await multipart(text)) });
        await expectCleanResponse(res);
        if (res.status !== 201) {
          expect(await respondents()).toBe(r0);
          expect(await trials()).toBe(t0);
        }
      }),
      { numRuns: fuzzRuns(150) },
    );
  });

  it('new study from a response file (multipart): no 5xx; refused → no study', async () => {
    const fields = { name: 'Fuzzed import', itemName: 'Olive oil', category: 'Pantry', currency: 'EUR', task: 'pick' };
    await fc.assert(
      fc.asyncProperty(anyCsv(RESPONSE_COLUMNS), async (text) => {
        signInAs(ws.owner);
        const s0 = await wsCount('study');
        const res = await callRoute(importNew, { method: 'POST', params: { workspace: ws.slug }, ...(await multipart(text, fields)) });
        await expectCleanResponse(res);
        expect(await wsCount('study')).toBe(s0 + (res.status === 201 ? 1 : 0));
      }),
      { numRuns: fuzzRuns(100) },
    );
  });
});
