import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { z } from 'zod';
import { expectedTrial, toPublic } from '@/respondent/shared/screens';
import type { PlannedTrial, PublicTrial } from '@/respondent/shared/types';
import { AppError } from '@/lib/server/http/errors';
import { respondentContext, type RespondentContext } from './context';
import { answeredHistory } from './trials';

/** Only these four fields: base price, discount and kind come from the plan, never the browser. */
export const answerSchema = z.strictObject({
  clientId: z.uuid(),
  idx: z.number().int().min(0).max(100_000),
  answer: z.number().int().min(0).max(7),
  responseMs: z.number().int().min(0).max(3_600_000),
});
export type AnswerInput = z.output<typeof answerSchema>;

const invalid = (path: string, message: string) => new AppError(422, 'validation_failed', message, [{ path, message }]);

function storedAnswer(ctx: RespondentContext, t: PlannedTrial, answer: number): { value: 0 | 1; attention: boolean | null } {
  if (t.kind === 'attention') {
    const a = ctx.design.attentionCheck;
    if (answer >= a.options.length) throw invalid('answer', 'Not one of the answers shown.');
    const ok = a.options[answer] === a.correct;
    return { value: ok ? 1 : 0, attention: ok };
  }
  if (answer !== 0 && answer !== 1) throw invalid('answer', 'The answer must be 0 or 1.');
  return { value: answer, attention: null };
}

// One round trip: the insert happens only while the respondent is answering and the index is
// the next one (or an earlier one, which then conflicts); the counter moves only if it inserted.
const WRITE = `
with r as (
  select r.id, r.answered_count from respondent r join study s on s.id = r.study_id
   where r.id = ? and r.state = 'started' and s.state <> 'closed'
), ins as (
  insert into trial (study_id, respondent_id, idx, kind, base_price, discount, shown, answer, response_ms, client_id, answered_at)
  select ?, r.id, ?, ?, ?, ?, ?::jsonb, ?, ?, ?, now() from r where r.answered_count >= ?
  on conflict do nothing returning idx
), upd as (
  update respondent set answered_count = greatest(answered_count, ? + 1), last_seen_at = now(),
         attention_passed = coalesce(?::boolean, attention_passed)
   where id = ? and exists (select 1 from ins) returning answered_count
)
select (select answered_count from r) as before, (select count(*) from ins) as inserted`;

/** Stores one answer; a retry with the same client id is a no-op that returns the same 200. */
export async function recordAnswer(db: EntityManager, linkToken: string, resumeToken: string | null, a: AnswerInput): Promise<{ ok: true; next?: PublicTrial | null }> {
  const ctx = await respondentContext(db, linkToken, resumeToken);
  const history = ctx.plan.mode === 'adaptive' ? await answeredHistory(db, ctx.id) : [];
  const t = ctx.plan.mode === 'adaptive' && a.idx < history.length ? null : expectedTrial(ctx.design, ctx.seed, ctx.plan, history, a.idx);
  if (!t && !(ctx.plan.mode === 'adaptive' && a.idx < history.length)) throw invalid('idx', 'There is no such trial.');

  if (t) {
    const { value, attention } = storedAnswer(ctx, t, a.answer);
    const shown: Record<string, unknown> = { price: t.price };
    if (t.lowerSide) shown.lowerSide = t.lowerSide;
    if (t.shelfItem !== undefined) shown.shelfItem = t.shelfItem;
    if (t.slot !== undefined) shown.slot = t.slot;
    if (t.rung != null) shown.rung = t.rung;
    if (ctx.design.task === 'pick') shown.viewMs = ctx.design.viewMs;
    const rows = await db.getConnection().execute<{ before: number | null; inserted: string }[]>(WRITE, [
      ctx.id, ctx.studyId, a.idx, t.kind, t.basePrice, t.discount, JSON.stringify(shown), value, a.responseMs, a.clientId, a.idx,
      a.idx, attention, ctx.id,
    ]);
    const { before, inserted } = rows[0];
    if (Number(inserted) === 1) return withNext(ctx, [...history, { kind: t.kind, slot: t.slot ?? a.idx, basePrice: t.basePrice, answer: value }]);
    if (before != null && Number(before) < a.idx) throw invalid('idx', 'Answer the trials in order.');
  }
  return replay(db, ctx, a, history);
}

/** Not inserted: the same answer again (fine), another answer for the same trial (409), or not answering. */
async function replay(db: EntityManager, ctx: RespondentContext, a: AnswerInput, history: Awaited<ReturnType<typeof answeredHistory>>) {
  const rows = await db.getConnection().execute<{ client_id: string; idx: number }[]>(
    'select client_id, idx from trial where respondent_id = ? and (idx = ? or client_id = ?)', [ctx.id, a.idx, a.clientId],
  );
  if (rows.some((r) => r.client_id === a.clientId && Number(r.idx) === a.idx)) return withNext(ctx, ctx.plan.mode === 'adaptive' ? (history.length ? history : await answeredHistory(db, ctx.id)) : []);
  if (rows.length) throw new AppError(409, 'conflict', 'This trial was already answered.');
  const st = await db.getConnection().execute<{ state: string; study_state: string }[]>(
    'select r.state, s.state as study_state from respondent r join study s on s.id = r.study_id where r.id = ?', [ctx.id],
  );
  if (st[0]?.study_state === 'closed') throw new AppError(410, 'gone', 'This study is closed. Thank you for your interest.');
  if (st[0]?.state === 'completed') throw new AppError(409, 'conflict', 'Your answers are already complete.');
  throw invalid('idx', 'Answer the trials in order.');
}

function withNext(ctx: RespondentContext, history: Awaited<ReturnType<typeof answeredHistory>>): { ok: true; next?: PublicTrial | null } {
  if (ctx.plan.mode !== 'adaptive') return { ok: true };
  const next = expectedTrial(ctx.design, ctx.seed, ctx.plan, history, history.length);
  return { ok: true, next: next ? toPublic(ctx.design, ctx.plan, next, history.length) : null };
}
