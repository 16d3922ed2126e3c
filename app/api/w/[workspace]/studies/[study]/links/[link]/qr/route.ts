import QRCode from 'qrcode';
import { workspaceRoute } from '@/lib/server/http/route';
import { linkUrlFor } from '@/lib/server/studies/respondent-links';

/** A PNG QR code of the link's URL, for printed material (medium error correction survives small smudges). */
export const GET = workspaceRoute<{ workspace: string; study: string; link: string }>('viewer', async (_req, ctx, p) => {
  const url = await linkUrlFor(ctx, p.study, p.link);
  const png = await QRCode.toBuffer(url, { type: 'png', errorCorrectionLevel: 'M', margin: 2, width: 320, color: { dark: '#1F2430', light: '#FFFFFF' } });
  return new Response(new Uint8Array(png), { headers: { 'content-type': 'image/png', 'cache-control': 'private, max-age=3600', 'content-disposition': 'inline; filename="respondent-link-qr.png"' } });
});
