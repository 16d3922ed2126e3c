import { readFileSync } from 'node:fs';
import path from 'node:path';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { parsePriceList } from '@/lib/promo/parse-price-list';
import { queryRows, rowQuerySchema } from '@/lib/promo/query-rows';
import { planAboutCsv, planCsv, planCsvHeader, type PlanExportHeader } from '@/lib/promo/plan-export';
import { fitSourceOf } from '@/lib/promo/fit-source';
import { summarisePlan } from '@/lib/promo/summary';
import type { FloorRow } from '@/lib/promo/floor-table';
import { PRICE_CLAIM_CAUTIONS, POOR_FIT_WARNING } from '@/lib/promo/cautions';
import { demoPriceListCsv, demoPriceListRows } from '@/scripts/seed/demo-price-list';

describe('parsePriceList', () => {
  it('reads a spreadsheet export: BOM, CRLF, header case and spaces, blank lines, optional columns missing', () => {
    const p = parsePriceList('\uFEFFSKU,Name,Regular Price\r\nA-1,Tea,2.49\r\n\r\nA-2,"Mug, large",7\r\n');
    expect(p.errors).toEqual([]);
    expect(p.rows).toEqual([
      { row: 2, sku: 'A-1', name: 'Tea', regular_price: 2.49, unit_cost: null, category: null },
      { row: 4, sku: 'A-2', name: 'Mug, large', regular_price: 7, unit_cost: null, category: null },
    ]);
  });

  it('accepts a decimal comma in a semicolon-separated file, but not in a comma-separated one', () => {
    expect(parsePriceList('sku;name;regular_price;unit_cost\nA;Tea;2,49;1,10\n').rows[0]).toMatchObject({ regular_price: 2.49, unit_cost: 1.1 });
    const bad = parsePriceList('sku,name,regular_price\nA,Tea,"2,49"\n');
    expect(bad.errors[0]).toMatchObject({ row: 2, column: 'regular_price', message: expect.stringMatching(/plain number/) });
  });

  it('lists every row error with its row number and keeps the preview', () => {
    const p = parsePriceList('sku,name,regular_price,unit_cost\n,Tea,2.49,\nB,,0,\nC,Jam,€3,-1\nD,Oil,4.99,2\n');
    expect(p.rows).toEqual([]);
    expect(p.preview.map((r) => r.sku)).toEqual(['D']);
    expect(p.errors.map((e) => [e.row, e.column])).toEqual([[2, 'sku'], [3, 'name'], [3, 'regular_price'], [4, 'regular_price'], [4, 'unit_cost']]);
    expect(p.errors[2].message).toMatch(/above 0/);
    expect(p.errors[4].message).toMatch(/cannot be negative/);
  });

  it('an empty file and a header with no rows are file-level errors', () => {
    expect(parsePriceList('').errors[0]).toMatchObject({ row: null, message: expect.stringMatching(/empty/) });
    expect(parsePriceList('sku,name,regular_price\n').errors[0].message).toMatch(/no item rows/);
  });

  it('the demo fixture is exactly the seeded demo list, and it parses cleanly', () => {
    const fixture = readFileSync(path.resolve(__dirname, '../../fixtures/demo-price-list.csv'), 'utf8');
    expect(fixture).toBe(demoPriceListCsv());
    const p = parsePriceList(fixture);
    expect(p.errorCount).toBe(0);
    expect(p.rows).toHaveLength(demoPriceListRows().length);
    expect(p.rows.length).toBeGreaterThanOrEqual(190);
  });
});

const row = (sku: string, price: number, flags: Partial<FloorRow> = {}): FloorRow => ({
  sku, name: `Item ${sku}`, category: null, regularPrice: price, unitCost: null,
  floorFraction: 0.1, floorAmount: price / 10, promoPrice: Math.floor(price * 90) / 100, discountAfterEnding: 0.1,
  marginBefore: null, marginAfter: null, outsideRange: false, deeperThanMargin: false, noPromoPrice: false,
  endingSkipped: false, noThreshold: false, bound: null, ...flags,
});

