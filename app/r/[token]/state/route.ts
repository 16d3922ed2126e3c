import { route } from '@/lib/server/http/route';
import { limit } from '@/lib/server/platform/rate-limit';
import { clientAddress } from '@/lib/server/platform/client-address';
import { resumeTokenFrom } from '@/respondent/server/http';
import { respondentState } from '@/respondent/server/link-requests';
import type { FlowState } from '@/respondent/shared/types';

/** GET: the respondent's next screens (resume after closing the tab), by header, ?resume= or the cookie. */
export const GET = route(
  { auth: 'public', reason: 'respondents have no account: the link token in the path and their resume token identify them' },
  async ({ req, params }): Promise<FlowState> => {
    await limit('respondent-ip', clientAddress(req.headers));
    return respondentState(String(params.token), (studyId) => resumeTokenFrom(req, studyId));
  },
);
