import 'server-only';
import { Study } from '@/entities/study';
import { analyse } from '@/lib/psychometrics/analyse';
import { chiSquareP } from '@/lib/psychometrics/chi2';
import type { AnalysisReport } from '@/lib/psychometrics/report-types';
import type { Cell, CatchCell, Task } from '@/lib/psychometrics/types';
import type { ExclusionCounts } from '@/lib/exclusions';
import { poorFitReason } from '@/lib/results-text';
import type { ExclusionRules } from '@/lib/schemas/exclusions.schema';
import { hashKey, latestDone, readCache, requestComputation, runCached, type CacheRow, type JobData } from './cache';
import { em } from '@/lib/server/db/orm';
import { sql } from '@/lib/server/db/sql';
import { toDetail, type StudyDetail } from '@/lib/server/studies/studies';
import type { WorkspaceContext } from '@/lib/server/team/membership';
import { findStudy, hasAnsweredTests, loadShopperCells, respondentRows, screen, type StudyInfo } from './cells';

// The fitted study: per-base fits and the joint Weber models with bootstrap intervals, computed
// by the 'analysis' job and cached per data version, exclusion rules and options (./cache.ts).
// `getStudyFit` is the contract other domains use (promotion plans, exports): ready, pending
// (the caller answers 202 with Retry-After) or empty. 1,000 bootstrap samples with seed 1, so
// the numbers equal `npm run fit -- trials.csv --bootstrap 1000 --seed 1`; the CLI and the app
// are held equal to 1e-9 by tests/integration/results-cli.test.ts (the CLI given the exported
// trials with their respondent column, so both resample the same shoppers).

/** Fixed so a study's numbers are reproducible (and equal the CLI's with --seed 1 --bootstrap 1000). */
export const FIT_BOOTSTRAP = 1000;
export const FIT_SEED = 1;
/**
 * The engine's result format and numbers: part of every fit's cache key, so a change that
 * alters what a fit reports (2: the mixed model fits γ with the catch trials and reports it,
 * share-of-shoppers intervals with the small-sample critical value) refits old caches.
 */
export const FIT_ENGINE = 2;

export type Segment = { questionId: string; answer: string };

export type StudyFit =
  | { status: 'ready'; report: AnalysisReport; dataVersion: number; exclusionRules: ExclusionRules; poorFit: boolean; task: Task; currency: string; locale: string; basePrices: number[]; segment: Segment | null }
  | { status: 'pending'; message: string }
  | { status: 'empty'; message: string };

export interface FitResult extends Record<string, unknown> {
  report: AnalysisReport;
  counts: ExclusionCounts;
  /** The observed counts the fit used (the notice rates drawn as dots). */
  cells: Cell[];
  catchCells: CatchCell[];
  optionsKey: string;
  computedMs: number;
}

export interface FitOptions { segment?: Segment | null; target?: number }

function optionsKeyOf(rules: ExclusionRules, opts: FitOptions): string {
  return hashKey({ rules, segment: opts.segment ?? null, target: opts.target ?? null, bootstrap: FIT_BOOTSTRAP, seed: FIT_SEED, engine: FIT_ENGINE });
}

export function fitCacheKey(study: Pick<StudyDetail, 'dataVersion' | 'exclusionRules'>, opts: FitOptions) {
  const optionsKey = optionsKeyOf(study.exclusionRules, opts);
  return { optionsKey, cacheKey: hashKey({ v: study.dataVersion, optionsKey }) };
}

// The Monte-Carlo deviance p-value of the preferred model when the engine computed one (the χ²
// tail of the deviance misleads with few trials per cell), else the χ² tail.
const preferredP = (r: AnalysisReport) => {
  const m = r.models[r.preferredModel];
  return m.devianceMonteCarloP ?? chiSquareP(m.deviance, m.devianceDf);
};

/** Any base judged a poor fit, or the preferred joint model's deviance p below 0.05. */
export function isPoorFit(report: AnalysisReport): boolean {
  if (report.bases.some((b) => b.verdict === 'poor fit')) return true;
  const p = preferredP(report);
  return p !== null && p < 0.05;
}

export interface FitState {
  study: StudyInfo;
  fit: StudyFit;
  counts: ExclusionCounts | null;
  cells: { cells: Cell[]; catchCells: CatchCell[] } | null;
  /** While a newer fit computes: the last finished one with the same options. */
  previous: { report: AnalysisReport; counts: ExclusionCounts; cells: Cell[]; catchCells: CatchCell[]; dataVersion: number } | null;
  job: { status: CacheRow<unknown>['status']; since: string } | null;
  /** Plain words for the poor-fit banner, when the ready fit is flagged. */
  poorFitWhy?: string | null;
}

