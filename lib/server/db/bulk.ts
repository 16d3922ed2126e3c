import 'server-only';
// Bulk rows (response imports, price lists, seeds): one INSERT … SELECT FROM json_to_recordset
// per chunk of rows, the chunk sent as a single JSON parameter — far cheaper to build and send
// than the one placeholder per cell of `insertMany`, which stored a 50,000-row price list
// markedly slower here. Table, columns and column types come from the entity's metadata, so no
// module writes a column list by hand. It runs through `sql()`, joining the EntityManager's
// open transaction. Plain rows skip `onCreate` hooks: callers pass ids and timestamps.
import { Utils, type EntityName, type RequiredEntityData } from '@mikro-orm/core';
import type { EntityManager } from '@mikro-orm/postgresql';
import { sql } from './sql';

const ROWS_PER_STATEMENT = 10_000;

type Values = Record<string, unknown>;

/**
 * Inserts rows in chunks; returns the row count. Rows use entity property names (relations as
 * ids); `shared` holds the values every row has (the parent's id, a state), bound once per
 * statement instead of repeated in each row — markedly faster for a uuid. The properties of
 * the first row are the per-row columns: a key left out of a later row is a NULL, not a default.
 */
export async function insertRows<T extends object>(
  em: EntityManager, entity: EntityName<T>, rows: Partial<RequiredEntityData<T>>[], shared: Partial<RequiredEntityData<T>> = {},
): Promise<number> {
  if (!rows.length) return 0;
  const meta = em.getMetadata().get(Utils.className(entity));
  const q = (name: string) => em.getPlatform().quoteIdentifier(name);
  const column = (name: string) => {
    const prop = meta.properties[name as keyof typeof meta.properties];
    if (!prop || prop.fieldNames?.length !== 1) throw new Error(`${meta.className}.${name} cannot be bulk-inserted`);
    return { name, field: prop.fieldNames[0], type: prop.columnTypes[0] };
  };
  const fixed = Object.keys(shared).map(column);
  const perRow = Object.keys(rows[0]).map(column);
  const text = `insert into ${q(meta.tableName)} (${[...fixed, ...perRow].map((c) => q(c.field)).join(', ')})
    select ${[...fixed.map((c) => `?::${c.type}`), ...perRow.map((c) => `r.${q(c.field)}`)].join(', ')}
      from json_to_recordset(?::json) as r(${perRow.map((c) => `${q(c.field)} ${c.type}`).join(', ')})`;
  const fixedValues = fixed.map((c) => (shared as Values)[c.name] ?? null);
  for (let i = 0; i < rows.length; i += ROWS_PER_STATEMENT) {
    const chunk = rows.slice(i, i + ROWS_PER_STATEMENT).map((row) => Object.fromEntries(perRow.map((c) => [c.field, (row as Values)[c.name] ?? null])));
    await sql(em, text, [...fixedValues, JSON.stringify(chunk)]);
  }
  return rows.length;
}
