import 'server-only';
import { assumedObserver, DEFAULT_SIGMA, respondentsForWidth } from '@/lib/psychometrics/planner';
import { trialsPerRespondent } from '@/lib/schemas/study.schema';
import { hashKey, requestComputation, runCached, type JobData } from './cache';
import { fitCacheKey, getFitState, FIT_SEED } from './study-fit';
import type { WorkspaceContext } from '@/lib/server/team/membership';

// Sample-size planner on the current fit: simulate this design (its base prices, ladder and
// repetitions) under the fitted thresholds, slope, lapse and guess rate, and search the
// number of completes that brings each threshold's 95 % interval under the chosen width.

export const PLANNER_SIMULATIONS = 200;
export const PLANNER_MAX_RESPONDENTS = 5000;

export interface PlannerResult extends Record<string, unknown> {
  widthPoints: number;
  currentCompletes: number;
  /** σ: the spread of shoppers' ln thresholds (the study's mixed-model fit, or the planning default). */
  assumed: { beta: number; lapse: number; guess: number; sigma?: number; sigmaSource?: 'study' | 'default'; catchPerBase?: number };
  bases: { basePrice: number; thresholdPercent: number; currentWidthPoints: number | null; respondents: number | null; more: number | null }[];
}

export type PlannerState =
  | { status: 'ready'; result: PlannerResult }
  | { status: 'pending'; message: string }
  | { status: 'empty'; message: string };

export async function getPlan(ctx: WorkspaceContext, studyId: string, widthPoints: number): Promise<PlannerState> {
  const fit = await getFitState(ctx, studyId);
  if (fit.fit.status !== 'ready') return fit.fit.status === 'pending' ? { status: 'pending', message: 'Waiting for the fit first…' } : fit.fit;
  const s = fit.study;
  const report = fit.fit.report;
  const spread = report.shopperSpread?.sigma;
  const assumed = {
    ...assumedObserver(report.bases),
    sigma: spread ?? DEFAULT_SIGMA, sigmaSource: spread === undefined ? 'default' as const : 'study' as const,
    catchPerBase: trialsPerRespondent(s.design).catch / s.design.basePrices.length,
  };
  const payload = {
    widthPoints, assumed, task: s.design.task, rungs: s.design.ladder, repetitions: s.design.repetitions,
    currentCompletes: fit.counts?.respondents.after ?? 0,
    // A threshold known only as a bound plans at the rung that bounds it (fraction null in the report).
    bases: report.bases.map((b) => { const f = b.threshold.fraction ?? b.threshold.bound?.fraction ?? NaN; return { basePrice: b.basePrice, alpha: Math.log(f), fraction: f, ci: b.threshold.fractionCi }; }),
  };
  const cacheKey = hashKey({ fit: fitCacheKey(s, {}).cacheKey, widthPoints, sims: PLANNER_SIMULATIONS });
  const row = await requestComputation<PlannerResult>({ studyId: s.id, kind: 'planner', cacheKey, dataVersion: s.dataVersion, queue: 'planner', payload });
  if (row.status === 'done' && row.result) return { status: 'ready', result: row.result };
  if (row.status === 'failed') return { status: 'empty', message: row.error ?? 'The planner could not run.' };
  return { status: 'pending', message: `Simulating ${PLANNER_SIMULATIONS} studies per candidate sample size…` };
}

type PlannerJob = JobData & {
  widthPoints: number; assumed: PlannerResult['assumed']; task: 'spot' | 'pick' | 'trip'; rungs: number[]; repetitions: number;
  currentCompletes: number; bases: { basePrice: number; alpha: number; fraction: number; ci: [number, number] | null }[];
};

export async function runPlannerJob(data: PlannerJob, lastAttempt = true) {
  await runCached(data, lastAttempt, async () => {
    const need = respondentsForWidth({
      basePrices: data.bases.map((b) => b.basePrice), rungs: data.rungs, repetitions: data.repetitions, task: data.task,
      alpha: data.bases.map((b) => b.alpha), beta: data.assumed.beta, lapse: data.assumed.lapse,
      guess: data.task === 'pick' ? 0.5 : data.assumed.guess, simulations: PLANNER_SIMULATIONS, seed: FIT_SEED,
      sigma: data.assumed.sigma, catchPerBase: data.assumed.catchPerBase,
      targetWidth: data.widthPoints / 100, maxRespondents: PLANNER_MAX_RESPONDENTS,
    });
    const result: PlannerResult = {
      widthPoints: data.widthPoints, currentCompletes: data.currentCompletes, assumed: data.assumed,
      bases: data.bases.map((b, j) => ({
        basePrice: b.basePrice, thresholdPercent: b.fraction * 100,
        currentWidthPoints: b.ci ? (b.ci[1] - b.ci[0]) * 100 : null,
        respondents: need[j].respondents,
        more: need[j].respondents === null ? null : Math.max(0, need[j].respondents! - data.currentCompletes),
      })),
    };
    return result;
  });
}
