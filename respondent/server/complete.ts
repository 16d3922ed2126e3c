import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { expectedTrial, completionRedirect } from '@/respondent/shared/screens';
import { AppError } from '@/lib/server/http/errors';
import { respondentContext } from './context';
import { stoppedRefusal } from './link';
import { sql, sqlOne } from '@/lib/server/db/sql';
import { lockWorkspaceSeats, useSeat } from '@/lib/server/billing/seat-ledger';
import { answeredHistory } from './trials';

/**
 * Completes a respondent and uses one seat, exactly once: under the workspace lock, a second
 * (retried or concurrent) complete finds the respondent completed and changes nothing.
 */
export async function completeRespondent(db: EntityManager, linkToken: string, resumeToken: string | null): Promise<{ ok: true; redirectUrl: string | null }> {
  const ctx = await respondentContext(db, linkToken, resumeToken);
  const redirectUrl = completionRedirect(ctx.design, ctx.pid);
  await db.transactional(async (tx) => {
    await lockWorkspaceSeats(tx, ctx.workspaceId);
    const r = await sqlOne<{ state: string; answered_count: number; study_state: string; link_closed: boolean }>(
      tx,
      `select r.state, r.answered_count, s.state as study_state, l.closed_at is not null as link_closed
         from respondent r join study s on s.id = r.study_id left join respondent_link l on l.id = r.link_id where r.id = ? for update of r`,
      [ctx.id],
    );
    if (!r) throw new AppError(404, 'not_found', 'We could not find your answers.');
    if (r.state === 'completed') return;
    // The same 410 /state gives: a paused study or a closed link stops a complete in progress too.
    const stopped = stoppedRefusal(r.study_state, Boolean(r.link_closed));
    if (stopped) throw stopped;
    const count = Number(r.answered_count);
    const finished = ctx.plan.mode === 'fixed'
      ? count >= ctx.plan.trials.length
      : expectedTrial(ctx.design, ctx.seed, ctx.plan, await answeredHistory(tx, ctx.id), count) === null;
    // The phone completes once its stored answers are acknowledged; until then some are still on their way.
    if (!finished) throw new AppError(409, 'conflict', ctx.plan.mode === 'fixed'
      ? `${ctx.plan.trials.length - count} of ${ctx.plan.trials.length} answers have not reached us yet. Send them before completing.`
      : 'Some answers have not reached us yet. Send them before completing.');
    if (!(await useSeat(tx, ctx.workspaceId, ctx.id))) throw new AppError(409, 'study_full', 'This study is full. Your answers are kept; thank you for taking part.');
    await sql(tx, `update respondent set state = 'completed', completed_at = now(), last_seen_at = now() where id = ?`, [ctx.id]);
    await sql(tx, 'update study set data_version = data_version + 1 where id = ?', [ctx.studyId]);
  });
  return { ok: true, redirectUrl };
}
