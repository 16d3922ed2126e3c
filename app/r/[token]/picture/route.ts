import { route } from '@/lib/server/http/route';
import { linkPicture } from '@/respondent/server/link-requests';

/**
 * GET: the study's item picture, for the trial screens (only through a known link). Cached by
 * the phone for a day: the one /r response next.config.mjs leaves out of its no-store.
 */
export const GET = route(
  { auth: 'public', reason: 'the item picture respondents see on each trial; reached only through a known link token' },
  async ({ params }) => {
    const pic = await linkPicture(String(params.token));
    return new Response(pic.bytes, { headers: { 'content-type': pic.contentType, 'cache-control': 'public, max-age=86400' } });
  },
);
