import { route } from '@/lib/server/http/route';
import { stoppedDocument } from '@/respondent/server/document';
import { linkEntryRefusal } from '@/respondent/server/link-requests';
import { respondentUrls } from '@/respondent/shared/urls';
import { languageFromAcceptLanguage } from '@/respondent/messages/all';

/**
 * The shared link. Unknown, closed or paused links answer here with the stop screen and a real
 * 404 or 410 status (a page can only say 404); open links continue to the flow, keeping ?pid=
 * (with a panel's ?sig=) and ?resume=.
 */
export const GET = route(
  { auth: 'public', reason: 'the link respondents are sent to; the unguessable token in the path is the only credential' },
  async ({ req, params }) => {
    const token = String(params.token);
    const refusal = await linkEntryRefusal(token, languageFromAcceptLanguage(req.headers.get('accept-language')));
    if (refusal) return stoppedDocument(refusal);
    const to = new URLSearchParams();
    for (const key of ['pid', 'sig', 'resume']) {
      const v = req.nextUrl.searchParams.get(key);
      if (v) to.set(key, v);
    }
    const query = to.size ? `?${to}` : '';
    return new Response(null, { status: 307, headers: { location: respondentUrls(token).takePart + query } });
  },
);
