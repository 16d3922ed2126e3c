import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import { makeWorkspace } from '../support/factories';
import { makeLiveStudy, trialRows } from '../support/respondent-fixtures';
import { answerAll, answerRes, completeRes, startOk, startRes, stateRes, type Started } from '../support/respondent-client';
import { em } from '@/lib/server/db/orm';

describe('respondent answers: stored once, validated against the plan', () => {
  let token: string;
  let s: Started;
  beforeAll(async () => {
    const ws = await makeWorkspace();
    ({ token } = await makeLiveStudy(ws.slug));
    s = await startOk(token);
  });

  it('starts with consent and segment answers, practice first, a resume token and the whole plan', async () => {
    expect(s.resumeToken).toMatch(/^[A-Za-z0-9_-]{43}$/);
    expect(s.phase).toBe('trials');
    expect(s.upcoming[0].kind).toBe('practice');
    expect(s.total).toBe(s.upcoming.length);
    // The browser never learns which trials are catch trials or what discount is recorded.
    expect(JSON.stringify(s.upcoming)).not.toMatch(/catch|discount|rung/);
  });

  it('refuses start without consent or with an answer that is not an option (422)', async () => {
    expect((await startRes(token, { consent: false, segmentAnswers: {} })).status).toBe(422);
    const bad = await startRes(token, { consent: true, segmentAnswers: { household: 'seven' } });
    expect(bad.status).toBe(422);
    expect((await bad.json()).error.issues[0].path).toBe('segmentAnswers.household');
  });

  it('the same client id twice stores one row and answers 200 both times', async () => {
    const body = { clientId: randomUUID(), idx: 0, answer: 1, responseMs: 812 };
    const [a, b] = await Promise.all([answerRes(token, s.resumeToken, body), answerRes(token, s.resumeToken, body)]);
    expect([a.status, b.status]).toEqual([200, 200]);
    expect((await answerRes(token, s.resumeToken, body)).status).toBe(200);
    expect((await trialRows(s.resumeToken)).filter((r) => r.idx === 0)).toHaveLength(1);
  });

  it('the same index with another client id keeps one row (409)', async () => {
    const res = await answerRes(token, s.resumeToken, { clientId: randomUUID(), idx: 0, answer: 0, responseMs: 500 });
    expect(res.status).toBe(409);
    const rows = await trialRows(s.resumeToken);
    expect(rows).toHaveLength(1);
    expect(rows[0].answer).toBe(1);
  });

  it('tampered payloads are refused with 422 and store nothing', async () => {
    const rt = s.resumeToken;
    const ok = { clientId: randomUUID(), idx: 1, answer: 1, responseMs: 700 };
    const cases = [
      { ...ok, idx: 999 },
      { ...ok, idx: 5 }, // skipping ahead
      { ...ok, discount: 0.5 },
      { ...ok, basePrice: 9.99 },
      { ...ok, answer: 2 },
      { ...ok, clientId: 'not-a-uuid' },
      { ...ok, idx: -1 },
    ];
    for (const c of cases) {
      const res = await answerRes(token, rt, c);
      expect(res.status, JSON.stringify(c)).toBe(422);
    }
    expect(await trialRows(rt)).toHaveLength(1);
    expect((await answerRes(token, 'no-such-token', ok)).status).toBe(404);
  });

  it('records the planned base and shown discount and resumes at the next unanswered trial', async () => {
    const second = await startOk(token);
    for (const t of second.upcoming.slice(0, 4)) {
      expect((await answerRes(token, second.resumeToken, { clientId: randomUUID(), idx: t.idx, answer: 1, responseMs: 600 })).status).toBe(200);
    }
    const st = await (await stateRes(token, second.resumeToken)).json();
    expect(st.answered).toBe(4);
    expect(st.upcoming[0].idx).toBe(4);
    // Starting again with the same resume token resumes rather than making a new respondent.
    const again = await (await startRes(token, { consent: true, segmentAnswers: {} }, { 'x-resume-token': second.resumeToken })).json();
    expect(again.resumeToken).toBe(second.resumeToken);
    expect(again.upcoming[0].idx).toBe(4);
    const rows = await trialRows(second.resumeToken);
    expect(rows.map((r) => r.kind).slice(0, 2)).toEqual(['practice', 'practice']);
    expect(['test', 'catch', 'attention']).toContain(rows[2].kind);
    expect(rows.every((r, i) => Number(r.base_price) === second.upcoming[i].base)).toBe(true);
  });

  it('complete before the last trial is refused; the attention answer sets the flag; completion is recorded', async () => {
    const third = await startOk(token);
    expect((await completeRes(token, third.resumeToken)).status).toBe(409);
    await answerAll(token, third);
    const done = await completeRes(token, third.resumeToken);
    expect(done.status).toBe(200);
    const db = await em();
    const [r] = await db.getConnection().execute('select state, attention_passed, answered_count from respondent where resume_token = ?', [third.resumeToken]);
    expect(r).toMatchObject({ state: 'completed', attention_passed: true, answered_count: third.upcoming.length });
    expect((await (await stateRes(token, third.resumeToken)).json()).phase).toBe('completed');
  });
});
