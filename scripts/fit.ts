// Command-line fit: `npm run fit -- FILE.csv [--task pick|spot|trip] [--bootstrap N]
// [--seed S] [--target P] [--guess G] [--lapse L] [--interval percentile|bca] [--monte-carlo-p]`.
// Reads trial rows (base_price,discount,response, optionally respondent) or cell rows
// (base_price,discount,n,k) and prints the analysis report as one JSON document. With a
// respondent column every row must name its shopper, and the intervals and tests resample
// whole shoppers (the report's `unit: 'shopper'`); without one they assume independent
// trials (`unit: 'trial'`). Bad input: one stderr line, exit code 2.
import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import { aggregateTrials } from '../lib/psychometrics/aggregate';
import { analyse, PsychometricsInputError } from '../lib/psychometrics/analyse';
import type { Cell, CatchCell, IntervalMethod, ShopperCell, Task, TrialRow } from '../lib/psychometrics/types';

class BadInput extends Error {}

function parseArgs(argv: string[]) {
  const opts: Record<string, string | true> = {};
  let file: string | undefined;
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === '--monte-carlo-p') opts['monte-carlo-p'] = true;
    else if (a.startsWith('--')) {
      const [name, inline] = a.slice(2).split('=', 2);
      const v = inline ?? argv[++i];
      if (v === undefined) throw new BadInput(`option --${name} needs a value`);
      opts[name] = v;
    } else if (!file) file = a;
    else throw new BadInput(`unexpected argument ${a}`);
  }
  if (!file) throw new BadInput('usage: npm run fit -- FILE.csv [--task pick|spot|trip] [--bootstrap N] [--seed S] [--target P] [--guess G] [--lapse L]');
  const known = ['task', 'bootstrap', 'seed', 'target', 'guess', 'lapse', 'interval', 'monte-carlo-p'];
  for (const k of Object.keys(opts)) if (!known.includes(k)) throw new BadInput(`unknown option --${k}`);
  return { file, opts };
}

function num(opts: Record<string, string | true>, name: string): number | undefined {
  const v = opts[name];
  if (v === undefined) return undefined;
  const x = Number(v);
  if (v === true || v.trim() === '' || !Number.isFinite(x)) throw new BadInput(`option --${name} must be a number, got ${String(v)}`);
  return x;
}

function field(row: Record<string, string>, name: string, line: number, check: (x: number) => boolean, what: string): number {
  const raw = (row[name] ?? '').trim();
  const x = Number(raw);
  if (raw === '' || !Number.isFinite(x) || !check(x)) throw new BadInput(`line ${line}: ${name} ${what}, got '${raw}'`);
  return x;
}

