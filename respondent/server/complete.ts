import 'server-only';
// Completing a respondent uses one seat, exactly once. What may be checked without the seat lock
// is checked first (the respondent exists, every answer has arrived, the study is live and the
// link open — stoppedRefusal, the same 410 /state gives);
// then, under the workspace's seat lock (withSeatLock: one transaction per workspace at a time
// on this instance, queued in memory, and the row lock across instances), ONE statement reads
// the balance, adds the ledger entry only if a seat is left, marks the respondent completed
// and bumps the study's data version — so the lock is held for one round trip, not five. A second
// (retried or concurrent) complete finds the respondent completed and changes nothing.
import type { EntityManager } from '@mikro-orm/postgresql';
import { expectedTrial, completionRedirect } from '@/respondent/shared/screens';
import { respondentContext } from './context';
import { stoppedRefusal } from './link';
import { refusal } from './words';
import { sqlOne } from '@/lib/server/db/sql';
import { completeWithSeat, withSeatLock } from '@/lib/server/billing/seat-ledger';
import { answeredHistory } from './trials';

/** Completes the respondent (see the header); retried or concurrent completes change nothing. */
export async function completeRespondent(db: EntityManager, linkToken: string, resumeToken: string | null): Promise<{ ok: true; redirectUrl: string | null }> {
  const ctx = await respondentContext(db, linkToken, resumeToken);
  const redirectUrl = completionRedirect(ctx.design, ctx.pid);
  // Read before the lock, and again when the seat statement found the respondent no longer open.
  const readState = () => sqlOne<{ state: string; answered_count: number; study_state: string; link_closed: boolean }>(
    db,
    `select r.state, r.answered_count, s.state as study_state, l.closed_at is not null as link_closed
       from respondent r join study s on s.id = r.study_id left join respondent_link l on l.id = r.link_id where r.id = ?`,
    [ctx.id],
  );
  const language = ctx.design.language;
  const r = await readState();
  if (!r) throw refusal(language, 404, 'not_found', 'lost');
  if (r.state === 'completed') return { ok: true, redirectUrl };
  // The same 410 /state gives: a paused study or a closed link stops a complete in progress too.
  const stopped = stoppedRefusal(r.study_state, Boolean(r.link_closed), language);
  if (stopped) throw stopped;
  const count = Number(r.answered_count);
  const finished = ctx.plan.mode === 'fixed'
    ? count >= ctx.plan.trials.length
    : expectedTrial(ctx.design, ctx.seed, ctx.plan, await answeredHistory(db, ctx.id), count) === null;
  // The phone completes once its stored answers are acknowledged; until then some are still on their way.
  if (!finished) {
    throw ctx.plan.mode === 'fixed'
      ? refusal(language, 409, 'conflict', 'notArrivedCount', { missing: ctx.plan.trials.length - count, total: ctx.plan.trials.length })
      : refusal(language, 409, 'conflict', 'notArrived');
  }

  const out = await withSeatLock(db, ctx.workspaceId, (tx) => completeWithSeat(tx, { workspaceId: ctx.workspaceId, studyId: ctx.studyId, respondentId: ctx.id }));
  if (out === 'completed') return { ok: true, redirectUrl };
  if (out === 'no_seat') throw refusal(language, 409, 'study_full', 'fullAtEnd');
  // Not open any more: completed meanwhile (a concurrent try won), stopped meanwhile, or deleted.
  const now = await readState();
  if (now?.state === 'completed') return { ok: true, redirectUrl };
  const stoppedLater = now ? stoppedRefusal(now.study_state, Boolean(now.link_closed), language) : null;
  if (stoppedLater) throw stoppedLater;
  throw refusal(language, 404, 'not_found', 'lost');
}
