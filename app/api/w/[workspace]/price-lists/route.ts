import { NextResponse } from 'next/server';
import { workspaceRoute } from '@/lib/server/http/route';
import { createPriceList, listPriceLists, parseMeta, readCsvUpload } from '@/lib/server/promotions/price-lists';

export const GET = workspaceRoute('viewer', async (_req, ctx) => NextResponse.json({ priceLists: await listPriceLists(ctx) }));

/** Stores a price list: the whole file valid, or nothing (422 with row-numbered issues). */
export const POST = workspaceRoute('analyst', async (req, ctx) => {
  const { text, fields } = await readCsvUpload(req);
  const meta = parseMeta(fields);
  return NextResponse.json({ priceList: await createPriceList(ctx, meta, text) }, { status: 201 });
});
