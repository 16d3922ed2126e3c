import { NextResponse } from 'next/server';
import { workspaceRoute } from '@/lib/server/http/route';
import { deletePriceList, getPriceList } from '@/lib/server/promotions/price-lists';

type Params = { workspace: string; list: string };

export const GET = workspaceRoute<Params>('viewer', async (_req, ctx, p) => NextResponse.json({ priceList: await getPriceList(ctx, p.list) }));

/** Deleting a list also deletes the plans built on it (the database cascades). */
export const DELETE = workspaceRoute<Params>('analyst', async (_req, ctx, p) => {
  await deletePriceList(ctx, p.list);
  return new NextResponse(null, { status: 204 });
});
