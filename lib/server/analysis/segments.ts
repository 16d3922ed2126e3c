import 'server-only';
import { compareGroups } from '@/lib/psychometrics/segments';
import { PsychometricsInputError } from '@/lib/psychometrics/errors';
import { hashKey, requestComputation, runCached, type JobData } from './cache';
import { FIT_ENGINE, FIT_SEED, loadFitInput } from './study-fit';
import { em } from '@/lib/server/db/orm';
import { AppError } from '@/lib/server/http/errors';
import type { WorkspaceContext } from '@/lib/server/team/membership';
import { findStudy, hasAnsweredTests, loadShopperCells } from './cells';

// Segment comparison: each answer group of one segment question fitted on its own (power
// model), then one shared model on all groups; the likelihood-ratio statistic asks whether they
// differ, its p-value from a permutation of whole shoppers between the groups (the engine's
// segments.ts), since every respondent carries an id.

export const SEGMENT_BOOTSTRAP = 200;

export type SegmentResult = ReturnType<typeof compareGroups> & { respondents: Record<string, number>; skipped: string[] };

export type SegmentState =
  | { status: 'ready'; result: SegmentResult; questionText: string }
  | { status: 'pending'; message: string }
  | { status: 'empty'; message: string };

export async function getSegmentComparison(ctx: WorkspaceContext, studyId: string, questionId: string): Promise<SegmentState> {
  const db = await em();
  const study = await findStudy(db, ctx.workspace.id, studyId);
  const q = study.design.segmentQuestions.find((x) => x.id === questionId);
  if (!q) throw new AppError(422, 'validation_failed', 'This study has no such segment question.');
  if (!(await hasAnsweredTests(study.id))) return { status: 'empty', message: 'No finished respondent has answered a test trial yet.' };
  const cacheKey = hashKey({ v: study.dataVersion, rules: study.exclusionRules, questionId, b: SEGMENT_BOOTSTRAP, seed: FIT_SEED, engine: FIT_ENGINE });
  const row = await requestComputation<SegmentResult>({
    studyId: study.id, kind: 'segments', cacheKey, dataVersion: study.dataVersion, queue: 'analysis', payload: { questionId },
  });
  if (row.status === 'done' && row.result) return { status: 'ready', result: row.result, questionText: q.text };
  if (row.status === 'failed') return { status: 'empty', message: row.error ?? 'The comparison could not be computed.' };
  return { status: 'pending', message: 'Fitting each answer group and the shared model…' };
}

export async function runSegmentsJob(data: JobData & { questionId: string }, lastAttempt = true) {
  await runCached(data, lastAttempt, async () => {
    const loaded = await loadFitInput(data.studyId, data.dataVersion, null);
    if (loaded === 'obsolete') return 'obsolete';
    const q = loaded.study.design.segmentQuestions.find((x) => x.id === data.questionId);
    if (!q) throw new PsychometricsInputError('the segment question no longer exists');
    const groups = [];
    const respondents: Record<string, number> = {};
    const skipped: string[] = [];
    for (const answer of q.options) {
      const ids = loaded.kept.filter((r) => r.segmentAnswers[q.id] === answer).map((r) => r.id);
      respondents[answer] = ids.length;
      const cells = await loadShopperCells(data.studyId, ids);
      if (!cells.cells.length) { skipped.push(answer); continue; }
      const spot = loaded.study.design.task === 'spot';
      groups.push({ label: answer, shopperCells: spot ? cells.shopperCells : cells.shopperCells.filter((r) => r.discount !== 0) });
    }
    if (groups.length < 2) throw new PsychometricsInputError('fewer than two answer groups have data, so there is nothing to compare');
    const result = compareGroups(groups, { task: loaded.study.design.task, bootstrap: SEGMENT_BOOTSTRAP, seed: FIT_SEED });
    return { ...result, respondents, skipped } as SegmentResult;
  });
}
