import 'server-only';
// A batch of a respondent's answers, stored exactly once per (respondent, trial).
//
// The phone keeps every answer on the device until the server names it in a reply, and sends
// them a few at a time (respondent/client/use-answer-queue.ts), so the same batch may arrive
// twice (a lost reply, a beacon from a closing page, another tab resuming). Hence:
// - Everything the browser cannot be trusted with comes from the stored plan: kind, base
//   price, shown price and discount. An answer must belong to the plan (index in range, an
//   option that was shown), the respondent must still be answering, the study live and the
//   link open: a paused study or a closed link stops answers in progress with the same 410
//   /state gives (stoppedRefusal in ./link.ts; what the phone has not sent stays on it).
// - The whole batch is checked before anything is written: one bad answer refuses the batch
//   with a 422 naming its row (`answers.3.answer`) and nothing is stored.
// - The write is one statement: a multi-row INSERT … ON CONFLICT DO NOTHING fed from one jsonb
//   parameter, guarded by the respondent's state, the study's state and the order rule (the
//   batch must start at or before the next unanswered trial), moving the answered counter
//   only by what it inserted. The unique keys (respondent, idx) and (respondent, client id)
//   make a retry a no-op. The same statement reads which of the batch's trials were already
//   stored, so a retried batch is acknowledged without a second round trip.
// - With the respondent's immutable context cached per process (./context.ts), a batch costs
//   one statement; a second is read only when the first could not account for every answer
//   (a concurrent retry committed meanwhile, or a refusal whose reason must be told).
// The reply names the answers the phone may drop: acknowledged (stored, now or before, with this
// client id) and conflicts (the trial already holds another answer of this respondent).
import type { EntityManager } from '@mikro-orm/postgresql';
import { expectedTrial, toPublic } from '@/respondent/shared/screens';
import type { PlannedTrial } from '@/respondent/shared/types';
import type { AnswerBatchReply, AnswerInput } from '@/respondent/shared/answer.schema';
import type { AnsweredTrial } from '@/respondent/shared/adaptive';
import { AppError } from '@/lib/server/http/errors';
import { sql, sqlOne } from '@/lib/server/db/sql';
import { respondentContext, type RespondentContext } from './context';
import { stoppedRefusal } from './link';
import { refusal } from './words';
import { answeredHistory } from './trials';

const invalid = (path: string, message: string) => new AppError(422, 'validation_failed', message, [{ path, message }]);

/** One answer of the batch with its row in the request (for error paths) once sorted by idx. */
interface Entry {
  row: number;
  a: AnswerInput;
}

/** A new trial row, as the statement's jsonb recordset reads it. */
interface NewRow {
  idx: number;
  kind: PlannedTrial['kind'];
  base_price: number;
  discount: number;
  shown: Record<string, unknown>;
  answer: number;
  response_ms: number;
  client_id: string;
  attention: boolean | null;
}

function storedAnswer(ctx: RespondentContext, t: PlannedTrial, answer: number, row: number): { value: 0 | 1; attention: boolean | null } {
  if (t.kind === 'attention') {
    const a = ctx.design.attentionCheck;
    if (answer >= a.options.length) throw invalid(`answers.${row}.answer`, 'Not one of the answers shown.');
    const ok = a.options[answer] === a.correct;
    return { value: ok ? 1 : 0, attention: ok };
  }
  if (answer !== 0 && answer !== 1) throw invalid(`answers.${row}.answer`, 'The answer must be 0 or 1.');
  return { value: answer, attention: null };
}

function shownOf(ctx: RespondentContext, t: PlannedTrial): Record<string, unknown> {
  const shown: Record<string, unknown> = { price: t.price };
  if (t.lowerSide) shown.lowerSide = t.lowerSide;
  if (t.shelfItem !== undefined) shown.shelfItem = t.shelfItem;
  if (t.slot !== undefined) shown.slot = t.slot;
  if (t.rung != null) shown.rung = t.rung;
  if (ctx.design.task === 'pick') shown.viewMs = ctx.design.viewMs;
  return shown;
}

/**
 * The batch in trial order with exact repeats collapsed (a phone may queue one answer twice);
 * refuses one client id with two different answers, two answers for one trial, and gaps.
 */
export function orderedBatch(answers: AnswerInput[]): Entry[] {
  const byId = new Map<string, Entry>();
  const byIdx = new Map<number, Entry>();
  answers.forEach((a, row) => {
    const same = byId.get(a.clientId);
    if (same) {
      if (same.a.idx !== a.idx || same.a.answer !== a.answer) throw invalid(`answers.${row}.clientId`, 'One answer id is used for two different answers.');
      return;
    }
    if (byIdx.has(a.idx)) throw invalid(`answers.${row}.idx`, 'Two different answers for one trial.');
    const e = { row, a };
    byId.set(a.clientId, e);
    byIdx.set(a.idx, e);
  });
  const sorted = [...byIdx.values()].sort((x, y) => x.a.idx - y.a.idx);
  for (let i = 1; i < sorted.length; i++) {
    if (sorted[i].a.idx !== sorted[i - 1].a.idx + 1) throw invalid(`answers.${sorted[i].row}.idx`, 'Answer the trials in order.');
  }
  return sorted;
}

