import type { NextRequest } from 'next/server';
import { readJson, reply, route } from '@/lib/server/http/route';
import { BODY_LIMITS } from '@/lib/server/http/request-guard';
import { clientAddress } from '@/lib/server/platform/client-address';
import { answerBatchSchema } from '@/respondent/shared/answer.schema';
import { limitAnswersFromIp } from '@/respondent/server/answer-limits';
import { storeAnswerBatch } from '@/respondent/server/link-requests';

/**
 * The resume token: the page's header, the body (navigator.sendBeacon cannot set headers), or
 * ?resume=; failing those, the resume cookies scoped to /r that this phone holds (one per study).
 */
function resumeTokens(req: NextRequest, fromBody: string | undefined): string[] {
  const given = req.headers.get('x-resume-token') || fromBody || req.nextUrl.searchParams.get('resume');
  if (given) return [given];
  return req.cookies.getAll().filter((c) => c.name.startsWith('nw_r_')).slice(0, 8).map((c) => c.value);
}

/** POST {answers: [{clientId, idx, answer, responseMs}, …], resumeToken?}: stores a batch, exactly once per trial. */
export const POST = route<{ token: string }>(
  {
    auth: 'public', reason: 'respondents have no account: the link token and the resume token are the credential',
    // navigator.sendBeacon sends a string body as text/plain; the same-origin check still applies.
    body: { types: ['application/json', 'text/plain'], maxBytes: BODY_LIMITS.respondent },
  },
  async ({ req, params }) => {
    const batch = await readJson(req, answerBatchSchema);
    await limitAnswersFromIp(clientAddress(req.headers), batch.answers.length);
    const stored = await storeAnswerBatch(params.token, resumeTokens(req, batch.resumeToken), batch.answers);
    return reply(stored, 200, { 'cache-control': 'no-store' });
  },
);
