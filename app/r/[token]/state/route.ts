import { route } from '@/lib/server/http/route';
import { em } from '@/lib/server/db/orm';
import { AppError } from '@/lib/server/http/errors';
import { clientIp, limit } from '@/lib/server/platform/rate-limit';
import { resumeTokenFrom } from '@/respondent/server/http';
import { openLink } from '@/respondent/server/link';
import { findByResume, stateOf } from '@/respondent/server/respondents';
import type { FlowState } from '@/respondent/shared/types';

/** GET: the respondent's next screens (resume after closing the tab), by header, ?resume= or the cookie. */
export const GET = route(
  { auth: 'public', reason: 'respondents have no account: the link token in the path and their resume token identify them' },
  async ({ req, params }): Promise<FlowState> => {
    await limit('respondent-ip', clientIp(req.headers));
    const db = await em();
    const link = await openLink(db, String(params.token));
    const r = await findByResume(db, link.studyId, resumeTokenFrom(req, link.studyId));
    if (!r) throw new AppError(404, 'not_found', 'We could not find your answers. Start from the study link.');
    return stateOf(db, link, r);
  },
);
