import 'server-only';
import { createHash, randomUUID } from 'node:crypto';
import { PsychometricsInputError } from '@/lib/psychometrics/errors';
import { em } from '@/lib/server/db/orm';
import { sql, sqlOne } from '@/lib/server/db/sql';
import { enqueue, MAX_WAITING_PER_WORKSPACE, WAITING_WINDOW_SECONDS, type QueueName } from '@/lib/server/platform/jobs';
import { AppError } from '@/lib/server/http/errors';

// AnalysisResult rows as a cache with a status: one row per (study, kind, cache key), where
// the key hashes the data version and every option that changes the numbers. The page asks;
// a missing row is inserted as 'queued' and a job sent; the worker moves it to running → done
// (or failed, with a message for the analyst). The insert is `on conflict do nothing` and the
// job's singleton key is `kind:study:cacheKey`, so many polls of one page make one computation.
// Input the engine cannot fit (everyone excluded, an unreachable target) ends as a final
// 'failed' shown as an empty state; other errors are retried by pg-boss. Exclusion rules are in
// the key, so saving them needs no data-version bump. A new computation is refused (429) while
// the study's workspace already has MAX_WAITING_PER_WORKSPACE waiting or running, so one
// workspace cannot fill the shared queue ahead of the others (tests/integration/fair-queues.test.ts).
// Tests: tests/integration/analysis-fit.test.ts.

export type CacheStatus = 'queued' | 'running' | 'done' | 'failed';

export interface CacheRow<T> {
  status: CacheStatus;
  result: T | null;
  error: string | null;
  updatedAt: Date;
  createdAt: Date;
}

/** Bump when the engine or the job's inputs change meaning, so old cached numbers are not reused. */
// 2: the shopper became the unit (issue 12): per-shopper cells, new report fields.
// 3: the power model keeps its bootstrap lines (report.models.power.draws) for the threshold record (issue 15).
export const CACHE_FORMAT = 3;

export function hashKey(parts: unknown): string {
  return createHash('sha256').update(JSON.stringify({ f: CACHE_FORMAT, parts })).digest('hex');
}

export async function readCache<T>(studyId: string, kind: string, cacheKey: string): Promise<CacheRow<T> | null> {
  const r = await sqlOne<{ status: CacheStatus; result: T | null; error: string | null; updated_at: Date; created_at: Date }>(
    await em(),
    'select status, result, error, updated_at, created_at from analysis_result where study_id = ? and kind = ? and cache_key = ?',
    [studyId, kind, cacheKey],
  );
  return r ? { status: r.status, result: r.result, error: r.error, updatedAt: new Date(r.updated_at), createdAt: new Date(r.created_at) } : null;
}

export interface JobRequest {
  studyId: string;
  kind: string;
  cacheKey: string;
  dataVersion: number;
  queue: QueueName;
  payload: Record<string, unknown>;
}

export interface JobData extends Record<string, unknown> {
  studyId: string;
  kind: string;
  cacheKey: string;
  dataVersion: number;
}

/**
 * The cached row, or a freshly queued one. A row still 'queued' is sent again: the singleton
 * key makes that a no-op while the job waits, and recovers a job lost before it was stored.
 */
export async function requestComputation<T>(req: JobRequest): Promise<CacheRow<T>> {
  const existing = await readCache<T>(req.studyId, req.kind, req.cacheKey);
  if (existing && existing.status !== 'queued') return existing;
  if (!existing) {
    await checkWorkspaceWaiting(req.studyId);
    await sql(
      await em(),
      `insert into analysis_result (id, study_id, kind, cache_key, data_version, status, created_at, updated_at)
       values (?, ?, ?, ?, ?, 'queued', now(), now()) on conflict (study_id, kind, cache_key) do nothing`,
      [randomUUID(), req.studyId, req.kind, req.cacheKey, req.dataVersion],
    );
  }
  const data: JobData = { ...req.payload, studyId: req.studyId, kind: req.kind, cacheKey: req.cacheKey, dataVersion: req.dataVersion };
  await enqueue(req.queue, data, `${req.kind}:${req.studyId}:${req.cacheKey}`);
  return (await readCache<T>(req.studyId, req.kind, req.cacheKey))!;
}

/** Refuses a new computation while the study's workspace has its share of the queue waiting. */
async function checkWorkspaceWaiting(studyId: string): Promise<void> {
  const r = await sqlOne<{ n: number }>(
    await em(),
    `select count(*)::int as n from analysis_result a join study s on s.id = a.study_id
      where s.workspace_id = (select workspace_id from study where id = ?)
        and a.status in ('queued', 'running') and a.updated_at > now() - make_interval(secs => ?)`,
    [studyId, WAITING_WINDOW_SECONDS],
  );
  if ((r?.n ?? 0) >= MAX_WAITING_PER_WORKSPACE) {
    throw new AppError(429, 'rate_limited', `This workspace already has ${MAX_WAITING_PER_WORKSPACE} computations waiting. Try again when they have finished.`, undefined, { 'retry-after': '15' });
  }
}

/**
 * Runs one job against its cache row: skips work already done, marks the row running, stores
 * the result. Input the engine cannot fit is a final 'failed' with the engine's message; other
 * errors are rethrown so pg-boss retries, and marked failed only on the last attempt.
 */
export async function runCached(data: JobData, lastAttempt: boolean, compute: () => Promise<Record<string, unknown> | 'obsolete'>): Promise<void> {
  const row = await readCache(data.studyId, data.kind, data.cacheKey);
  if (!row || row.status === 'done') return;
  await setStatus(data, 'running', null, null);
  try {
    const result = await compute();
    if (result === 'obsolete') {
      // The data changed after the job was queued: nobody asks for this key any more.
      await sql(await em(), 'delete from analysis_result where study_id = ? and kind = ? and cache_key = ?', [data.studyId, data.kind, data.cacheKey]);
      return;
    }
    await setStatus(data, 'done', result, null);
  } catch (err) {
    if (err instanceof PsychometricsInputError) {
      await setStatus(data, 'failed', null, err.message);
      return;
    }
    if (lastAttempt) await setStatus(data, 'failed', null, 'The computation failed on our side; change the data or rules to try again.');
    throw err;
  }
}

async function setStatus(data: JobData, status: CacheStatus, result: Record<string, unknown> | null, error: string | null) {
  await sql(
    await em(),
    'update analysis_result set status = ?, result = ?::jsonb, error = ?, updated_at = now() where study_id = ? and kind = ? and cache_key = ?',
    [status, result === null ? null : JSON.stringify(result), error, data.studyId, data.kind, data.cacheKey],
  );
}

/** The newest finished result of a kind whose options match (shown while a newer one computes). */
export async function latestDone<T>(studyId: string, kind: string, optionsKey: string): Promise<{ result: T; dataVersion: number } | null> {
  const row = await sqlOne<{ result: T; data_version: number }>(
    await em(),
    `select result, data_version from analysis_result
      where study_id = ? and kind = ? and status = 'done' and result ->> 'optionsKey' = ?
      order by data_version desc, updated_at desc limit 1`,
    [studyId, kind, optionsKey],
  );
  return row ? { result: row.result, dataVersion: row.data_version } : null;
}
