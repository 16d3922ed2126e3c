import { PRICE_LIST_UPLOAD } from '@/lib/schemas/price-list.schema';
import { reply, route } from '@/lib/server/http/route';
import { createPriceList, listPriceLists, parseMeta, readCsvUpload } from '@/lib/server/promotions/price-lists';

export const GET = route({ auth: 'member', role: 'viewer' }, async ({ ctx }) => ({ priceLists: await listPriceLists(ctx) }));

/** Stores a price list: the whole file valid, or nothing (422 with row-numbered issues). */
export const POST = route({ auth: 'member', role: 'analyst', body: PRICE_LIST_UPLOAD }, async ({ req, ctx }) => {
  const { text, fields } = await readCsvUpload(req);
  const meta = parseMeta(fields);
  return reply({ priceList: await createPriceList(ctx, meta, text) }, 201);
});
