import { NextResponse, type NextRequest } from 'next/server';
import { em } from '@/lib/server/db/orm';
import { completeRespondent } from '@/respondent/server/complete';
import { clientIp, limit } from '@/lib/server/platform/rate-limit';
import { respondentRoute, resumeTokenFrom } from '@/respondent/server/http';

/** POST: finishes the respondent and uses one seat, exactly once however often it is retried. */
export const POST = respondentRoute(async (req: NextRequest, token: string) => {
  await limit('respondent-ip', clientIp(req.headers));
  return NextResponse.json(await completeRespondent(await em(), token, resumeTokenFrom(req)));
});
