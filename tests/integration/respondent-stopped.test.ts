import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { em } from '@/lib/server/db/orm';
import { sql } from '@/lib/server/db/sql';
import type { PublicTrial } from '@/respondent/shared/types';
import { makeWorkspace } from '../support/factories';
import { makeLiveStudy } from '../support/respondent-fixtures';
import { answerAll, answerFor, answersRes, completeRes, startOk, stateRes } from '../support/respondent-client';

// Issue 13, finding 12: a paused study or a closed link kept accepting answers (and completes)
// from respondents already in progress while /state told the same phone 410. The one rule now
// (respondent/server/link.ts stoppedRefusal): /state, answers and complete refuse together,
// with the same 410 and message, and accept again when the study is resumed.

const one = (t: PublicTrial) => ({ clientId: randomUUID(), idx: t.idx, answer: answerFor(t), responseMs: 800 });

async function refusedAlike(token: string, rt: string, batch: Record<string, unknown>[], message: RegExp) {
  const state = await stateRes(token, rt);
  const answers = await answersRes(token, rt, batch);
  const complete = await completeRes(token, rt);
  for (const [name, res] of [['state', state], ['answers', answers], ['complete', complete]] as const) {
    expect(res.status, name).toBe(410);
    const { error } = await res.json();
    expect(error.code, name).toBe('gone');
    expect(error.message, name).toMatch(message);
  }
}

const storedTrials = async (rt: string) =>
  (await sql<{ n: number }>(await em(), 'select count(*)::int as n from trial t join respondent r on r.id = t.respondent_id where r.resume_token = ?', [rt]))[0].n;

describe('a paused study or a closed link stops respondents in progress exactly as /state says', () => {
  it('paused: state, answers and complete all 410 "paused"; nothing stored; resumed: the same batch is stored', async () => {
    const ws = await makeWorkspace();
    const { token, studyId } = await makeLiveStudy(ws.slug);
    const s = await startOk(token);
    await sql(await em(), `update study set state = 'paused' where id = ?`, [studyId]);
    const batch = s.upcoming.slice(0, 3).map(one);
    await refusedAlike(token, s.resumeToken, batch, /paused/);
    expect(await storedTrials(s.resumeToken)).toBe(0);
    await sql(await em(), `update study set state = 'live' where id = ?`, [studyId]);
    expect((await stateRes(token, s.resumeToken)).status).toBe(200);
    expect((await answersRes(token, s.resumeToken, batch)).status).toBe(200);
    expect(await storedTrials(s.resumeToken)).toBe(3);
  });

  it('a closed link (study still live): state, answers and complete all 410 "link is closed"', async () => {
    const ws = await makeWorkspace();
    const { token, linkId } = await makeLiveStudy(ws.slug);
    const s = await startOk(token);
    expect((await answersRes(token, s.resumeToken, s.upcoming.slice(0, 2).map(one))).status).toBe(200);
    await sql(await em(), 'update respondent_link set closed_at = now() where id = ?', [linkId]);
    await refusedAlike(token, s.resumeToken, s.upcoming.slice(2, 4).map(one), /link is closed/);
    expect(await storedTrials(s.resumeToken)).toBe(2);
  });

  it('a respondent who answered everything cannot complete while paused, and completes once resumed', async () => {
    const ws = await makeWorkspace();
    const { token, studyId } = await makeLiveStudy(ws.slug);
    const s = await startOk(token);
    await answerAll(token, s);
    await sql(await em(), `update study set state = 'paused' where id = ?`, [studyId]);
    expect((await completeRes(token, s.resumeToken)).status).toBe(410);
    await sql(await em(), `update study set state = 'live' where id = ?`, [studyId]);
    expect((await completeRes(token, s.resumeToken)).status).toBe(200);
  });
});
