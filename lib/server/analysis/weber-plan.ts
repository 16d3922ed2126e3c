import 'server-only';
import { assumedObserver, planDesign, smallestPassing } from '@/lib/psychometrics/planner';
import type { AnalysisReport } from '@/lib/psychometrics/report-types';
import type { Task } from '@/lib/psychometrics/types';
import { MIN_SHOPPERS_TO_TELL, TELL_WIDTH, verdictUndecided } from '@/lib/results-text';
import { hashKey, requestComputation, runCached, type JobData } from './cache';
import { FIT_SEED, type FitState } from './study-fit';

// "The data cannot tell yet … about N completes would": N from the sample-size planner
// (lib/psychometrics/planner.ts). This design (its base prices, ladder, repetitions and task) is
// simulated under the fitted power model's thresholds, slope, lapse and guess rate, and the
// completes are searched (doubling, then bisection, common random numbers) until the Weber
// slope's simulated 95 % interval is at most TELL_WIDTH wide; never fewer than
// MIN_SHOPPERS_TO_TELL. Computed as a cached job on the planner queue, only when the results'
// Weber verdict is undecided. Tests: tests/unit/weber-plan.test.ts.

export const WEBER_PLAN_SIMULATIONS = 80;
export const WEBER_PLAN_MAX = 5000;

export interface WeberPlanInput {
  basePrices: number[];
  rungs: number[];
  repetitions: number;
  task: Task;
  /** ln mid-point threshold fraction per base (the power model's). */
  alpha: number[];
  beta: number;
  lapse: number;
  guess: number;
}

/** Completes for a Weber-slope interval of at most TELL_WIDTH; null when even WEBER_PLAN_MAX do not. */
export function completesToTellWeber(input: WeberPlanInput, simulations = WEBER_PLAN_SIMULATIONS): number | null {
  const width = new Map<number, number>();
  const ok = (n: number) => {
    if (!width.has(n)) {
      const plan = planDesign({ ...input, respondents: n, simulations, seed: FIT_SEED });
      width.set(n, plan.weberSlopeWidth ?? Infinity);
    }
    return width.get(n)! <= TELL_WIDTH;
  };
  return smallestPassing(ok, MIN_SHOPPERS_TO_TELL, WEBER_PLAN_MAX);
}

export type WeberPlanState =
  | { status: 'ready'; completes: number | null }
  | { status: 'pending' }
  | { status: 'none' };

/** The planner's answer for an undecided verdict of a ready fit; 'none' when the verdict needs none. */
export async function getWeberPlan(state: FitState): Promise<WeberPlanState> {
  if (state.fit.status !== 'ready') return { status: 'none' };
  const report: AnalysisReport = state.fit.report;
  const shoppers = report.shopperSpread?.shoppers ?? state.counts?.respondents.after ?? null;
  if (report.bases.length < 2 || !verdictUndecided(report, shoppers)) return { status: 'none' };
  const s = state.study;
  const assumed = assumedObserver(report.bases);
  const input: WeberPlanInput = {
    basePrices: report.bases.map((b) => b.basePrice), rungs: s.design.ladder, repetitions: s.design.repetitions, task: s.design.task,
    alpha: report.models.power.thresholds.map((t) => t.alpha), beta: assumed.beta, lapse: assumed.lapse,
    guess: s.design.task === 'pick' ? 0.5 : assumed.guess,
  };
  if (!input.alpha.every(Number.isFinite) || input.alpha.length !== input.basePrices.length) return { status: 'none' };
  const cacheKey = hashKey({ weberPlan: input, sims: WEBER_PLAN_SIMULATIONS, width: TELL_WIDTH });
  const row = await requestComputation<{ completes: number | null }>({
    studyId: s.id, kind: 'weber-plan', cacheKey, dataVersion: s.dataVersion, queue: 'planner', payload: { input },
  });
  if (row.status === 'done' && row.result) return { status: 'ready', completes: row.result.completes };
  if (row.status === 'failed') return { status: 'none' };
  return { status: 'pending' };
}

/** Job handler of kind 'weber-plan'. */
export async function runWeberPlanJob(data: JobData & { input: WeberPlanInput }, lastAttempt = true): Promise<void> {
  await runCached(data, lastAttempt, async () => ({ completes: completesToTellWeber(data.input) }));
}
