import Papa from 'papaparse';
import {
  PRICE_LIST_COLUMNS, PRICE_LIST_MAX_ROWS, PRICE_LIST_REQUIRED_COLUMNS, priceListRowSchema, type PriceListRow,
} from '@/lib/schemas/price-list.schema';

/** One problem in the file; `row` counts file rows with the header as row 1, null for the whole file. */
export interface UploadIssue {
  row: number | null;
  column: string | null;
  message: string;
}

export interface ParsedPriceList {
  /** Data rows in file order, with their file row number. Empty when any error was found. */
  rows: (PriceListRow & { row: number })[];
  /** First rows as read, for the preview (even when other rows have errors). */
  preview: (PriceListRow & { row: number })[];
  /** Data rows found (blank lines skipped). */
  rowCount: number;
  columns: string[];
  errors: UploadIssue[];
  /** Errors beyond this many are counted, not listed. */
  errorCount: number;
}

export const PREVIEW_ROWS = 20;
export const MAX_LISTED_ERRORS = 1000;

const isBlank = (r: string[]) => r.length === 0 || r.every((c) => c.trim() === '');

/** Parses and validates a price list CSV; pure, so the route handler and the tests share it. */
export function parsePriceList(text: string): ParsedPriceList {
  const errors: UploadIssue[] = [];
  let errorCount = 0;
  const add = (issue: UploadIssue) => {
    errorCount++;
    if (errors.length < MAX_LISTED_ERRORS) errors.push(issue);
  };
  const empty = (columns: string[] = []): ParsedPriceList => ({ rows: [], preview: [], rowCount: 0, columns, errors, errorCount });

  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { header: false, skipEmptyLines: false });
  const records = parsed.data;
  const headerIndex = records.findIndex((r) => !isBlank(r));
  if (headerIndex < 0) {
    add({ row: null, column: null, message: 'The file is empty. The first row must be the header: sku,name,regular_price,unit_cost,category.' });
    return empty();
  }
  const header = records[headerIndex].map((h) => h.trim().toLowerCase().replace(/\s+/g, '_'));
  const missing = PRICE_LIST_REQUIRED_COLUMNS.filter((c) => !header.includes(c));
  for (const c of missing) add({ row: null, column: c, message: `The header has no “${c}” column. Expected columns: ${PRICE_LIST_COLUMNS.join(', ')} (unit_cost and category optional).` });
  const seen = new Set<string>();
  for (const h of header) {
    if (h && seen.has(h)) add({ row: null, column: h, message: `The column “${h}” appears twice in the header.` });
    seen.add(h);
  }
  if (errorCount > 0) return empty(header);

  const rowCount = records.reduce((n, r, i) => (i > headerIndex && !isBlank(r) ? n + 1 : n), 0);
  if (rowCount > PRICE_LIST_MAX_ROWS) {
    add({ row: null, column: null, message: `The file has ${rowCount.toLocaleString('en-GB')} item rows; a price list holds at most ${PRICE_LIST_MAX_ROWS.toLocaleString('en-GB')}. Split it into several lists.` });
    return { ...empty(header), rowCount };
  }
  if (rowCount === 0) {
    add({ row: null, column: null, message: 'The file has a header but no item rows.' });
    return empty(header);
  }

  const col = Object.fromEntries(PRICE_LIST_COLUMNS.map((c) => [c, header.indexOf(c)])) as Record<(typeof PRICE_LIST_COLUMNS)[number], number>;
  // Papaparse reports structural problems (unclosed quotes, wrong field counts) per record.
  const structural = new Map<number, string>();
  for (const e of parsed.errors) if (e.type !== 'Delimiter' && typeof e.row === 'number') structural.set(e.row, e.message);
  const schema = priceListRowSchema(parsed.meta.delimiter !== ',');
  const rows: (PriceListRow & { row: number })[] = [];
  const firstRowOfSku = new Map<string, number>();
  for (let i = headerIndex + 1; i < records.length; i++) {
    const r = records[i];
    if (isBlank(r)) continue;
    const rowNo = i + 1;
    if (structural.has(i)) add({ row: rowNo, column: null, message: `This row could not be read: ${structural.get(i)}.` });
    if (r.length > header.length && r.slice(header.length).some((c) => c.trim() !== '')) {
      add({ row: rowNo, column: null, message: `This row has ${r.length} cells but the header has ${header.length} columns.` });
    }
    const cell = (c: keyof typeof col) => (col[c] >= 0 ? (r[col[c]] ?? '') : '');
    const result = schema.safeParse({ sku: cell('sku'), name: cell('name'), regular_price: cell('regular_price'), unit_cost: cell('unit_cost'), category: cell('category') });
    if (!result.success) {
      for (const issue of result.error.issues) add({ row: rowNo, column: String(issue.path[0] ?? ''), message: issue.message });
      continue;
    }
    const first = firstRowOfSku.get(result.data.sku);
    if (first !== undefined) add({ row: rowNo, column: 'sku', message: `SKU ${result.data.sku} appears again (first on row ${first}); each SKU only once per list.` });
    else firstRowOfSku.set(result.data.sku, rowNo);
    const d = result.data;
    rows.push({ row: rowNo, sku: d.sku, name: d.name, regular_price: d.regular_price, unit_cost: d.unit_cost, category: d.category });
  }
  const preview = rows.slice(0, PREVIEW_ROWS);
  return { rows: errorCount > 0 ? [] : rows, preview, rowCount, columns: header, errors, errorCount };
}
