import { route, readJson, reply } from '@/lib/server/http/route';
import { BODY_LIMITS } from '@/lib/server/http/request-guard';
import { AppError } from '@/lib/server/http/errors';
import { limit } from '@/lib/server/platform/rate-limit';
import { clientAddress } from '@/lib/server/platform/client-address';
import { resumeCookie, resumeTokenFrom } from '@/respondent/server/http';
import { startRespondent } from '@/respondent/server/respondents';
import { stoppedDocument } from '@/respondent/server/document';
import { startSchema } from '@/respondent/shared/start.schema';
import { respondentUrls } from '@/respondent/shared/urls';
import { languageFromAcceptLanguage } from '@/respondent/messages/all';

/**
 * POST: agree and start (or resume, by header, ?resume= or the cookie). JSON from the page's
 * script; a plain form post (the consent screen before or without its script) is answered with
 * a redirect to the flow, or with the stop screen when the study cannot take the respondent.
 */
export const POST = route(
  {
    auth: 'public', reason: 'respondents have no account: the unguessable link token in the path lets anyone holding the link take part',
    // The consent screen is a real form (it works before and without the script): its post is
    // urlencoded, and comes from our own page, so the same-origin check holds for it too.
    body: { types: ['application/json', 'application/x-www-form-urlencoded'], maxBytes: BODY_LIMITS.respondent },
  },
  async ({ req, params }) => {
    const token = String(params.token);
    await limit('respondent-start-ip', clientAddress(req.headers));
    const secure = req.nextUrl.protocol === 'https:';
    const resumeFor = (studyId: string) => resumeTokenFrom(req, studyId);
    const client = {
      address: clientAddress(req.headers), cookie: (name: string) => req.cookies.get(name)?.value ?? null,
      language: languageFromAcceptLanguage(req.headers.get('accept-language')),
    };
    if ((req.headers.get('content-type') ?? '').includes('application/x-www-form-urlencoded')) {
      const form = await req.formData();
      const pid = String(form.get('pid') ?? '').trim();
      try {
        const out = await startRespondent(token, { consent: true, segmentAnswers: {}, ...(pid ? { pid } : {}) }, resumeFor, client);
        // A relative Location: behind `next start -H 127.0.0.1` the request's origin reads as localhost,
        // another origin (without the cookie just set) for a phone that came through 127.0.0.1.
        const flow = `${respondentUrls(token).takePart}?resume=${encodeURIComponent(out.resumeToken)}`;
        return reply(null, 303, { location: flow, 'set-cookie': resumeCookie(out.studyId, out.resumeToken, secure) });
      } catch (err) {
        if (!(err instanceof AppError) || err.status >= 500) throw err;
        return stoppedDocument(err);
      }
    }
    const { studyId, ...body } = await startRespondent(token, await readJson(req, startSchema), resumeFor, client);
    return reply(body, 200, { 'set-cookie': resumeCookie(studyId, body.resumeToken, secure) });
  },
);
