import 'server-only';
// Seat holds: which respondents still answering keep a seat from new starts. A seat is used only
// when a respondent completes (./seat-ledger.ts); until then a respondent *holds* one, so that the
// respondents already answering can all complete. A hold is brief, so a link cannot be used to
// block a workspace's fieldwork with starts that never answer (issue 13, point 4):
// - a start holds its seat for START_HOLD_MINUTES, long enough for the consent screen, segment
//   questions and the first practice trial (the phone sends its first answers within seconds);
// - once a first answer has arrived, the respondent holds the seat while seen within
//   ANSWERING_HOLD_MINUTES — the same 30 minutes the fieldwork monitor counts as a drop-out
//   (tests/integration/seat-holds.test.ts checks the two stay equal).
// A respondent whose hold lapsed keeps every answer and may still complete; the complete then uses
// a seat only if the balance has one (never below zero), otherwise it is told the study is full.
// Counted with the partial index respondent_holding_index (workspace) and
// respondent_link_holding_index (link quota), so the count reads only the respondents started in
// the last half hour, not every respondent the workspace ever had.
import type { EntityManager } from '@mikro-orm/postgresql';
import { sqlOne } from '@/lib/server/db/sql';

export const START_HOLD_MINUTES = 10;
export const ANSWERING_HOLD_MINUTES = 30;

/** The hold rule as an SQL condition on respondent alias `r` (constants only: no parameters). */
export const HOLDING_SQL =
  `r.state = 'started' and r.last_seen_at > now() - interval '${ANSWERING_HOLD_MINUTES} minutes'` +
  ` and (r.answered_count > 0 or r.last_seen_at > now() - interval '${START_HOLD_MINUTES} minutes')`;

/** Seats held by respondents still answering, in a workspace or through one link. */
export async function heldSeats(em: EntityManager, scope: { workspaceId: string } | { linkId: string }): Promise<number> {
  const [column, id] = 'workspaceId' in scope ? ['workspace_id', scope.workspaceId] : ['link_id', scope.linkId];
  const row = await sqlOne<{ n: string }>(em, `select count(*) as n from respondent r where r.${column} = ? and ${HOLDING_SQL}`, [id]);
  return Number(row?.n ?? 0);
}
