import { NextResponse, type NextRequest } from 'next/server';
import { em } from '@/lib/server/db';
import { completeRespondent } from '@/lib/server/respondent-complete';
import { clientIp, limit } from '@/lib/server/rate-limit';
import { respondentRoute, resumeTokenFrom } from '@/lib/server/respondent-http';

/** POST: finishes the respondent and uses one seat, exactly once however often it is retried. */
export const POST = respondentRoute(async (req: NextRequest, token: string) => {
  await limit('respondent-ip', clientIp(req.headers));
  return NextResponse.json(await completeRespondent(await em(), token, resumeTokenFrom(req)));
});
