import { route } from '@/lib/server/http/route';
import { BODY_LIMITS } from '@/lib/server/http/request-guard';
import { limit } from '@/lib/server/platform/rate-limit';
import { clientAddress } from '@/lib/server/platform/client-address';
import { completeByLink } from '@/respondent/server/link-requests';
import { resumeTokenFrom } from '@/respondent/server/http';
import type { CompleteReply } from '@/respondent/shared/complete.schema';

/** POST: finishes the respondent and uses one seat, exactly once however often it is retried. */
export const POST = route(
  {
    auth: 'public', reason: 'respondents have no account: the link token in the path and their resume token identify them',
    body: { maxBytes: BODY_LIMITS.respondent },
  },
  async ({ req, params }): Promise<CompleteReply> => {
    await limit('respondent-ip', clientAddress(req.headers));
    return completeByLink(String(params.token), resumeTokenFrom(req));
  },
);
