import { NextResponse, type NextRequest } from 'next/server';
import { readJson } from '@/lib/server/api';
import { em } from '@/lib/server/db';
import { answerSchema, recordAnswer } from '@/lib/server/respondent-answers';
import { clientIp, limit } from '@/lib/server/rate-limit';
import { respondentRoute, resumeTokenFrom } from '@/lib/server/respondent-http';

/** POST {clientId, idx, answer, responseMs}: stores one answer, idempotent on the client id. */
export const POST = respondentRoute(async (req: NextRequest, token: string) => {
  await limit('respondent-ip', clientIp(req.headers));
  const resume = resumeTokenFrom(req);
  if (resume) await limit('respondent', `${token}|${resume}`);
  const input = await readJson(req, answerSchema);
  return NextResponse.json(await recordAnswer(await em(), token, resume, input));
});
