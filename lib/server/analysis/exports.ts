import 'server-only';
import type { AnalysisReport } from '@/lib/psychometrics/report-types';
import { round, toCsv, type CsvValue } from '@/lib/csv';
import { describeRules } from '@/lib/schemas/exclusions.schema';
import { fitCautions, modelLabel } from '@/lib/results-text';
import { getFitState, isPoorFit, type FitState, type Segment } from './study-fit';
import { em } from '@/lib/server/db/orm';
import { sql } from '@/lib/server/db/sql';
import { AppError, notFoundError } from '@/lib/server/http/errors';
import { csvFile, jsonFile, type FileDownload, type PendingFile } from '@/lib/server/http/download';
import type { WorkspaceContext } from '@/lib/server/team/membership';
import { findStudy, respondentRows, screen } from './cells';

// Export files, shared by the signed-in routes and the token API (/api/v1). Thresholds come as
// CSV (with a side file thresholds-about.csv holding the header block as Field,Value rows, so
// the table itself opens cleanly in a spreadsheet) and as JSON (header block + rows).
// A threshold the data only bound (nobody noticed the deepest rung, or everybody the
// shallowest) has no number: the CSV's threshold cells stay empty and the "Threshold bound"
// column says "> 24 %" / "< 1 %"; the JSON carries `bound`. The about block names the unit
// (shopper or trial), the interval and test methods and the bootstrap failures, and the shopper
// spread (σ with its interval and method, the mixed model's guess rates); each threshold row
// carries the discounts 50 / 75 / 90 % of shoppers notice with their intervals (or a bound) and
// the middle half of shoppers, empty where no mixed model was fitted (segment groups, no ids).

export const EXPORT_FILES = ['thresholds.csv', 'thresholds-about.csv', 'thresholds.json', 'report.json', 'trials.csv'] as const;
export type ExportFile = (typeof EXPORT_FILES)[number];

export class ExportPending extends Error {}

/** Every fit the export needs (the whole study, or one per answer of a segment question), ready. */
async function readyFits(ctx: WorkspaceContext, studyId: string, segmentQuestion: string | null) {
  const all = await getFitState(ctx, studyId);
  const groups: { segment: Segment | null; state: FitState }[] = [];
  if (segmentQuestion) {
    const q = all.study.design.segmentQuestions.find((x) => x.id === segmentQuestion);
    if (!q) throw new AppError(422, 'validation_failed', `This study has no segment question "${segmentQuestion}".`);
    for (const answer of q.options) {
      const segment = { questionId: q.id, answer };
      groups.push({ segment, state: await getFitState(ctx, studyId, { segment }) });
    }
  } else groups.push({ segment: null, state: all });
  if (all.fit.status === 'empty') throw new AppError(409, 'conflict', all.fit.message);
  if ([all, ...groups.map((g) => g.state)].some((s) => s.fit.status === 'pending')) throw new ExportPending('The fit is still being computed; try again in a few seconds.');
  return { all, groups };
}

function about(state: FitState, report: AnalysisReport, segmentQuestion: string | null) {
  const s = state.study;
  const q = segmentQuestion ? s.design.segmentQuestions.find((x) => x.id === segmentQuestion) : null;
  return {
    study: s.name,
    studyId: s.id,
    item: s.design.itemName,
    category: s.design.category,
    currency: s.design.currency,
    task: s.design.task,
    dataVersion: s.dataVersion,
    generatedAt: new Date().toISOString(),
    exclusionRules: describeRules(s.exclusionRules, s.design.task),
    exclusionRulesRaw: s.exclusionRules,
    respondents: state.counts?.respondents ?? null,
    trials: state.counts?.trials ?? null,
    preferredModel: modelLabel(report.preferredModel),
    weberSlope: report.models.power.weberSlope,
    weberSlopeInterval: report.models.power.weberSlopeCi,
    target: report.targetMeaning === 'mid-point' ? 'curve mid-point (half-way between guess rate and 1 − lapse)' : `notice rate ${report.target}`,
    unit: report.unit === 'shopper' ? `shopper (${report.shoppers ?? '?'} respondents resampled as whole units)` : 'trial (intervals assume independent trials)',
    intervalMethod: report.intervalMethod,
    testWeberVsPower: testText(report.tests.weberVsPower),
    testPowerVsFree: testText(report.tests.powerVsFree),
    testConstantVsPower: report.tests.constantVsPower ? testText(report.tests.constantVsPower) : null,
    bootstrapFailures: report.bootstrapFailures ? `${report.bootstrapFailures.nonFinite} of ${report.bootstrapSamples} samples non-finite, ${report.bootstrapFailures.notConverged} with a refit that did not converge` : null,
    segmentQuestion: q ? q.text : null,
    shopperSpread: spreadText(report.shopperSpread),
    shopperSpreadMethod: report.shopperSpread?.sigmaMethod ?? null,
    guessRatesMixedModel: report.shopperSpread?.guess?.length
      ? report.shopperSpread.guess.map((g) => `${g.bases.join(', ')}: ${round(g.value * 100, 3)} %${g.ci ? ` (95 % ${round(g.ci[0] * 100, 3)} to ${round(g.ci[1] * 100, 3)} %)` : ''}`).join('; ')
      : null,
    cautions: fitCautions(report, isPoorFit(report)),
  };
}

