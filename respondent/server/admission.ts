import 'server-only';
// Admission: whether one more respondent may start through a link. A respondent who is still
// answering holds a seat, so a start is let in only while the seat balance exceeds the
// respondents already answering — their completes can take the balance to zero but never below
// — and while the link's quota has room. The start re-checks under the workspace's seat lock
// (lib/server/billing/seat-ledger.ts); the page's quick check does not lock.
import type { EntityManager } from '@mikro-orm/postgresql';
import { sqlOne } from '@/lib/server/db/sql';
import { seatBalance } from '@/lib/server/billing/seat-ledger';

/** Respondents count as answering (holding a seat) while seen within this window. */
export const ANSWERING_WINDOW_HOURS = 24;

async function answeringCount(em: EntityManager, column: 'workspace_id' | 'link_id', id: string): Promise<number> {
  const row = await sqlOne<{ n: string }>(
    em,
    `select count(*) as n from respondent where ${column} = ? and state = 'started' and last_seen_at > now() - interval '${ANSWERING_WINDOW_HOURS} hours'`,
    [id],
  );
  return Number(row?.n ?? 0);
}

/** A seat not yet held by an answering respondent (inside a transaction holding the seat lock). */
export async function seatAvailableForStart(em: EntityManager, workspaceId: string): Promise<boolean> {
  // Sequential: both run on the transaction's one connection.
  const balance = await seatBalance(em, workspaceId);
  return balance - (await answeringCount(em, 'workspace_id', workspaceId)) > 0;
}

/** A link's quota counts completes and respondents still answering through it. */
export async function quotaAvailable(em: EntityManager, linkId: string, quota: number | null): Promise<boolean> {
  if (quota == null) return true;
  const row = await sqlOne<{ n: string }>(em, `select count(*) as n from respondent where link_id = ? and state = 'completed'`, [linkId]);
  return Number(row?.n ?? 0) + (await answeringCount(em, 'link_id', linkId)) < quota;
}

/** A quick check before showing the consent screen (the start itself re-checks under the lock). */
export async function openForNewRespondents(em: EntityManager, workspaceId: string, linkId: string, quota: number | null): Promise<boolean> {
  return (await seatAvailableForStart(em, workspaceId)) && (await quotaAvailable(em, linkId, quota));
}