function readRows(file: string): { cells: Cell[]; catchCells: CatchCell[]; shopperCells?: ShopperCell[] } {
  let text: string;
  try { text = readFileSync(file, 'utf8'); } catch { throw new BadInput(`cannot read ${file}`); }
  const parsed = Papa.parse<Record<string, string>>(text.replace(/^\uFEFF/, ''), {
    header: true, skipEmptyLines: true, transformHeader: (h) => h.trim().toLowerCase(),
  });
  if (parsed.errors.length) {
    const e = parsed.errors[0];
    throw new BadInput(`line ${(e.row ?? 0) + 2}: ${e.message}`);
  }
  const cols = parsed.meta.fields ?? [];
  const isCells = cols.includes('n') && cols.includes('k');
  const need = isCells ? ['base_price', 'discount', 'n', 'k'] : ['base_price', 'discount', 'response'];
  for (const c of need) if (!cols.includes(c)) throw new BadInput(`line 1: missing column ${c} (need base_price,discount,response or base_price,discount,n,k)`);
  if (parsed.data.length === 0) throw new BadInput('the file has no data rows');
  const price = (x: number) => x > 0;
  const count = (x: number) => Number.isInteger(x) && x >= 0;
  const frac = (x: number) => x >= 0 && x < 1;
  if (!isCells) {
    const withIds = cols.includes('respondent');
    const rows: TrialRow[] = parsed.data.map((r, i) => {
      const row: TrialRow = {
        basePrice: field(r, 'base_price', i + 2, price, 'must be a number above 0'),
        discount: field(r, 'discount', i + 2, frac, 'must be a fraction from 0 (catch trial) to below 1'),
        response: field(r, 'response', i + 2, (x) => x === 0 || x === 1, 'must be 0 or 1') as 0 | 1,
      };
      if (withIds) {
        const id = (r.respondent ?? '').trim();
        if (id === '') throw new BadInput(`line ${i + 2}: respondent is empty (every row needs its shopper when the column is present)`);
        row.respondent = id;
      }
      return row;
    });
    return withIds ? { ...aggregateTrials(rows), shopperCells: shopperCellsOf(rows) } : aggregateTrials(rows);
  }
  const cells: Cell[] = [];
  const catchCells: CatchCell[] = [];
  parsed.data.forEach((r, i) => {
    const line = i + 2;
    const basePrice = field(r, 'base_price', line, price, 'must be a number above 0');
    const discount = field(r, 'discount', line, frac, 'must be a fraction from 0 (catch trials) to below 1');
    const n = field(r, 'n', line, count, 'must be a whole number ≥ 0');
    const k = field(r, 'k', line, count, 'must be a whole number ≥ 0');
    if (k > n) throw new BadInput(`line ${line}: k (${k}) exceeds n (${n})`);
    if (discount === 0) catchCells.push({ basePrice, n, k }); else cells.push({ basePrice, discount, n, k });
  });
  return { cells, catchCells };
}

/** Trial rows → one row per shopper, base and discount (discount 0: catch trials). */
function shopperCellsOf(rows: TrialRow[]): ShopperCell[] {
  const map = new Map<string, ShopperCell>();
  for (const r of rows) {
    const key = `${r.respondent}\u0000${r.basePrice}|${r.discount}`;
    let c = map.get(key);
    if (!c) { c = { respondent: r.respondent!, basePrice: r.basePrice, discount: r.discount, n: 0, k: 0 }; map.set(key, c); }
    c.n++;
    c.k += r.response;
  }
  return [...map.values()];
}

// Numeric seeds stay numbers in the report; the generator treats 42 and '42' alike.
function seedOf(v: string | true | undefined): number | string | undefined {
  if (typeof v !== 'string') return undefined;
  return /^-?\d+$/.test(v) ? Number(v) : v;
}

function main(): number {
  try {
    const { file, opts } = parseArgs(process.argv.slice(2));
    const task = (opts.task ?? 'spot') as Task;
    if (!['spot', 'pick', 'trip'].includes(task)) throw new BadInput(`--task must be spot, pick or trip, got ${String(task)}`);
    const interval = (opts.interval ?? 'percentile') as IntervalMethod;
    const { cells, catchCells, shopperCells } = readRows(file);
    const report = analyse({
      cells, catchCells: task === 'spot' ? catchCells : [], task,
      shopperCells: shopperCells ? (task === 'spot' ? shopperCells : shopperCells.filter((r) => r.discount !== 0)) : undefined,
      bootstrap: num(opts, 'bootstrap'), seed: seedOf(opts.seed),
      target: num(opts, 'target'), guess: num(opts, 'guess'), lapse: num(opts, 'lapse'),
      intervalMethod: interval, monteCarloP: opts['monte-carlo-p'] === true,
    });
    if (task !== 'spot' && catchCells.length) report.warnings.push(`catch trials ignored: the ${task} task does not estimate a guess rate from them`);
    process.stdout.write(JSON.stringify(report, null, 2) + '\n');
    return 0;
  } catch (e) {
    if (e instanceof BadInput || e instanceof PsychometricsInputError) {
      process.stderr.write(`fit: ${e.message.replace(/\s+/g, ' ')}\n`);
      return 2;
    }
    throw e;
  }
}

process.exitCode = main();
