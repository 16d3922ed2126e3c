import 'server-only';
// Raw SQL for the few hot or bulk paths (the answer batch, bulk imports, ledger sums, locks):
// the statement runs on the given EntityManager's connection and joins its transaction when
// one is open, so raw statements and entity changes commit or roll back together.
import type { EntityManager } from '@mikro-orm/postgresql';

type Row = Record<string, unknown>;

/** All rows of one statement; `?` placeholders, values bound by the driver. */
export function sql<T extends Row = Row>(em: EntityManager, text: string, params: readonly unknown[] = []): Promise<T[]> {
  return em.getConnection().execute<T[]>(text, [...params], 'all', em.getTransactionContext());
}

/** The first row of one statement, or undefined. */
export async function sqlOne<T extends Row = Row>(em: EntityManager, text: string, params: readonly unknown[] = []): Promise<T | undefined> {
  return (await sql<T>(em, text, params))[0];
}

/** Advisory lock for the rest of the current transaction, keyed by a readable string. */
export async function lockKey(em: EntityManager, key: string): Promise<void> {
  await sql(em, 'select pg_advisory_xact_lock(hashtext(?))', [key]);
}
