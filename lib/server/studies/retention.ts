import 'server-only';
// Respondents' data kept only as long as they were told (issue 13, point 5).
//
// - The retention a study was launched with is frozen in study.retention_days (lifecycle.ts; the
//   consent screen shows that value). Studies closed longer than it are purged by the daily job
//   'purge-respondents' (lib/server/platform/job-handlers.ts): every respondent of the study
//   is deleted, and with them (foreign keys, on delete cascade) their answers; panel ids,
//   segment answers and reference codes are columns of the respondent row. study.purged_at
//   records when; an audit event names the study and how many respondents went.
// - Kept: the study, its design and links, the seat ledger (a used seat stays used: the entry
//   references the respondent id, an opaque uuid), and the fitted results — the cached fit holds
//   the aggregate counts per cell (base price × rung: trials and "noticed"), exclusion counts and
//   the fitted numbers, nothing per respondent. Before purging, the study's default fit is
//   computed if it is not cached yet, so the results page and the aggregate exports still show
//   it. The purge does not bump the data version, so that cached fit stays the current one.
//   Raw-trial exports are empty afterwards; a new fit option (other exclusion rules, a segment)
//   has no data to run on and says so.
// - One respondent on request: an analyst deletes the respondent behind a reference code (shown
//   on the thank-you screen), audited; the study's data version is bumped, so the fit is
//   recomputed without that respondent the next time results are opened.
// Tests: tests/integration/respondent-data-retention.test.ts.
import { Study } from '@/entities/study';
import { em } from '@/lib/server/db/orm';
import { sql, sqlOne } from '@/lib/server/db/sql';
import { AppError } from '@/lib/server/http/errors';
import { recordAudit } from '@/lib/server/team/audit';
import type { WorkspaceContext } from '@/lib/server/team/membership';
import { fitCacheKey, runFitJob } from '@/lib/server/analysis/study-fit';
import { readCache } from '@/lib/server/analysis/cache';
import { normalReferenceCode } from '@/respondent/server/panel-ids';
import { loadStudy, toDetail } from './studies';

type Expired = { id: string; workspace_id: string; name: string; retention: number };

/** Closed studies whose retention has run out and whose respondents are still stored. */
async function expiredStudies(now: Date): Promise<Expired[]> {
  return sql<Expired>(
    await em(),
    `select s.id, s.workspace_id, s.name, coalesce(s.retention_days, w.retention_days) as retention
       from study s join workspace w on w.id = s.workspace_id
      where s.state = 'closed' and s.closed_at is not null and s.purged_at is null
        and s.closed_at + make_interval(days => coalesce(s.retention_days, w.retention_days)) < ?
      order by s.closed_at limit 100`,
    [now],
  );
}

/** Computes the default fit (current rules, all respondents) if it is not cached yet. */
async function keepDefaultFit(studyId: string): Promise<void> {
  const db = await em();
  const study = toDetail(await db.findOneOrFail(Study, { id: studyId }, { refresh: true }));
  const { cacheKey } = fitCacheKey(study, {});
  const row = await readCache(studyId, 'fit', cacheKey);
  if (row?.status === 'done' || row?.status === 'failed') return;
  const answered = await sqlOne(db, `select 1 from trial t join respondent r on r.id = t.respondent_id where t.study_id = ? and t.kind = 'test' and r.state in ('completed', 'imported') limit 1`, [studyId]);
  if (!answered) return;
  if (!row) {
    await sql(db, `insert into analysis_result (id, study_id, kind, cache_key, data_version, status, created_at, updated_at)
                   values (gen_random_uuid(), ?, 'fit', ?, ?, 'queued', now(), now()) on conflict (study_id, kind, cache_key) do nothing`, [studyId, cacheKey, study.dataVersion]);
  }
  await runFitJob({ studyId, kind: 'fit', cacheKey, dataVersion: study.dataVersion, segment: null, target: null });
}

/** The daily job: purges every expired study; returns what it deleted. */
export async function purgeExpiredRespondents(now = new Date()): Promise<{ studies: number; respondents: number }> {
  let studies = 0;
  let respondents = 0;
  for (const s of await expiredStudies(now)) {
    await keepDefaultFit(s.id);
    // A fresh EntityManager: the fit above loaded the Study entity, and the audit's flush must not write it back over purged_at.
    const db = (await em()).fork();
    const n = await db.transactional(async (tx) => {
      const claimed = await sql(tx, 'update study set purged_at = now() where id = ? and purged_at is null returning id', [s.id]);
      if (!claimed.length) return null; // another worker purged it meanwhile
      const gone = await sql(tx, 'delete from respondent where study_id = ? returning id', [s.id]);
      await recordAudit(tx, {
        workspace: s.workspace_id, actor: null, action: 'study.responses_purged', target: s.name,
        detail: { studyId: s.id, respondents: gone.length, retentionDays: Number(s.retention) },
      });
      return gone.length;
    });
    if (n === null) continue;
    studies += 1;
    respondents += n;
  }
  return { studies, respondents };
}

/** Deletes the respondent behind a reference code (and their answers); audited; the fit follows. */
export async function deleteRespondentByCode(ctx: WorkspaceContext, studyId: string, rawCode: string): Promise<{ deleted: true; referenceCode: string }> {
  const db = await em();
  const study = await loadStudy(db, ctx.workspace.id, studyId);
  const code = normalReferenceCode(rawCode);
  const notFound = () => new AppError(404, 'not_found', 'No respondent of this study has that reference code.', [{ path: 'code', message: 'No respondent of this study has this code. Check it with the respondent.' }]);
  if (!code) throw new AppError(422, 'validation_failed', 'That is not a reference code.', [{ path: 'code', message: 'A reference code has ten letters and digits, e.g. 7K2QD-M9XPA.' }]);
  // A fresh EntityManager for the write: the audit's flush must not write the loaded Study back over the data version.
  await db.fork().transactional(async (tx) => {
    const gone = await sql<{ id: string }>(tx, 'delete from respondent where workspace_id = ? and study_id = ? and reference_code = ? returning id', [ctx.workspace.id, study.id, code]);
    if (!gone.length) throw notFound();
    // The cached fit is keyed by the data version: a new version means the next results view refits without them.
    await sql(tx, 'update study set data_version = data_version + 1 where id = ? and workspace_id = ?', [study.id, ctx.workspace.id]);
    await recordAudit(tx, {
      workspace: ctx.workspace.id, actor: ctx.user.id, action: 'respondent.deleted', target: study.name,
      detail: { studyId: study.id, referenceCode: code },
    });
  });
  return { deleted: true, referenceCode: code };
}
