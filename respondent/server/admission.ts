import 'server-only';
// Admission: whether one more respondent may start through a link. A respondent who is still
// answering holds a seat (the hold rule and its brief windows: lib/server/billing/seat-holds.ts),
// so a start is let in only while the seat balance exceeds the seats held — their completes can
// take the balance to zero but never below — and while the link's quota has room.
//
// The start decides and inserts in ONE statement under the workspace's seat lock
// (withSeatLock, lib/server/billing/seat-ledger.ts): the balance, the seats held (read through
// the partial index respondent_holding_index, so the cost follows the respondents of the last
// half hour, not all the workspace ever had) and the quota are read by the insert's own
// subqueries, after the lock, so no other start or complete of the workspace can slip between
// the check and the insert, on this instance or another. Less work under the lock is what lets
// one small machine admit a panel blast (issue 11: starts queued on this lock at ~14/s).
// The take-part page's quick check (openForNewRespondents) takes no lock; the start re-checks.
import type { EntityManager } from '@mikro-orm/postgresql';
import { seatBalance } from '@/lib/server/billing/seat-ledger';
import { HOLDING_SQL, heldSeats } from '@/lib/server/billing/seat-holds';
import { sqlOne } from '@/lib/server/db/sql';

/** Completes and seats held through a link: what its quota counts. */
async function linkCount(em: EntityManager, linkId: string): Promise<number> {
  const row = await sqlOne<{ n: string }>(em, `select count(*) as n from respondent r where r.link_id = ? and r.state = 'completed'`, [linkId]);
  return Number(row?.n ?? 0) + (await heldSeats(em, { linkId }));
}

/** A quick check before showing the consent screen (the start itself re-checks under the lock). */
export async function openForNewRespondents(em: EntityManager, workspaceId: string, linkId: string, quota: number | null): Promise<boolean> {
  if ((await seatBalance(em, workspaceId)) - (await heldSeats(em, { workspaceId })) <= 0) return false;
  return quota == null || (await linkCount(em, linkId)) < quota;
}

/** The new respondent's row. */
export interface NewRespondent {
  id: string;
  workspaceId: string;
  studyId: string;
  linkId: string;
  quota: number | null;
  pid: string | null;
  resumeToken: string;
  referenceCode: string;
  seed: number;
  segmentAnswers: Record<string, string>;
  plan: unknown;
}

export type Admission = 'admitted' | 'full' | 'pid_taken';

const ADMIT = `
with d as (
  select (select coalesce(sum(delta), 0) from seat_ledger_entry where workspace_id = ?)
         - (select count(*) from respondent r where r.workspace_id = ? and ${HOLDING_SQL}) > 0 as seat_ok,
         (?::int is null or (select count(*) from respondent r where r.link_id = ? and (r.state = 'completed' or (${HOLDING_SQL}))) < ?::int) as quota_ok
), ins as (
  insert into respondent (id, workspace_id, study_id, link_id, pid, resume_token, reference_code, seed, state, segment_answers, plan, answered_count, started_at, last_seen_at)
  select ?, ?, ?, ?, ?, ?, ?, ?, 'started', ?::jsonb, ?::jsonb, 0, now(), now() from d where d.seat_ok and d.quota_ok
  on conflict on constraint respondent_study_pid_unique do nothing
  returning id
)
select d.seat_ok, d.quota_ok, (select count(*) from ins) as inserted from d`;

/**
 * Admits and inserts the respondent in one statement; call inside withSeatLock. 'pid_taken'
 * when another respondent of the study holds the panel id (a concurrent start won it).
 */
export async function admitRespondent(tx: EntityManager, r: NewRespondent): Promise<Admission> {
  const row = await sqlOne<{ seat_ok: boolean; quota_ok: boolean; inserted: string }>(tx, ADMIT, [
    r.workspaceId, r.workspaceId, r.quota, r.linkId, r.quota,
    r.id, r.workspaceId, r.studyId, r.linkId, r.pid, r.resumeToken, r.referenceCode, r.seed, JSON.stringify(r.segmentAnswers), JSON.stringify(r.plan),
  ]);
  if (Number(row?.inserted ?? 0) > 0) return 'admitted';
  return row?.seat_ok && row.quota_ok ? 'pid_taken' : 'full';
}
