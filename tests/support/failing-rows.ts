// A database that refuses some rows, for all-or-nothing tests: a trigger raises on every
// inserted row matching `condition` (as a constraint or a dropped connection would, deep inside
// a bulk write), and is dropped again afterwards whatever happens.
import { em } from '@/lib/server/db/orm';
import { sql } from '@/lib/server/db/sql';

export async function refuseRowsWhere(table: 'trial' | 'price_list_item' | 'respondent', condition: string, fn: () => Promise<void>): Promise<void> {
  const db = await em();
  const name = `test_refuse_${table}`;
  await sql(db, `create or replace function ${name}() returns trigger language plpgsql as $fn$ begin raise exception 'row refused by the test'; end $fn$`);
  await sql(db, `create trigger ${name} before insert on ${table} for each row when (${condition}) execute function ${name}()`);
  try {
    await fn();
  } finally {
    await sql(db, `drop trigger if exists ${name} on ${table}`);
    await sql(db, `drop function if exists ${name}()`);
  }
}
