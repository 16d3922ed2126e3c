import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { SeatLedgerEntry } from '@/entities/seat-ledger-entry';

export const WELCOME_SEATS = 25;

/** The seat balance: always the sum of the workspace's ledger. */
export async function seatBalance(db: EntityManager, workspaceId: string): Promise<number> {
  const rows = await db.getConnection().execute<{ balance: string | null }[]>(
    'select coalesce(sum(delta), 0) as balance from seat_ledger_entry where workspace_id = ?',
    [workspaceId],
  );
  return Number(rows[0]?.balance ?? 0);
}

/** Grants the welcome seats once per workspace (the reference makes it idempotent). */
export function addWelcomeSeats(db: EntityManager, workspaceId: string) {
  db.create(SeatLedgerEntry, { workspace: workspaceId, delta: WELCOME_SEATS, reason: 'welcome', reference: workspaceId, note: 'Free seats for a new workspace' });
}