function spreadText(sp: AnalysisReport['shopperSpread']): string | null {
  if (!sp) return null;
  const ci = sp.sigmaCi ? `95 % interval ${sp.sigmaCi[0].toFixed(3)} to ${sp.sigmaCi[1].toFixed(3)}` : 'no interval';
  return `σ ${sp.sigma.toFixed(3)} (${ci}): SD of shoppers' ln thresholds, mixed model ${modelLabel(sp.model)}, ${sp.shoppers} shoppers${sp.converged ? '' : ', did not converge'}`;
}

const SHARE_LABELS = [50, 75, 90] as const;

/** The share-of-shoppers columns of one base (empty cells without a mixed model, e.g. segment groups). */
function shareColumns(report: AnalysisReport, basePrice: number): Record<string, CsvValue> {
  const sb = report.shopperSpread?.bases.find((x) => x.basePrice === basePrice);
  const out: Record<string, CsvValue> = {};
  const bounds: string[] = [];
  for (const q of SHARE_LABELS) {
    const s = sb?.shares.find((x) => Math.round(x.share * 100) === q);
    out[`Discount ${q} % of shoppers notice (%)`] = round(s?.fraction == null ? null : s.fraction * 100, 4);
    out[`Discount ${q} % of shoppers notice 95% low (%)`] = round(s?.fractionCi ? s.fractionCi[0] * 100 : null, 4);
    out[`Discount ${q} % of shoppers notice 95% high (%)`] = round(s?.fractionCi ? s.fractionCi[1] * 100 : null, 4);
    if (s?.bound) bounds.push(`${q} %: ${boundText(s.bound)}`);
  }
  out['Shares of shoppers bound'] = bounds.join('; ');
  out['Middle half of shoppers low (%)'] = round(sb?.middleHalf ? sb.middleHalf[0] * 100 : null, 4);
  out['Middle half of shoppers high (%)'] = round(sb?.middleHalf ? sb.middleHalf[1] * 100 : null, 4);
  return out;
}

function testText(t: AnalysisReport['tests']['weberVsPower']): string {
  return `p = ${t.p === null ? '—' : t.p.toPrecision(3)} (LR ${t.chi2.toFixed(2)} on ${t.df} df; ${t.method ?? 'likelihood ratio, χ² reference'})`;
}

function boundText(b: AnalysisReport['bases'][number]['threshold']['bound'] | undefined): string {
  if (!b) return '';
  return `${b.kind === 'above' ? '>' : '<'} ${round(b.fraction * 100, 4)} %`;
}

function thresholdRows(state: FitState, report: AnalysisReport, segment: Segment | null, questionText: string | null) {
  const cur = state.study.design.currency;
  return report.bases.map((b) => ({
    'Segment question': questionText ?? '',
    'Segment answer': segment?.answer ?? 'All respondents',
    [`Base price (${cur})`]: b.basePrice,
    'Notice threshold (% of base price)': round(b.threshold.fraction === null ? null : b.threshold.fraction * 100, 4),
    [`Notice threshold (${cur})`]: round(b.threshold.amount, 4),
    '95% interval low (%)': round(b.threshold.fractionCi ? b.threshold.fractionCi[0] * 100 : null, 4),
    '95% interval high (%)': round(b.threshold.fractionCi ? b.threshold.fractionCi[1] * 100 : null, 4),
    [`95% interval low (${cur})`]: round(b.threshold.amountCi?.[0], 4),
    [`95% interval high (${cur})`]: round(b.threshold.amountCi?.[1], 4),
    'Threshold bound': boundText(b.threshold.bound),
    'Slope (per unit of ln discount)': round(b.slope, 4),
    'Lapse rate (%)': round(b.lapse * 100, 3),
    'Guess rate (%)': round(b.guess * 100, 3),
    'Trials': b.nTrials,
    'Deviance p-value': round(b.devianceP, 4),
    'Verdict': b.verdict,
    'Interval unit': report.unit ?? 'trial',
    ...shareColumns(report, b.basePrice),
  }));
}

