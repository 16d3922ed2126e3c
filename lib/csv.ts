// CSV writing shared by every export: UTF-8 without BOM, RFC 4180 quoting (fields with a comma,
// quote, CR or LF are quoted; quotes doubled), CRLF record separators, and text cells that a
// spreadsheet would run as a formula (=, +, -, @, tab, CR at the start) prefixed with a quote,
// as the OWASP guidance on CSV injection recommends. Numbers are written as plain numbers.

export type CsvValue = string | number | boolean | null | undefined;

const FORMULA_START = /^[=+\-@\t\r]/;

export function csvCell(v: CsvValue): string {
  if (v === null || v === undefined) return '';
  if (typeof v === 'number') return Number.isFinite(v) ? String(v) : '';
  if (typeof v === 'boolean') return v ? 'true' : 'false';
  let s = v;
  if (FORMULA_START.test(s) && !/^-?\d+(\.\d+)?$/.test(s)) s = `'${s}`;
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function csvLine(values: CsvValue[]): string {
  return values.map(csvCell).join(',');
}

/** A whole document: header row, then the rows, each line ending in CRLF. */
export function toCsv(header: string[], rows: CsvValue[][]): string {
  let out = csvLine(header) + '\r\n';
  for (const r of rows) out += csvLine(r) + '\r\n';
  return out;
}

/** Rounds for display in exports without float noise (e.g. 0.1 + 0.2); full precision lives in the JSON. */
export function round(v: number | null | undefined, digits = 6): number | null {
  if (v === null || v === undefined || !Number.isFinite(v)) return null;
  const f = 10 ** digits;
  return Math.round(v * f) / f;
}
