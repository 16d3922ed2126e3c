import type { NextRequest } from 'next/server';
import { em } from '@/lib/server/db/orm';
import { linkRefusal, loadLink } from '@/respondent/server/link';
import { plainPage } from '@/respondent/server/plain-page';

/**
 * The shared link. Unknown, closed or paused links answer here with a plain page and a real
 * 404 or 410 status (a page can only say 404); open links continue to the flow, keeping ?pid=
 * and ?resume=.
 */
export async function GET(req: NextRequest, ctx: { params: Promise<{ token: string }> }) {
  const { token } = await ctx.params;
  const refusal = linkRefusal(await loadLink(await em(), token));
  if (refusal) {
    const title = refusal.status === 404 ? 'No study at this address' : 'This study is not open';
    return new Response(plainPage(title, refusal.message), { status: refusal.status, headers: { 'content-type': 'text/html; charset=utf-8', 'cache-control': 'no-store' } });
  }
  const to = new URL(`/r/${encodeURIComponent(token)}/take-part`, req.nextUrl.origin);
  for (const key of ['pid', 'resume']) {
    const v = req.nextUrl.searchParams.get(key);
    if (v) to.searchParams.set(key, v);
  }
  return new Response(null, { status: 307, headers: { location: to.pathname + to.search, 'cache-control': 'no-store' } });
}