async function thresholds(ctx: WorkspaceContext, studyId: string, segmentQuestion: string | null) {
  const { all, groups } = await readyFits(ctx, studyId, segmentQuestion);
  const q = segmentQuestion ? all.study.design.segmentQuestions.find((x) => x.id === segmentQuestion)! : null;
  const rows = groups.flatMap((g) => g.state.fit.status === 'ready' ? thresholdRows(g.state, g.state.fit.report, g.segment, q?.text ?? null) : []);
  const report = all.fit.status === 'ready' ? all.fit.report : null;
  return { all, report: report!, rows };
}

export async function exportFile(ctx: WorkspaceContext, studyId: string, file: ExportFile, opts: { segmentQuestion?: string | null } = {}): Promise<FileDownload> {
  const seg = opts.segmentQuestion || null;
  const stem = `study-${studyId.slice(0, 8)}`;
  if (file === 'trials.csv') return csvFile(`${stem}-trials.csv`, await trialsCsv(ctx, studyId));
  const { all, report, rows } = await thresholds(ctx, studyId, seg);
  if (file === 'thresholds.csv') {
    const header = Object.keys(rows[0] ?? {});
    return csvFile(`${stem}-thresholds.csv`, toCsv(header, rows.map((r) => Object.values(r) as CsvValue[])));
  }
  const head = about(all, report, seg);
  if (file === 'thresholds-about.csv') {
    const pairs: CsvValue[][] = Object.entries(head).filter(([k]) => k !== 'exclusionRulesRaw').flatMap(([k, v]) =>
      Array.isArray(v) && v.every((x) => typeof x === 'string') ? (v as string[]).map((x) => [k, x]) : [[k, v === null ? '' : typeof v === 'object' ? JSON.stringify(v) : (v as CsvValue)]]);
    return csvFile(`${stem}-thresholds-about.csv`, toCsv(['Field', 'Value'], pairs));
  }
  if (file === 'thresholds.json') return jsonFile(`${stem}-thresholds.json`, { about: head, thresholds: rows });
  return jsonFile(`${stem}-report.json`, { about: head, counts: all.counts, cells: all.cells, report });
}

/** Tidy raw trials: one row per test or catch trial of every finished respondent, excluded ones marked. */
export async function trialsCsv(ctx: WorkspaceContext, studyId: string): Promise<string> {
  const db = await em();
  const study = await findStudy(db, ctx.workspace.id, studyId);
  const { excluded } = screen(await respondentRows(study.id), study.exclusionRules);
  const rows = await sql<{ rid: string; source: string | null; seg: Record<string, string>; att: boolean | null; base_price: number; discount: number; kind: string; answer: number; response_ms: number }>(
    db,
    `select r.id as rid, l.source, r.segment_answers as seg, r.attention_passed as att, t.base_price, t.discount, t.kind, t.answer, t.response_ms
       from trial t join respondent r on r.id = t.respondent_id left join respondent_link l on l.id = r.link_id
      where t.study_id = ? and r.workspace_id = ? and r.state in ('completed', 'imported') and t.kind in ('test', 'catch')
      order by r.started_at, r.id, t.idx`,
    [study.id, ctx.workspace.id],
  );
  const qs = study.design.segmentQuestions;
  const header = ['respondent', 'link_source', ...qs.map((q) => `segment_${q.id}`), 'attention_passed', 'base_price', 'discount', 'kind', 'response', 'response_ms', 'excluded_by'];
  return toCsv(header, rows.map((r) => [
    r.rid, r.source ?? '', ...qs.map((q) => r.seg?.[q.id] ?? ''), r.att === null ? '' : r.att,
    Number(r.base_price), Number(r.discount), r.kind, Number(r.answer), Number(r.response_ms), (excluded.get(r.rid) ?? []).join(' '),
  ]));
}

/**
 * One export download as both the app and the token API serve it: an unknown file is a 404,
 * a fit still being computed a pending answer (the route sends 202 with Retry-After).
 */
export async function exportDownload(ctx: WorkspaceContext, studyId: string, file: string, segmentQuestion: string | null): Promise<FileDownload | PendingFile> {
  if (!(EXPORT_FILES as readonly string[]).includes(file)) throw notFoundError('That export');
  try {
    return await exportFile(ctx, studyId, file as ExportFile, { segmentQuestion });
  } catch (err) {
    if (err instanceof ExportPending) return { status: 'pending', message: err.message, retryAfterSeconds: 3 };
    throw err;
  }
}