/** The fit with what the results page shows around it (counts, job progress, the previous fit). */
export async function getFitState(ctx: WorkspaceContext, studyId: string, opts: FitOptions = {}): Promise<FitState> {
  const db = await em();
  const study = await findStudy(db, ctx.workspace.id, studyId);
  const { cacheKey, optionsKey } = fitCacheKey(study, opts);
  const base = { study, counts: null, cells: null, previous: null, job: null };
  // After the retention purge (lib/server/studies/retention.ts) no respondent is left, but the fit
  // computed before it stays cached at the same data version, and is shown.
  if (!(await hasAnsweredTests(study.id)) && (await readCache(study.id, 'fit', cacheKey))?.status !== 'done') {
    return { ...base, fit: { status: 'empty', message: 'No finished respondent has answered a test trial yet.' } };
  }
  const row = await requestComputation<FitResult>({
    studyId: study.id, kind: 'fit', cacheKey, dataVersion: study.dataVersion, queue: 'analysis',
    payload: { segment: opts.segment ?? null, target: opts.target ?? null },
  });
  if (row.status === 'done' && row.result) {
    const r = row.result;
    return {
      ...base, counts: r.counts, cells: { cells: r.cells, catchCells: r.catchCells }, job: { status: 'done', since: row.updatedAt.toISOString() },
      poorFitWhy: isPoorFit(r.report) ? poorFitReason(r.report, preferredP(r.report)) : null,
      fit: {
        status: 'ready', report: r.report, dataVersion: study.dataVersion, exclusionRules: study.exclusionRules,
        poorFit: isPoorFit(r.report), task: study.design.task, currency: study.design.currency, locale: study.design.locale,
        basePrices: r.report.bases.map((b) => b.basePrice), segment: opts.segment ?? null,
      },
    };
  }
  const job = { status: row.status, since: row.updatedAt.toISOString() };
  if (row.status === 'failed') return { ...base, job, fit: { status: 'empty', message: row.error ?? 'The fit could not be computed.' } };
  const prev = await latestDone<FitResult>(study.id, 'fit', optionsKey);
  return {
    ...base, job,
    previous: prev ? { report: prev.result.report, counts: prev.result.counts, cells: prev.result.cells, catchCells: prev.result.catchCells, dataVersion: prev.dataVersion } : null,
    fit: { status: 'pending', message: row.status === 'running' ? 'Fitting the curves and bootstrapping the intervals…' : 'The fit is queued and starts in a moment…' },
  };
}

export async function getStudyFit(ctx: WorkspaceContext, studyId: string, opts: FitOptions = {}): Promise<StudyFit> {
  return (await getFitState(ctx, studyId, opts)).fit;
}

/** Job handler of kind 'fit' (also called directly by tests). */
export async function runFitJob(data: JobData & { segment: Segment | null; target: number | null }, lastAttempt = true): Promise<void> {
  await runCached(data, lastAttempt, async () => {
    const started = Date.now();
    const loaded = await loadFitInput(data.studyId, data.dataVersion, data.segment);
    if (loaded === 'obsolete') return 'obsolete';
    const { study, cells, catchCells, shopperCells, counts } = loaded;
    // Per-shopper cells: the engine resamples whole shoppers (catch rows only count on the spot task).
    const report = analyse({
      shopperCells: study.design.task === 'spot' ? shopperCells : shopperCells.filter((r) => r.discount !== 0),
      task: study.design.task, target: data.target ?? undefined, bootstrap: FIT_BOOTSTRAP, seed: FIT_SEED,
    });
    if (study.design.task !== 'spot' && catchCells.length) report.warnings.push(`catch trials ignored: the ${study.design.task} task does not estimate a guess rate from them`);
    const result: FitResult = { report, counts, cells, catchCells, optionsKey: optionsKeyOf(study.exclusionRules, { segment: data.segment, target: data.target ?? undefined }), computedMs: Date.now() - started };
    return result;
  });
}

/** Study, screened cells and counts at exactly `dataVersion`, or 'obsolete' when the data moved on. */
export async function loadFitInput(studyId: string, dataVersion: number, segment: Segment | null) {
  const db = await em();
  const s = await db.findOne(Study, { id: studyId }, { refresh: true });
  if (!s || s.dataVersion !== dataVersion) return 'obsolete' as const;
  const study = toDetail(s);
  const rows = await respondentRows(studyId);
  const { counts, kept } = screen(rows, study.exclusionRules);
  const inSegment = segment ? kept.filter((r) => r.segmentAnswers[segment.questionId] === segment.answer) : kept;
  const { cells, catchCells, shopperCells } = await loadShopperCells(studyId, inSegment.map((r) => r.id));
  const again = await db.findOne(Study, { id: studyId }, { refresh: true, fields: ['dataVersion'] });
  if (!again || again.dataVersion !== dataVersion) return 'obsolete' as const;
  return { study, cells, catchCells, shopperCells, counts, kept };
}

/** Studies with answered test trials, for pickers (promotion plans, exports). */
export async function listFittableStudies(ctx: WorkspaceContext) {
  const db = await em();
  const rows = await sql<{ id: string }>(
    db,
    `select s.id from study s where s.workspace_id = ? and exists (
       select 1 from trial t join respondent r on r.id = t.respondent_id
        where t.study_id = s.id and t.kind = 'test' and r.state in ('completed', 'imported'))`,
    [ctx.workspace.id],
  );
  if (!rows.length) return [];
  const studies = await db.find(Study, { id: { $in: rows.map((r) => r.id) }, workspace: ctx.workspace.id }, { orderBy: { name: 'asc' } });
  return studies.map((s) => {
    const { id, name, state, design } = toDetail(s);
    return { id, name, state, task: design.task, category: design.category, currency: design.currency, basePrices: design.basePrices, segmentQuestions: design.segmentQuestions };
  });
}
