import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const root = path.resolve(__dirname, '../../..');
const fixture = (f: string) => path.join('tests/fixtures/psychometrics', f);
const run = (...args: string[]) => spawnSync('npx', ['tsx', 'scripts/fit.ts', ...args], { cwd: root, encoding: 'utf8', timeout: 60000 });

// Each case starts tsx in a child process: slow on a busy machine, hence the timeout.
describe('npm run fit (scripts/fit.ts)', { timeout: 60_000 }, () => {
  it('fits cell rows and prints the report as JSON', () => {
    const r = run(fixture('example-cells.csv'), '--task', 'spot', '--bootstrap', '100', '--seed', '7');
    expect(r.status).toBe(0);
    const doc = JSON.parse(r.stdout);
    expect(doc.task).toBe('spot');
    expect(doc.seed).toBe(7);
    expect(doc.bootstrapSamples).toBe(100);
    expect(doc.bases.map((b: { basePrice: number }) => b.basePrice)).toEqual([9.99, 199]);
    // γ is fitted with the catch trials in the likelihood: near their rate 5/60, with an interval
    expect(Math.abs(doc.bases[0].guess - 5 / 60)).toBeLessThan(0.03);
    expect(doc.bases[0].guessCi).toHaveLength(2);
    expect(doc.unit).toBe('trial');
    expect(doc.bases[0].nTrials).toBe(160);
    // 160 trials per base without shopper ids: too few for a calibrated interval, and it says so
    expect(doc.bases[0].threshold.fractionCi).toBeNull();
    expect(doc.warnings.join(' ')).toMatch(/base 9.99: too few trials for a reliable interval \(160;/);
    for (const m of ['free', 'weber', 'constantAmount', 'power']) expect(doc.models[m].thresholds).toHaveLength(2);
    expect(doc.models.power.weberSlopeCi).toHaveLength(2);
    expect(doc.tests.weberVsPower.df).toBe(1);
    expect(doc.intervalMethod).toMatch(/parametric bootstrap, 100 samples, percentile, 95 %; intervals assume independent trials/);
    expect(doc.tests.constantVsPower.df).toBe(1);
    expect(doc.tests.weberVsPower.method).toMatch(/too few trials for a calibrated test without shopper ids/);
  });

  it('fits trial rows, ignores extra columns, and honours --lapse and --target', () => {
    const r = run(fixture('example-trials.csv'), '--task', 'pick', '--bootstrap', '0', '--lapse', '0', '--target', '0.75');
    expect(r.status).toBe(0);
    const doc = JSON.parse(r.stdout);
    expect(doc.target).toBe(0.75);
    expect(doc.bases.every((b: { lapse: number; guess: number }) => b.lapse === 0 && b.guess === 0.5)).toBe(true);
    expect(doc.bases[0].nTrials).toBe(96);
    expect(doc.warnings.join(' ')).toMatch(/catch trials ignored/);
    // the respondent column makes the shopper the unit
    expect(doc.unit).toBe('shopper');
    expect(doc.shoppers).toBeGreaterThan(1);
  });

  it('a respondent column with an empty cell is refused with its line', () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'nw-fit-'));
    const file = path.join(dir, 'ids.csv');
    writeFileSync(file, 'respondent,base_price,discount,response\nr1,4.99,0.02,0\n,4.99,0.04,1\n');
    const r = run(file);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/line 3: respondent is empty/);
  });

  it('a bad file: one stderr line naming the row, exit code 2', () => {
    const r = run(fixture('bad-row.csv'));
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/line 3: response must be 0 or 1, got 'yes'/);
  });

  it('a bad option exits 2 as well', () => {
    const r = run(fixture('example-cells.csv'), '--bootstrap', 'many');
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/--bootstrap must be a number/);
  });
});
