import 'server-only';
import { Study } from '@/entities/study';
import { analyse } from '@/lib/psychometrics/analyse';
import { PsychometricsInputError } from '@/lib/psychometrics/errors';
import type { AnalysisReport } from '@/lib/psychometrics/report-types';
import type { ShopperCell } from '@/lib/psychometrics/types';
import { em } from '@/lib/server/db/orm';
import { AppError, notFoundError } from '@/lib/server/http/errors';
import { isUuid } from '@/lib/server/platform/ids';
import { toDetail } from '@/lib/server/studies/studies';
import type { WorkspaceContext } from '@/lib/server/team/membership';
import { hashKey, requestComputation, runCached, type JobData } from './cache';
import { hasAnsweredTests } from './cells';
import { FIT_BOOTSTRAP, FIT_SEED, isPoorFit, loadFitInput, type StudyFit } from './study-fit';

// A pooled fit across chosen studies (issue 15, borrowing for an unmeasured category): the
// engine fits the shoppers of all of them together — each study's respondents kept apart by
// their ids, so the respondent-level bootstrap resamples whole shoppers of every study — with
// each study's own exclusion rules. Same task and currency required (the guess rate and the
// money scale must mean the same). Computed by the 'pooled-fit' job and cached like a study's
// fit (./cache.ts), keyed by every study's id, data version and rules, under the first study's
// id (sorted), so a change to any of them asks for a new fit. Tests: tests/integration/promo-borrowing.test.ts.

export const MAX_POOLED = 6;

export interface PooledSource { id: string; name: string; category: string }

export interface PooledFitResult extends Record<string, unknown> {
  report: AnalysisReport;
  studies: PooledSource[];
  computedMs: number;
}

export type PooledFit = StudyFit & { studies?: PooledSource[] };

async function loadStudies(ctx: WorkspaceContext, ids: readonly string[]) {
  const unique = [...new Set(ids)].sort();
  if (unique.length < 2) throw new AppError(422, 'validation_failed', 'A pooled fit needs at least two different studies.', [{ path: 'pooledStudyIds', message: 'Choose at least two studies.' }]);
  if (unique.length > MAX_POOLED) throw new AppError(422, 'validation_failed', `Pool at most ${MAX_POOLED} studies.`, [{ path: 'pooledStudyIds', message: `At most ${MAX_POOLED}.` }]);
  if (!unique.every(isUuid)) throw notFoundError('One of those studies');
  const db = await em();
  const rows = await db.find(Study, { id: { $in: unique }, workspace: ctx.workspace.id });
  if (rows.length !== unique.length) throw notFoundError('One of those studies');
  return unique.map((id) => toDetail(rows.find((r) => r.id === id)!));
}

function keyOf(studies: ReturnType<typeof toDetail>[]) {
  return hashKey({ pooled: studies.map((s) => ({ id: s.id, v: s.dataVersion, rules: s.exclusionRules })), bootstrap: FIT_BOOTSTRAP, seed: FIT_SEED });
}

/** The pooled fit of the studies: ready, pending (queued or computing) or empty (with the reason). */
export async function getPooledFit(ctx: WorkspaceContext, ids: readonly string[]): Promise<PooledFit> {
  const studies = await loadStudies(ctx, ids);
  const bad = (path: string, message: string) => new AppError(422, 'validation_failed', message, [{ path, message }]);
  if (new Set(studies.map((s) => s.design.task)).size > 1) throw bad('pooledStudyIds', 'The studies use different tasks (their guess rates differ), so their shoppers cannot be fitted together.');
  if (new Set(studies.map((s) => s.design.currency)).size > 1) throw bad('pooledStudyIds', 'The studies priced in different currencies; a pooled fit needs one currency.');
  for (const s of studies) if (!(await hasAnsweredTests(s.id))) return { status: 'empty', message: `“${s.name}” has no answered test trials.` };
  const first = studies[0];
  const row = await requestComputation<PooledFitResult>({
    studyId: first.id, kind: 'pooled-fit', cacheKey: keyOf(studies), dataVersion: first.dataVersion, queue: 'analysis',
    payload: { studies: studies.map((s) => ({ id: s.id, dataVersion: s.dataVersion })) },
  });
  if (row.status === 'failed') return { status: 'empty', message: row.error ?? 'The pooled fit could not be computed.' };
  if (row.status !== 'done' || !row.result) return { status: 'pending', message: 'Fitting the pooled shoppers…' };
  const r = row.result.report;
  return {
    status: 'ready', report: r, dataVersion: first.dataVersion, exclusionRules: first.exclusionRules, poorFit: isPoorFit(r),
    task: first.design.task, currency: first.design.currency, locale: first.design.locale,
    basePrices: r.bases.map((b) => b.basePrice), segment: null, studies: row.result.studies,
  };
}

/** Job handler of kind 'pooled-fit'. */
export async function runPooledFitJob(data: JobData & { studies: { id: string; dataVersion: number }[] }, lastAttempt = true): Promise<void> {
  await runCached(data, lastAttempt, async () => {
    const started = Date.now();
    const shopperCells: ShopperCell[] = [];
    const sources: PooledSource[] = [];
    let task: 'spot' | 'pick' | 'trip' | null = null;
    for (const [i, s] of data.studies.entries()) {
      const loaded = await loadFitInput(s.id, s.dataVersion, null);
      if (loaded === 'obsolete') return 'obsolete';
      task = loaded.study.design.task;
      sources.push({ id: loaded.study.id, name: loaded.study.name, category: loaded.study.design.category });
      // Ids prefixed by the study: the same respondent id in two studies is two shoppers.
      for (const c of loaded.shopperCells) if (task === 'spot' || c.discount !== 0) shopperCells.push({ ...c, respondent: `${i}:${c.respondent}` });
    }
    if (!task || !shopperCells.length) throw new PsychometricsInputError('no answered test trials in the chosen studies');
    const report = analyse({ shopperCells, task, bootstrap: FIT_BOOTSTRAP, seed: FIT_SEED });
    report.warnings.push(`pooled fit of ${sources.length} studies: ${sources.map((s) => `“${s.name}” (${s.category})`).join(', ')}`);
    const result: PooledFitResult = { report, studies: sources, computedMs: Date.now() - started };
    return result;
  });
}
