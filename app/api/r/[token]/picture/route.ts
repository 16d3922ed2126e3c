import type { NextRequest } from 'next/server';
import { em } from '@/lib/server/db/orm';
import { AppError } from '@/lib/server/http/errors';
import { loadLink } from '@/respondent/server/link';

/** GET: the study's item picture, for the trial screens (only through a known link). */
export async function GET(_req: NextRequest, ctx: { params: Promise<{ token: string }> }) {
  const db = await em();
  const link = await loadLink(db, (await ctx.params).token);
  const id = link?.design.itemPictureId;
  const rows = id
    ? await db.getConnection().execute<{ content_type: string; bytes: Buffer }[]>('select content_type, bytes from study_asset where id = ? and workspace_id = ?', [id, link.workspaceId])
    : [];
  if (!rows[0]) {
    const e = new AppError(404, 'not_found', 'No picture.');
    return Response.json({ error: { code: e.code, message: e.message } }, { status: 404 });
  }
  return new Response(new Uint8Array(rows[0].bytes), { headers: { 'content-type': rows[0].content_type, 'cache-control': 'public, max-age=86400' } });
}
