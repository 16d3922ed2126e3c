import { NextResponse, type NextRequest } from 'next/server';
import { readJson } from '@/lib/server/http/route';
import { AppError } from '@/lib/server/http/errors';
import { clientIp, limit } from '@/lib/server/platform/rate-limit';
import { respondentRoute, resumeTokenFrom, setResumeCookie } from '@/respondent/server/http';
import { startRespondent, startSchema } from '@/respondent/server/respondents';
import { plainPage } from '@/respondent/server/plain-page';

/**
 * POST: agree and start (or resume). JSON from the page's script; a plain form post (the
 * consent screen before its script has loaded) is answered with a redirect to the flow.
 */
export const POST = respondentRoute(async (req: NextRequest, token: string) => {
  await limit('respondent-start-ip', clientIp(req.headers));
  const secure = req.nextUrl.protocol === 'https:';
  const isForm = (req.headers.get('content-type') ?? '').includes('application/x-www-form-urlencoded');
  if (isForm) return formStart(req, token, secure);
  const input = await readJson(req, startSchema);
  const out = await startRespondent(token, input, resumeTokenFrom(req));
  const { studyId, ...body } = out;
  const res = NextResponse.json(body);
  setResumeCookie(res, studyId, out.resumeToken, secure);
  return res;
});

async function formStart(req: NextRequest, token: string, secure: boolean) {
  const form = await req.formData();
  const pid = String(form.get('pid') ?? '').trim();
  try {
    const out = await startRespondent(token, { consent: true, segmentAnswers: {}, ...(pid ? { pid } : {}) }, null);
    // A relative Location: behind `next start -H 127.0.0.1` the request's origin reads as localhost,
    // another origin (without the cookie just set) for a phone that came through 127.0.0.1.
    const flow = `/r/${encodeURIComponent(token)}/take-part?resume=${encodeURIComponent(out.resumeToken)}`;
    const res = new NextResponse(null, { status: 303, headers: { location: flow } });
    setResumeCookie(res, out.studyId, out.resumeToken, secure);
    return res;
  } catch (err) {
    if (!(err instanceof AppError) || err.status >= 500) throw err;
    const title = err.code === 'study_full' ? 'This study is full' : err.code === 'already_taken_part' ? 'You have already taken part' : 'This study is not available';
    return new Response(plainPage(title, err.message), { status: err.status, headers: { 'content-type': 'text/html; charset=utf-8' } });
  }
}