/** The rows to insert, each checked against the plan; adaptive plans resolve each trial from the answers before it. */
function planRows(ctx: RespondentContext, batch: Entry[], history: AnsweredTrial[]): { rows: NewRow[]; after: AnsweredTrial[] } {
  const after = [...history];
  const rows: NewRow[] = [];
  for (const { row, a } of batch) {
    // Adaptive trials already answered are known only by their stored row: the statement tells replay from conflict.
    if (ctx.plan.mode === 'adaptive' && a.idx < history.length) continue;
    const t = expectedTrial(ctx.design, ctx.seed, ctx.plan, after, a.idx);
    if (!t) throw invalid(`answers.${row}.idx`, 'There is no such trial.');
    const { value, attention } = storedAnswer(ctx, t, a.answer, row);
    if (ctx.plan.mode === 'adaptive') after.push({ kind: t.kind, slot: t.slot ?? a.idx, basePrice: t.basePrice, answer: value });
    rows.push({
      idx: a.idx, kind: t.kind, base_price: t.basePrice, discount: t.discount, shown: shownOf(ctx, t),
      answer: value, response_ms: a.responseMs, client_id: a.clientId, attention,
    });
  }
  return { rows, after };
}

// One round trip (see the header). `existing` reads the statement's snapshot, i.e. the rows
// stored before it: a retry's rows show up there, this statement's own inserts in `ins`.
const WRITE = `
with b as (
  select * from jsonb_to_recordset(?::jsonb) as b(idx int, kind text, base_price float8, discount float8, shown jsonb,
                                                   answer smallint, response_ms int, client_id uuid, attention boolean)
), r as (
  select r.id, r.answered_count from respondent r join study s on s.id = r.study_id left join respondent_link l on l.id = r.link_id
   where r.id = ? and r.state = 'started' and s.state = 'live' and l.closed_at is null
), ins as (
  insert into trial (study_id, respondent_id, idx, kind, base_price, discount, shown, answer, response_ms, client_id, answered_at)
  select ?, r.id, b.idx, b.kind, b.base_price, b.discount, b.shown, b.answer, b.response_ms, b.client_id, now()
    from b cross join r where r.answered_count >= ?
   order by b.idx
  on conflict do nothing returning idx, client_id
), upd as (
  update respondent set answered_count = greatest(answered_count, (select max(idx) + 1 from ins)), last_seen_at = now(),
         attention_passed = coalesce((select b.attention from b join ins using (idx) where b.attention is not null limit 1), attention_passed)
   where id = ? and exists (select 1 from ins) returning answered_count
)
select (select answered_count from r) as before, (select answered_count from upd) as after,
       coalesce((select json_agg(client_id) from ins), '[]') as inserted,
       coalesce((select json_agg(json_build_object('idx', t.idx, 'clientId', t.client_id))
                   from trial t where t.respondent_id = ? and t.idx between ? and ?), '[]') as existing`;

interface WriteResult {
  before: number | null;
  after: number | null;
  inserted: string[];
  existing: { idx: number; clientId: string }[];
}

/** Stores a batch of answers (see the header); replays and answers already given are acknowledged. */
export async function recordAnswers(db: EntityManager, ctx: RespondentContext, answers: AnswerInput[]): Promise<AnswerBatchReply> {
  const batch = orderedBatch(answers);
  const history = ctx.plan.mode === 'adaptive' ? await answeredHistory(db, ctx.id) : [];
  const { rows, after } = planRows(ctx, batch, history);
  const first = batch[0].a.idx;
  const last = batch[batch.length - 1].a.idx;

  const w: WriteResult = rows.length
    ? (await sqlOne<Record<string, unknown>>(db, WRITE, [JSON.stringify(rows), ctx.id, ctx.studyId, first, ctx.id, ctx.id, first, last]).then(parseWrite))
    : { before: null, after: null, inserted: [], existing: await storedRows(db, ctx.id, first, last) };

  const acknowledged = new Set(w.inserted);
  const conflicts = new Set<string>();
  const classify = (stored: { idx: number; clientId: string }[]) => {
    const byIdx = new Map(stored.map((s) => [Number(s.idx), s.clientId]));
    for (const { a } of batch) {
      const held = byIdx.get(a.idx);
      if (held === a.clientId) acknowledged.add(a.clientId);
      else if (held !== undefined && !acknowledged.has(a.clientId)) conflicts.add(a.clientId);
    }
  };
  classify(w.existing);
  let answered = w.after ?? w.before;
  const unresolved = batch.filter(({ a }) => !acknowledged.has(a.clientId) && !conflicts.has(a.clientId));
  if (unresolved.length) answered = await explain(db, ctx, unresolved, first, last, classify);

  const reply: AnswerBatchReply = { acknowledged: [...acknowledged], conflicts: [...conflicts], answered: answered ?? 0 };
  if (ctx.plan.mode === 'adaptive') {
    // The staircase's next trial follows from the stored answers: ours unless another tab's won.
    const stored = conflicts.size || rows.length !== w.inserted.length ? await answeredHistory(db, ctx.id) : after;
    const next = expectedTrial(ctx.design, ctx.seed, ctx.plan, stored, stored.length);
    reply.next = next ? toPublic(ctx.design, ctx.plan, next, stored.length) : null;
  }
  return reply;
}

