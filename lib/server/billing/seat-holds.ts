import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';

// Seats: the balance is the sum of the workspace's ledger. A respondent may start only while
// the balance exceeds the respondents already answering, so their completes can take the
// balance to zero but never below. Both checks run under a lock on the workspace row.

/** Respondents count as answering (holding a seat) while seen within this window. */
export const ANSWERING_WINDOW_HOURS = 24;

type Tx = EntityManager;
const exec = <T extends Record<string, unknown>[] = Record<string, unknown>[]>(tx: Tx, sql: string, params: unknown[]) => tx.getConnection().execute<T>(sql, params, 'all', tx.getTransactionContext());

/** Serialises every seat decision of one workspace (starts and completes). */
export async function lockWorkspace(tx: Tx, workspaceId: string): Promise<void> {
  await exec(tx, 'select id from workspace where id = ? for update', [workspaceId]);
}

export async function ledgerBalance(tx: Tx, workspaceId: string): Promise<number> {
  const rows = await exec<{ balance: string }[]>(tx, 'select coalesce(sum(delta), 0) as balance from seat_ledger_entry where workspace_id = ?', [workspaceId]);
  return Number(rows[0]?.balance ?? 0);
}

async function answeringCount(tx: Tx, where: string, id: string): Promise<number> {
  const rows = await exec<{ n: string }[]>(
    tx,
    `select count(*) as n from respondent where ${where} = ? and state = 'started' and last_seen_at > now() - interval '${ANSWERING_WINDOW_HOURS} hours'`,
    [id],
  );
  return Number(rows[0]?.n ?? 0);
}

/** Whether one more respondent may start (call inside a transaction holding lockWorkspace). */
export async function seatAvailableForStart(tx: Tx, workspaceId: string): Promise<boolean> {
  // Sequential: both run on the transaction's one connection.
  const balance = await ledgerBalance(tx, workspaceId);
  return balance - (await answeringCount(tx, 'workspace_id', workspaceId)) > 0;
}

/** A link's quota counts completes and respondents still answering through it. */
export async function quotaAvailable(tx: Tx, linkId: string, quota: number | null): Promise<boolean> {
  if (quota == null) return true;
  const rows = await exec<{ n: string }[]>(tx, `select count(*) as n from respondent where link_id = ? and state = 'completed'`, [linkId]);
  return Number(rows[0]?.n ?? 0) + (await answeringCount(tx, 'link_id', linkId)) < quota;
}

/**
 * Uses one seat for a completing respondent, exactly once: the ledger's unique (reason,
 * reference) makes a retried or concurrent complete a no-op. Returns false when no seat is
 * left (only possible for a respondent who went quiet past the answering window).
 */
export async function useSeat(tx: Tx, workspaceId: string, respondentId: string): Promise<boolean> {
  if ((await ledgerBalance(tx, workspaceId)) <= 0) return false;
  await exec(
    tx,
    `insert into seat_ledger_entry (id, workspace_id, delta, reason, reference, note, created_at)
     values (gen_random_uuid(), ?, -1, 'complete', ?, 'Respondent completed', now()) on conflict do nothing`,
    [workspaceId, respondentId],
  );
  return true;
}

/** A quick check before showing the consent screen (the start itself re-checks under the lock). */
export async function openForNewRespondents(db: EntityManager, workspaceId: string, linkId: string, quota: number | null): Promise<boolean> {
  return (await seatAvailableForStart(db, workspaceId)) && (await quotaAvailable(db, linkId, quota));
}
