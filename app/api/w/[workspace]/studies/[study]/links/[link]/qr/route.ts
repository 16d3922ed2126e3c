import QRCode from 'qrcode';
import { route } from '@/lib/server/http/route';
import { download } from '@/lib/server/http/download';
import { linkUrlFor } from '@/lib/server/studies/respondent-links';

/** A PNG QR code of the link's URL, for printed material (medium error correction survives small smudges). */
export const GET = route({ auth: 'member', role: 'viewer' }, async ({ ctx, params }) => {
  const url = await linkUrlFor(ctx, params.study, params.link);
  const png = await QRCode.toBuffer(url, { type: 'png', errorCorrectionLevel: 'M', margin: 2, width: 320, color: { dark: '#1F2430', light: '#FFFFFF' } });
  return download({ filename: 'respondent-link-qr.png', contentType: 'image/png', body: png }, { inline: true, cacheControl: 'private, max-age=3600' });
});