/** The respondent behind the first resume token that belongs to this link (a phone may hold one cookie per study). */
export async function answeringRespondent(db: EntityManager, linkToken: string, resumeTokens: string[]): Promise<RespondentContext> {
  for (const t of resumeTokens.slice(0, -1)) {
    try {
      return await respondentContext(db, linkToken, t);
    } catch (err) {
      if (!(err instanceof AppError) || err.status !== 404) throw err;
    }
  }
  return respondentContext(db, linkToken, resumeTokens.at(-1) ?? null);
}

function parseWrite(r: Record<string, unknown> | undefined): WriteResult {
  const json = <T>(v: unknown): T => (typeof v === 'string' ? JSON.parse(v) : v) as T;
  return {
    before: r?.before == null ? null : Number(r.before),
    after: r?.after == null ? null : Number(r.after),
    inserted: json<string[]>(r?.inserted ?? '[]'),
    existing: json<{ idx: number; clientId: string }[]>(r?.existing ?? '[]'),
  };
}

async function storedRows(db: EntityManager, respondentId: string, first: number, last: number) {
  const rows = await sql<{ idx: number; client_id: string }>(db, 'select idx, client_id from trial where respondent_id = ? and idx between ? and ?', [respondentId, first, last]);
  return rows.map((r) => ({ idx: Number(r.idx), clientId: r.client_id }));
}

/**
 * The second statement, only when the first left answers unaccounted for: either a concurrent
 * try of the same batch committed meanwhile (then its rows are visible now), or the batch is
 * refused, and the reason is told: study closed or paused or link closed, respondent completed, an answer id used for
 * another trial, or a batch that starts after the next unanswered trial.
 */
async function explain(db: EntityManager, ctx: RespondentContext, unresolved: Entry[], first: number, last: number, classify: (s: { idx: number; clientId: string }[]) => void): Promise<number> {
  const ids = JSON.stringify(unresolved.map((e) => e.a.clientId));
  const st = await sqlOne<{ state: string; study_state: string; link_closed: boolean; answered_count: number; stored: unknown }>(db, `
    select r.state, s.state as study_state, l.closed_at is not null as link_closed, r.answered_count,
           coalesce((select json_agg(json_build_object('idx', t.idx, 'clientId', t.client_id)) from trial t
                      where t.respondent_id = r.id and (t.idx between ? and ? or t.client_id::text in (select jsonb_array_elements_text(?::jsonb)))), '[]') as stored
      from respondent r join study s on s.id = r.study_id left join respondent_link l on l.id = r.link_id where r.id = ?`, [first, last, ids, ctx.id]);
  const language = ctx.design.language;
  if (!st) throw refusal(language, 404, 'not_found', 'lost');
  const stored = (typeof st.stored === 'string' ? JSON.parse(st.stored) : st.stored) as { idx: number; clientId: string }[];
  classify(stored);
  const usedElsewhere = new Map(stored.map((s) => [s.clientId, Number(s.idx)]));
  for (const { row, a } of unresolved) {
    const idx = usedElsewhere.get(a.clientId);
    if (idx !== undefined && idx !== a.idx) throw new AppError(409, 'conflict', 'This answer id was already used for another trial.', [{ path: `answers.${row}.clientId`, message: 'Already used for another trial.' }]);
  }
  const left = unresolved.filter(({ a }) => !stored.some((s) => Number(s.idx) === a.idx));
  if (left.length) {
    const stopped = stoppedRefusal(st.study_state, Boolean(st.link_closed), language);
    if (stopped) throw stopped;
    if (st.state !== 'started') throw refusal(language, 409, 'conflict', 'alreadyDone');
    throw refusal(language, 422, 'validation_failed', 'inOrder', {}, [{ path: `answers.${left[0].row}.idx`, message: 'Answer the trials in order.' }]);
  }
  return Number(st.answered_count);
}
