import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import Papa from 'papaparse';
import { beforeAll, describe, expect, it } from 'vitest';
import { GET as exportGet } from '@/app/api/w/[workspace]/studies/[study]/exports/[file]/route';
import { GET as resultsGet } from '@/app/api/w/[workspace]/studies/[study]/results/route';
import type { FitState } from '@/lib/server/analysis/study-fit';
import type { AnalysisReport } from '@/lib/psychometrics/report-types';
import { callRoute, makeMember, makeWorkspace, signInAs } from '../support/factories';
import { fitNow, makeSimulatedStudy } from '../support/studies';

describe('results of a seeded study equal the fit CLI on its exported raw trials', () => {
  let ws: Awaited<ReturnType<typeof makeWorkspace>>;
  let studyId: string;
  beforeAll(async () => {
    ws = await makeWorkspace();
    ({ studyId } = await makeSimulatedStudy(ws.slug, { sim: { respondents: 36 } }));
    await fitNow(studyId);
  });

  it('same engine, same numbers (1,000 bootstrap samples, seed 1)', async () => {
    signInAs(await makeMember(ws.slug, 'viewer'));
    const state = (await (await callRoute(resultsGet, { params: { workspace: ws.slug, study: studyId } })).json()) as FitState;
    expect(state.fit.status).toBe('ready');
    if (state.fit.status !== 'ready') return;
    const res = await callRoute(exportGet, { params: { workspace: ws.slug, study: studyId, file: 'trials.csv' } });
    expect(res.status).toBe(200);
    const csv = await res.text();
    const rows = Papa.parse<Record<string, string>>(csv, { header: true, skipEmptyLines: true }).data;
    expect(rows.length).toBe(state.counts!.trials.before);
    // The app fits the respondents its rules keep; the CLI gets the same rows.
    const kept = rows.filter((r) => r.excluded_by === '');
    expect(kept.length).toBe(state.counts!.trials.after);
    const dir = mkdtempSync(path.join(tmpdir(), 'nw-cli-'));
    const file = path.join(dir, 'kept.csv');
    // With the respondent column the CLI resamples whole shoppers, as the app does.
    writeFileSync(file, Papa.unparse(kept.map((r) => ({ respondent: r.respondent, base_price: r.base_price, discount: r.discount, response: r.response }))));
    const out = execFileSync(path.resolve('node_modules/.bin/tsx'), ['scripts/fit.ts', file, '--task', 'spot', '--bootstrap', '1000', '--seed', '1'], { encoding: 'utf8' });
    const cli = JSON.parse(out) as AnalysisReport;
    const app = state.fit.report;
    expect(cli.bases.map((b) => b.basePrice)).toEqual(app.bases.map((b) => b.basePrice));
    cli.bases.forEach((b, j) => {
      expect(b.threshold.fraction === null).toBe(app.bases[j].threshold.fraction === null);
      expect(Math.abs((b.threshold.fraction ?? 0) - (app.bases[j].threshold.fraction ?? 0))).toBeLessThan(1e-9);
      expect(Math.abs(b.threshold.fractionCi![0] - app.bases[j].threshold.fractionCi![0])).toBeLessThan(1e-9);
      expect(Math.abs(b.threshold.fractionCi![1] - app.bases[j].threshold.fractionCi![1])).toBeLessThan(1e-9);
      expect(Math.abs(b.slope - app.bases[j].slope)).toBeLessThan(1e-9);
    });
    expect(Math.abs(cli.models.power.weberSlope! - app.models.power.weberSlope!)).toBeLessThan(1e-9);
    expect(cli.intervalMethod).toBe(app.intervalMethod);
    expect(app.unit).toBe('shopper');
    expect(cli.unit).toBe('shopper');
  });

  it('thresholds CSV: one row per base price, plain column names with units; JSON header block', async () => {
    signInAs(await makeMember(ws.slug, 'viewer'));
    const res = await callRoute(exportGet, { params: { workspace: ws.slug, study: studyId, file: 'thresholds.csv' } });
    expect(res.headers.get('content-type')).toMatch(/text\/csv/);
    const text = await res.text();
    expect(text.charCodeAt(0)).not.toBe(0xfeff);
    const [header, ...lines] = text.trim().split('\r\n');
    expect(header).toContain('Base price (EUR),Notice threshold (% of base price),Notice threshold (EUR),95% interval low (%)');
    expect(lines).toHaveLength(5);
    const json = await (await callRoute(exportGet, { params: { workspace: ws.slug, study: studyId, file: 'thresholds.json' } })).json();
    expect(json.about).toMatchObject({ dataVersion: 1, currency: 'EUR' });
    expect(json.about.exclusionRules.length).toBeGreaterThan(0);
    expect(json.about.intervalMethod).toMatch(/respondent-level bootstrap \(whole shoppers resampled, \d+ shoppers\), 1000 samples/);
    expect(json.about.unit).toMatch(/^shopper/);
    expect(json.about.testWeberVsPower).toMatch(/respondent-level bootstrap SE/);
    expect(json.about.bootstrapFailures).toMatch(/of 1000 samples non-finite/);
    expect(header).toContain('Threshold bound');
    // the shopper spread travels with the thresholds: shares of shoppers per base, σ in the header block
    expect(header).toContain('Discount 75 % of shoppers notice (%),Discount 75 % of shoppers notice 95% low (%)');
    expect(header).toContain('Middle half of shoppers low (%)');
    expect(json.about.shopperSpread).toMatch(/^σ \d\.\d{3} \(95 % interval \d\.\d{3} to \d\.\d{3}\): SD of shoppers' ln thresholds/);
    expect(json.about.shopperSpreadMethod).toMatch(/profile likelihood/);
    const r0 = json.thresholds[0] as Record<string, number | string | null>;
    expect(typeof r0['Discount 50 % of shoppers notice (%)'] === 'number' || r0['Shares of shoppers bound'] !== '').toBe(true);
    expect(json.about.cautions.join(' ')).toMatch(/16 CFR Part 233/);
    const about = await (await callRoute(exportGet, { params: { workspace: ws.slug, study: studyId, file: 'thresholds-about.csv' } })).text();
    expect(about.split('\r\n')[0]).toBe('Field,Value');
  });

  it('per-segment thresholds wait for their fits (202), then list one row per answer and base price', async () => {
    signInAs(ws.owner);
    const params = { workspace: ws.slug, study: studyId, file: 'thresholds.csv' };
    const url = 'http://127.0.0.1/x?segment=shop_often';
    const first = await callRoute(exportGet, { params, url });
    expect(first.status).toBe(202);
    for (const answer of ['Every month', 'A few times a year', 'Rarely']) await fitNow(studyId, { segment: { questionId: 'shop_often', answer } });
    const res = await callRoute(exportGet, { params, url });
    expect(res.status).toBe(200);
    const lines = (await res.text()).trim().split('\r\n');
    expect(lines).toHaveLength(1 + 15);
    expect(lines[1]).toContain('How often do you shop this category?');
  });

  it('a foreign study is a 404 for exports', async () => {
    const other = await makeWorkspace();
    signInAs(other.owner);
    const res = await callRoute(exportGet, { params: { workspace: other.slug, study: studyId, file: 'report.json' } });
    expect(res.status).toBe(404);
  });
});
