import 'server-only';
// The seat ledger: the only module that reads or writes seat_ledger_entry. A workspace's seat
// balance is never stored; it is the sum of its entries, summed here in one function. Every
// entry is keyed by (reason, reference) — the workspace for welcome seats, the checkout
// session for a purchase, the respondent for a used seat — so a retried sign-up, a replayed
// webhook or a complete sent twice adds nothing: one insert below, `on conflict do nothing`.
// Seat decisions of one workspace (starts and completes) are serialised by withSeatLock: an
// in-process queue per workspace in front of a transaction holding lockWorkspaceSeats. Which
// respondents hold a seat before they complete is ./seat-holds.ts.
import type { EntityManager } from '@mikro-orm/postgresql';
import type { LEDGER_REASONS } from '@/entities/seat-ledger-entry';
import { sql, sqlOne } from '@/lib/server/db/sql';

export const WELCOME_SEATS = 25;

type Reason = (typeof LEDGER_REASONS)[number];
interface Entry { workspaceId: string; delta: number; reason: Reason; reference: string; note: string | null }

/** The one write: true when this call added the entry, false when (reason, reference) was there. */
async function addEntry(em: EntityManager, e: Entry): Promise<boolean> {
  const added = await sql(
    em,
    `insert into seat_ledger_entry (id, workspace_id, delta, reason, reference, note, created_at)
     values (gen_random_uuid(), ?, ?, ?, ?, ?, now()) on conflict (reason, reference) do nothing returning id`,
    [e.workspaceId, e.delta, e.reason, e.reference, e.note],
  );
  return added.length > 0;
}

/** The seat balance: the sum of the workspace's ledger (inside the caller's transaction, if any). */
export async function seatBalance(em: EntityManager, workspaceId: string): Promise<number> {
  const row = await sqlOne<{ balance: string }>(em, 'select coalesce(sum(delta), 0) as balance from seat_ledger_entry where workspace_id = ?', [workspaceId]);
  return Number(row?.balance ?? 0);
}

/** The newest entries first, for the billing page. */
export async function seatHistory(em: EntityManager, workspaceId: string, limit: number) {
  const rows = await sql<{ id: string; created_at: Date; delta: number; reason: Reason; reference: string; note: string | null }>(
    em,
    'select id, created_at, delta, reason, reference, note from seat_ledger_entry where workspace_id = ? order by created_at desc, id desc limit ?',
    [workspaceId, limit],
  );
  return rows.map((e) => ({ id: e.id, createdAt: new Date(e.created_at).toISOString(), delta: Number(e.delta), reason: e.reason, reference: e.reference, note: e.note ?? null }));
}

/** Free seats for a new workspace, once (the workspace must be flushed already). */
export function addWelcomeSeats(em: EntityManager, workspaceId: string): Promise<boolean> {
  return addEntry(em, { workspaceId, delta: WELCOME_SEATS, reason: 'welcome', reference: workspaceId, note: 'Free seats for a new workspace' });
}

/**
 * The free seats of the workspace opened at sign-up, granted when its owner confirms the
 * e-mail address (lib/server/team/email-confirmation.ts); once, however often the link is
 * followed or the confirmation retried. True when this call added them.
 */
export function grantWelcomeSeatsOnConfirmation(em: EntityManager, workspaceId: string): Promise<boolean> {
  return addWelcomeSeats(em, workspaceId);
}

/** A confirmed payment's seats, once per checkout session; false when already credited. */
export function creditPurchase(em: EntityManager, p: { workspaceId: string; seats: number; checkoutSessionId: string; note: string }): Promise<boolean> {
  return addEntry(em, { workspaceId: p.workspaceId, delta: p.seats, reason: 'purchase', reference: p.checkoutSessionId, note: p.note });
}

/** A manual correction (support, load checks), once per reference. */
export function adjustSeats(em: EntityManager, workspaceId: string, delta: number, reference: string, note: string | null = null): Promise<boolean> {
  return addEntry(em, { workspaceId, delta, reason: 'adjustment', reference, note });
}

/** Serialises every seat decision of one workspace; holds until the transaction ends. */
export async function lockWorkspaceSeats(tx: EntityManager, workspaceId: string): Promise<void> {
  await sql(tx, 'select id from workspace where id = ? for update', [workspaceId]);
}

interface Waiting { em: EntityManager; fn: (tx: EntityManager) => Promise<unknown>; resolve: (v: unknown) => void; reject: (e: unknown) => void }
const holder = globalThis as unknown as { __seatQueues?: Map<string, Waiting[]> };
const queues = (holder.__seatQueues ??= new Map());
/** Seat decisions decided in one transaction at most (a burst of starts becomes a few transactions). */
const MAX_BATCH = 50;

