import { NextResponse, type NextRequest } from 'next/server';
import { em } from '@/lib/server/db/orm';
import { AppError } from '@/lib/server/http/errors';
import { clientIp, limit } from '@/lib/server/platform/rate-limit';
import { respondentRoute, resumeTokenFrom } from '@/respondent/server/http';
import { openLink } from '@/respondent/server/link';
import { findByResume, stateOf } from '@/respondent/server/respondents';

/** GET: the respondent's next screens (resume after closing the tab). */
export const GET = respondentRoute(async (req: NextRequest, token: string) => {
  await limit('respondent-ip', clientIp(req.headers));
  const db = await em();
  const link = await openLink(db, token);
  const r = await findByResume(db, link.studyId, resumeTokenFrom(req, link.studyId));
  if (!r) throw new AppError(404, 'not_found', 'We could not find your answers. Start from the study link.');
  return NextResponse.json(await stateOf(db, link, r));
});
