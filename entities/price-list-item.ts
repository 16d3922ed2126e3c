import { defineEntity, type InferEntity } from '@mikro-orm/core';
import { PriceList } from './price-list';

export const PriceListItem = defineEntity({
  name: 'PriceListItem',
  tableName: 'price_list_item',
  uniques: [{ name: 'price_list_item_sku_unique', properties: ['priceList', 'sku'] }],
  properties: (p) => ({
    id: p.bigint('number').primary().autoincrement(),
    priceList: p.manyToOne(PriceList).deleteRule('cascade'),
    row: p.integer(),
    sku: p.string().length(64),
    name: p.string().length(200),
    regularPrice: p.double().$type<number>(),
    unitCost: p.double().$type<number>().nullable(),
    category: p.string().length(120).nullable(),
  }),
});
export type IPriceListItem = InferEntity<typeof PriceListItem>;
