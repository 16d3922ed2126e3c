import { noContent, route } from '@/lib/server/http/route';
import { deletePriceList, getPriceList } from '@/lib/server/promotions/price-lists';

export const GET = route({ auth: 'member', role: 'viewer' }, async ({ ctx, params }) => ({ priceList: await getPriceList(ctx, params.list) }));

/** Deleting a list also deletes the plans built on it (the database cascades). */
export const DELETE = route({ auth: 'member', role: 'analyst' }, async ({ ctx, params }) => {
  await deletePriceList(ctx, params.list);
  return noContent();
});