/**
 * Runs `fn` in a transaction holding the workspace's seat lock (the row lock serialises every
 * instance of the app). Inside one process the seat decisions of a workspace wait in an
 * in-memory queue instead: a burst of starts and completes then holds one pooled connection
 * per workspace, not one per waiter, so the answer path keeps the rest of the pool. The
 * decisions waiting when the lock comes free are taken together, in order, in ONE transaction
 * (one BEGIN, one lock, one COMMIT and its WAL flush for the lot): each `fn` is one statement
 * that decides from what the ones before it wrote. `fn` must not throw for an expected outcome
 * (return it instead); should one fail, the batch is rolled back and each call is run alone,
 * so every caller gets its own result. Results are handed out only after the commit.
 */
export function withSeatLock<T>(em: EntityManager, workspaceId: string, fn: (tx: EntityManager) => Promise<T>): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    const waiting = queues.get(workspaceId);
    const entry: Waiting = { em, fn, resolve: resolve as (v: unknown) => void, reject };
    if (waiting) {
      waiting.push(entry);
      return;
    }
    queues.set(workspaceId, [entry]);
    void drain(workspaceId);
  });
}

async function drain(workspaceId: string): Promise<void> {
  const waiting = queues.get(workspaceId)!;
  try {
    while (waiting.length) await runBatch(workspaceId, waiting.splice(0, MAX_BATCH));
  } finally {
    queues.delete(workspaceId);
  }
}

async function runBatch(workspaceId: string, batch: Waiting[]): Promise<void> {
  const results: unknown[] = [];
  try {
    await batch[0].em.transactional(async (tx) => {
      await lockWorkspaceSeats(tx, workspaceId);
      for (const w of batch) results.push(await w.fn(tx));
    });
  } catch (err) {
    if (batch.length === 1) return batch[0].reject(err);
    for (const w of batch) await runBatch(workspaceId, [w]);
    return;
  }
  batch.forEach((w, i) => w.resolve(results[i]));
}

/**
 * Uses one seat for a completing respondent, exactly once (a retried or concurrent complete
 * adds nothing). Returns false when no seat is left (only possible for a respondent who went
 * quiet past the answering window). Call inside a transaction holding lockWorkspaceSeats.
 */
export async function useSeat(tx: EntityManager, workspaceId: string, respondentId: string): Promise<boolean> {
  if ((await seatBalance(tx, workspaceId)) <= 0) return false;
  await addEntry(tx, { workspaceId, delta: -1, reason: 'complete', reference: respondentId, note: 'Respondent completed' });
  return true;
}

// useSeat's rule and the respondent's completion in one statement (the balance sum, the entry
// keyed by the respondent with `on conflict do nothing`, the state change and the study's data
// version), so a complete holds the seat lock for one round trip.
const COMPLETE_WITH_SEAT = `
with r as (
  select r.id from respondent r join study s on s.id = r.study_id left join respondent_link l on l.id = r.link_id
   where r.id = ? and r.state = 'started' and s.state = 'live' and l.closed_at is null for update of r
), bal as (
  select coalesce(sum(delta), 0) as b from seat_ledger_entry where workspace_id = ?
), ins as (
  insert into seat_ledger_entry (id, workspace_id, delta, reason, reference, note, created_at)
  select gen_random_uuid(), ?, -1, 'complete', r.id::text, 'Respondent completed', now() from r, bal where bal.b > 0
  on conflict (reason, reference) do nothing returning id
), upd as (
  update respondent set state = 'completed', completed_at = now(), last_seen_at = now()
   where id in (select id from r) and exists (select 1 from ins) returning id
), st as (
  update study set data_version = data_version + 1 where id = ? and exists (select 1 from upd) returning id
)
select (select count(*) from r) as open, (select count(*) from upd) as done`;

/**
 * Completes a started respondent of a live study through an open link and uses its seat, in one
 * statement (call inside withSeatLock): 'completed'; 'no_seat' when the balance is spent (only
 * possible for a respondent whose hold lapsed, lib/server/billing/seat-holds.ts); 'not_open' when
 * the respondent is no longer started (completed meanwhile), the study is no longer live or
 * the link closed (respondent/server/link.ts stoppedRefusal: stop means stop for everyone).
 */
export async function completeWithSeat(tx: EntityManager, r: { workspaceId: string; studyId: string; respondentId: string }): Promise<'completed' | 'no_seat' | 'not_open'> {
  const row = await sqlOne<{ open: string; done: string }>(tx, COMPLETE_WITH_SEAT, [r.respondentId, r.workspaceId, r.workspaceId, r.studyId]);
  if (Number(row?.done ?? 0) > 0) return 'completed';
  return Number(row?.open ?? 0) > 0 ? 'no_seat' : 'not_open';
}
