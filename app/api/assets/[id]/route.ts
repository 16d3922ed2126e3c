import { route } from '@/lib/server/http/route';
import { download } from '@/lib/server/http/download';
import { notFoundError } from '@/lib/server/http/errors';
import { readPicture } from '@/lib/server/studies/assets';

/** An item picture by id; ids are random UUIDs and an upload never changes, so it caches for good. */
export const GET = route({ auth: 'public', reason: 'the respondent page shows the picture without a session; ids are random UUIDs' }, async ({ params }) => {
  const pic = await readPicture(params.id);
  if (!pic) throw notFoundError('That picture');
  return download({ filename: `picture-${params.id}`, contentType: pic.contentType, body: pic.bytes }, { inline: true, cacheControl: 'public, max-age=31536000, immutable' });
});
