import { PRICE_LIST_UPLOAD } from '@/lib/schemas/price-list.schema';
import { route } from '@/lib/server/http/route';
import { parsePriceList } from '@/lib/promo/parse-price-list';
import { previewDto, readCsvUpload } from '@/lib/server/promotions/price-lists';

/** The preview step: the first rows and every error, nothing stored. */
export const POST = route({ auth: 'member', role: 'analyst', body: PRICE_LIST_UPLOAD }, async ({ req }) => {
  const { text } = await readCsvUpload(req);
  return previewDto(parsePriceList(text));
});
