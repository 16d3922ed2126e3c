import { route } from '@/lib/server/http/route';
import { em } from '@/lib/server/db/orm';
import { sqlOne } from '@/lib/server/db/sql';
import { AppError } from '@/lib/server/http/errors';
import { loadLink } from '@/respondent/server/link';

/**
 * GET: the study's item picture, for the trial screens (only through a known link). Cached by
 * the phone for a day: the one /r response next.config.mjs leaves out of its no-store.
 */
export const GET = route(
  { auth: 'public', reason: 'the item picture respondents see on each trial; reached only through a known link token' },
  async ({ params }) => {
    const db = await em();
    const link = await loadLink(db, String(params.token));
    const id = link?.design.itemPictureId;
    const row = id ? await sqlOne<{ content_type: string; bytes: Buffer }>(db, 'select content_type, bytes from study_asset where id = ? and workspace_id = ?', [id, link.workspaceId]) : undefined;
    if (!row) throw new AppError(404, 'not_found', 'No picture.');
    return new Response(new Uint8Array(row.bytes), { headers: { 'content-type': row.content_type, 'cache-control': 'public, max-age=86400' } });
  },
);
