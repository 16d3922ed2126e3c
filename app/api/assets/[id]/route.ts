import { jsonError } from '@/lib/server/http/route';
import { readPicture } from '@/lib/server/studies/assets';

/** Public: the respondent page shows the picture. Ids are random UUIDs and an upload never changes. */
export async function GET(_req: Request, { params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const pic = await readPicture(id);
  if (!pic) return jsonError(404, 'not_found', 'That picture was not found.');
  return new Response(new Uint8Array(pic.bytes), {
    headers: {
      'content-type': pic.contentType,
      'content-length': String(pic.bytes.byteLength),
      'cache-control': 'public, max-age=31536000, immutable',
      'x-content-type-options': 'nosniff',
      'content-security-policy': "default-src 'none'",
    },
  });
}
