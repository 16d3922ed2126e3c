import 'server-only';
// A price list's items, written and read in bulk: an upload (and the demo seed) stores up to
// 50,000 rows, a plan reads them all. Written through the PriceListItem entity's metadata in
// the caller's transaction; read with one plain query, as entities would cost far more.
import type { EntityManager } from '@mikro-orm/postgresql';
import { PriceListItem } from '@/entities/price-list-item';
import type { PlanItem } from '@/lib/promo/floor-table';
import { insertRows } from '@/lib/server/db/bulk';
import { sql } from '@/lib/server/db/sql';

/** One item with its row number in the uploaded file (header = row 1). */
export type StoredItem = PlanItem & { row: number };

export async function insertPriceListItems(tx: EntityManager, priceListId: string, items: StoredItem[]): Promise<number> {
  return insertRows(tx, PriceListItem, items.map((i) => ({
    row: i.row, sku: i.sku, name: i.name, regularPrice: i.regularPrice, unitCost: i.unitCost, category: i.category,
  })), { priceList: priceListId });
}

/** The items in file order. */
export async function readPriceListItems(db: EntityManager, priceListId: string): Promise<PlanItem[]> {
  const rows = await sql<{ sku: string; name: string; regular_price: number; unit_cost: number | null; category: string | null }>(
    db,
    'select sku, name, regular_price, unit_cost, category from price_list_item where price_list_id = ? order by "row"',
    [priceListId],
  );
  return rows.map((r) => ({ sku: r.sku, name: r.name, regularPrice: r.regular_price, unitCost: r.unit_cost, category: r.category }));
}