describe('queryRows: server-side paging for big plans', () => {
  const rows = [row('C-3', 30, { outsideRange: true }), row('A-1', 10, { deeperThanMargin: true, marginAfter: -1 }), row('B-2', 20), row('D-4', 40, { marginAfter: 5 })];
  const q = (o: Record<string, unknown>) => queryRows(rows, rowQuerySchema.parse(o));

  it('sorts, with empty values last in both directions', () => {
    expect(q({ sort: 'regularPrice', dir: 'desc' }).rows.map((r) => r.sku)).toEqual(['D-4', 'C-3', 'B-2', 'A-1']);
    expect(q({ sort: 'marginAfter', dir: 'asc' }).rows.map((r) => r.sku)).toEqual(['A-1', 'D-4', 'C-3', 'B-2']);
    expect(q({ sort: 'marginAfter', dir: 'desc' }).rows.map((r) => r.sku)).toEqual(['D-4', 'A-1', 'C-3', 'B-2']);
  });

  it('filters by flag, searches SKU and name, and pages', () => {
    expect(q({ flag: 'flagged' }).rows.map((r) => r.sku)).toEqual(['A-1', 'C-3']);
    expect(q({ flag: 'outsideRange' }).total).toBe(1);
    expect(q({ flag: 'unflagged' }).rows.map((r) => r.sku)).toEqual(['B-2', 'D-4']);
    expect(q({ q: 'b-2' }).rows.map((r) => r.sku)).toEqual(['B-2']);
    const page = q({ pageSize: 10, page: 0 });
    expect(page.total).toBe(4);
    expect(q({ pageSize: 10, page: 1 }).rows).toEqual([]);
  });

  it('summarises counts and the average floor', () => {
    expect(summarisePlan(rows)).toMatchObject({ items: 4, outsideRange: 1, deeperThanMargin: 1, noPromoPrice: 0, averageFloor: 0.1, minRegularPrice: 10, maxRegularPrice: 40 });
  });
});

describe('plan exports', () => {
  it('CSV: plain headers with units, one row per item, spreadsheet-safe', () => {
    const csv = planCsv('EUR', [row('HL-1', 12.99, { category: 'Kitchen, tools', unitCost: 6, marginBefore: 6.99, marginAfter: 5.69, deeperThanMargin: false, promoPrice: 11.69, floorFraction: 0.09876, floorAmount: 1.2829, discountAfterEnding: 0.1 })]);
    const parsed = Papa.parse<string[]>(csv.trim(), { header: false });
    expect(parsed.data[0]).toEqual(planCsvHeader('EUR'));
    expect(parsed.data[0]).toEqual(expect.arrayContaining(['Regular price (EUR)', 'Promo floor (% off)', 'Promo floor (EUR off)', 'Promo price (EUR)', 'Margin before (EUR/unit)', 'Margin after (EUR/unit)', 'Outside tested range', 'Deeper than margin']));
    expect(parsed.data[1]).toEqual(['HL-1', 'Item HL-1', 'Kitchen, tools', '12.99', '6', '9.88', '1.28', '11.69', '10', '6.99', '5.69', 'no', 'no', 'no', 'no', 'no', '']);
    expect(csv.endsWith('\r\n')).toBe(true);
  });

  it('CSV: the Fit basis column says per item whether its floor is measured or borrowed', () => {
    const source = fitSourceOf([{ id: 's', name: 'Kitchen', category: 'Kitchen, tools' }], ['Kitchen, tools', 'Garden']);
    const csv = planCsv('EUR', [row('HL-1', 12.99, { category: 'Kitchen, tools' }), row('G-1', 19.99, { category: 'Garden' })], source);
    const parsed = Papa.parse<string[]>(csv.trim(), { header: false }).data;
    expect(parsed[0].at(-1)).toBe('Fit basis');
    expect(parsed[1].at(-1)).toBe('measured: “Kitchen” (Kitchen, tools)');
    expect(parsed[2].at(-1)).toBe('borrowed from “Kitchen” (Kitchen, tools)');
  });

  it('the about side file carries the settings, the cautions and the poor-fit warning', () => {
    const h: PlanExportHeader = {
      plan: { id: 'p', name: 'Spring', createdAt: '2026-03-01T00:00:00Z' }, study: { id: 's', name: 'Kitchen', task: 'spot' }, segment: null,
      fitVersion: 7, exclusionRules: { attention: { enabled: true } }, model: 'Power', target: 0.75, ending: 'Ends in .99',
      priceList: { id: 'l', name: 'Range', currency: 'EUR', itemCount: 200 }, testedBasePrices: [3.49, 449], poorFit: true,
      basis: 'point', share: null, tolerance: 0.02,
    };
    const rows = Papa.parse<string[]>(planAboutCsv(h, '2026-03-02T10:00:00Z').trim()).data;
    const get = (k: string) => rows.find((r) => r[0] === k)?.[1];
    expect(get('Fit version (study data version)')).toBe('7');
    expect(get('Target notice rate')).toBe('75 %');
    expect(get('Fit flagged as poor')).toBe('yes');
    expect(rows[0]).toEqual(['Field', 'Value']);
    expect(get('Warning')).toBe(POOR_FIT_WARNING);
    const texts = rows.map((r) => r[1]);
    expect(texts).toContain(POOR_FIT_WARNING);
    for (const c of PRICE_CLAIM_CAUTIONS) expect(texts).toContain(c);
    expect(texts.join(' ')).toMatch(/16 CFR Part 233/);
    expect(texts.join(' ')).toMatch(/Directive 98\/6\/EC, Art\. 6a/);
  });
});
