import { NextResponse, type NextRequest } from 'next/server';
import { readJson } from '@/lib/server/http/route';
import { em } from '@/lib/server/db/orm';
import { answerSchema, recordAnswer } from '@/respondent/server/answers';
import { clientIp, limit } from '@/lib/server/platform/rate-limit';
import { respondentRoute, resumeTokenFrom } from '@/respondent/server/http';

/** POST {clientId, idx, answer, responseMs}: stores one answer, idempotent on the client id. */
export const POST = respondentRoute(async (req: NextRequest, token: string) => {
  await limit('respondent-ip', clientIp(req.headers));
  const resume = resumeTokenFrom(req);
  if (resume) await limit('respondent', `${token}|${resume}`);
  const input = await readJson(req, answerSchema);
  return NextResponse.json(await recordAnswer(await em(), token, resume, input));
});
