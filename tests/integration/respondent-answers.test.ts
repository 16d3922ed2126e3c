import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import { POST as answers } from '@/app/r/[token]/answers/route';
import { callRoute, makeWorkspace } from '../support/factories';
import { makeLiveStudy, testDesign, trialRows } from '../support/respondent-fixtures';
import { answerAll, answerFor, answerRes, answersRes, completeRes, startOk, startRes, stateRes, type Started } from '../support/respondent-client';
import { em } from '@/lib/server/db/orm';
import { sql } from '@/lib/server/db/sql';
import type { PublicTrial } from '@/respondent/shared/types';

type Reply = { acknowledged: string[]; conflicts: string[]; answered: number; next?: PublicTrial | null };
const one = (t: { idx: number; kind: string; attention?: { options: string[] } }, over: Record<string, unknown> = {}) =>
  ({ clientId: randomUUID(), idx: t.idx, answer: answerFor(t as PublicTrial), responseMs: 800, ...over });
const counterOf = async (rt: string) => Number((await sql<{ n: number }>(await em(), 'select answered_count as n from respondent where resume_token = ?', [rt]))[0].n);

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

  it('the same answer sent twice at once and again later stores one row and acknowledges it every time', async () => {
    const body = { clientId: randomUUID(), idx: 0, answer: 1, responseMs: 812 };
    const [a, b] = await Promise.all([answerRes(token, s.resumeToken, body), answerRes(token, s.resumeToken, body)]);
    expect([a.status, b.status]).toEqual([200, 200]);
    for (const r of [a, b]) expect((await r.json()).acknowledged).toEqual([body.clientId]);
    const again = await answerRes(token, s.resumeToken, body);
    expect(await again.json()).toMatchObject({ acknowledged: [body.clientId], conflicts: [], answered: 1 });
    expect((await trialRows(s.resumeToken)).filter((r) => r.idx === 0)).toHaveLength(1);
  });

  it('another answer for a trial already answered is named a conflict (the phone drops it) and the stored answer stays', async () => {
    const other = { clientId: randomUUID(), idx: 0, answer: 0, responseMs: 500 };
    const res = await answerRes(token, s.resumeToken, other);
    expect(res.status).toBe(200);
    expect(await res.json()).toMatchObject({ acknowledged: [], conflicts: [other.clientId], answered: 1 });
    const rows = await trialRows(s.resumeToken);
    expect(rows).toHaveLength(1);
    expect(rows[0].answer).toBe(1);
  });

  it('tampered answers are refused with 422 naming the row, and store nothing', async () => {
    const rt = s.resumeToken;
    const ok = { clientId: randomUUID(), idx: 1, answer: 1, responseMs: 700 };
    const cases: [Record<string, unknown>, string][] = [
      [{ ...ok, idx: 999 }, 'answers.0.idx'],
      [{ ...ok, idx: 5 }, 'answers.0.idx'], // skipping ahead
      [{ ...ok, discount: 0.5 }, 'answers.0'],
      [{ ...ok, basePrice: 9.99 }, 'answers.0'],
      [{ ...ok, answer: 2 }, 'answers.0.answer'],
      [{ ...ok, clientId: 'not-a-uuid' }, 'answers.0.clientId'],
      [{ ...ok, idx: -1 }, 'answers.0.idx'],
    ];
    for (const [c, path] of cases) {
      const res = await answerRes(token, rt, c);
      expect(res.status, JSON.stringify(c)).toBe(422);
      expect((await res.json()).error.issues[0].path, JSON.stringify(c)).toBe(path);
    }
    expect(await trialRows(rt)).toHaveLength(1);
    expect(await counterOf(rt)).toBe(1);
    expect((await answerRes(token, 'no-such-token', ok)).status).toBe(404);
  });

  it('records the planned base and shown discount and resumes at the next unanswered trial', async () => {
    const second = await startOk(token);
    const res = await answersRes(token, second.resumeToken, second.upcoming.slice(0, 4).map((t) => one(t, { answer: 1 })));
    expect(res.status).toBe(200);
    expect((await res.json()).answered).toBe(4);
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

  it('complete before the last answer has arrived is a 409 saying how many are missing; the attention answer sets the flag; completion is recorded', async () => {
    const third = await startOk(token);
    const early = await completeRes(token, third.resumeToken);
    expect(early.status).toBe(409);
    expect((await early.json()).error.message).toBe(`${third.upcoming.length} of ${third.upcoming.length} answers have not reached us yet. Send them before completing.`);
    await answerAll(token, third);
    const done = await completeRes(token, third.resumeToken);
    expect(done.status).toBe(200);
    const db = await em();
    const [r] = await sql(db, 'select state, attention_passed, answered_count from respondent where resume_token = ?', [third.resumeToken]);
    expect(r).toMatchObject({ state: 'completed', attention_passed: true, answered_count: third.upcoming.length });
    expect((await (await stateRes(token, third.resumeToken)).json()).phase).toBe('completed');
    // Another answer for a trial answered before completing is a conflict: the phone drops it, nothing is stored.
    const late = await answerRes(token, third.resumeToken, { clientId: randomUUID(), idx: 0, answer: 1, responseMs: 500 });
    expect(late.status).toBe(200);
    expect((await late.json()).conflicts).toHaveLength(1);
    expect(await trialRows(third.resumeToken)).toHaveLength(third.upcoming.length);
  });
});

describe('answer batches: in one statement, exactly once, all or nothing', () => {
  let token: string;
  let studyId: string;
  beforeAll(async () => {
    const ws = await makeWorkspace();
    ({ token, studyId } = await makeLiveStudy(ws.slug));
  });

  it('a batch of four is stored in trial order with the counter moved once to the end', async () => {
    const s = await startOk(token);
    // Sent out of order on purpose: the server orders by trial index.
    const batch = s.upcoming.slice(0, 4).map((t) => one(t)).reverse();
    const res = await answersRes(token, s.resumeToken, batch);
    expect(res.status).toBe(200);
    const reply = (await res.json()) as Reply;
    expect(new Set(reply.acknowledged)).toEqual(new Set(batch.map((a) => a.clientId)));
    expect(reply).toMatchObject({ conflicts: [], answered: 4 });
    expect(reply.next).toBeUndefined(); // fixed plans: the phone already knows its trials
    expect((await trialRows(s.resumeToken)).map((r) => r.idx)).toEqual([0, 1, 2, 3]);
  });

  it('the same answer twice in one batch is stored once; two answers for one trial or one id for two answers refuse the batch', async () => {
    const s = await startOk(token);
    const [t0, t1] = s.upcoming;
    const a0 = one(t0);
    const dup = await answersRes(token, s.resumeToken, [a0, one(t1), a0]);
    expect(dup.status).toBe(200);
    expect((await dup.json()).acknowledged).toHaveLength(2);
    expect(await trialRows(s.resumeToken)).toHaveLength(2);

    const [t2, t3] = s.upcoming.slice(2);
    const twoForOne = await answersRes(token, s.resumeToken, [one(t2), one(t3), one(t3)]);
    expect(twoForOne.status).toBe(422);
    expect((await twoForOne.json()).error.issues[0]).toMatchObject({ path: 'answers.2.idx', message: 'Two different answers for one trial.' });
    const reused = one(t2);
    const oneIdTwice = await answersRes(token, s.resumeToken, [reused, { ...reused, idx: t3.idx }]);
    expect(oneIdTwice.status).toBe(422);
    expect((await oneIdTwice.json()).error.issues[0].path).toBe('answers.1.clientId');
    expect(await trialRows(s.resumeToken)).toHaveLength(2);
    expect(await counterOf(s.resumeToken)).toBe(2);
  });

  it('a batch retried (its reply lost), sequentially and concurrently, stores each answer once and acknowledges all of them each time', async () => {
    const s = await startOk(token);
    const batch = s.upcoming.slice(0, 4).map((t) => one(t));
    const replies = await Promise.all([1, 2, 3].map(() => answersRes(token, s.resumeToken, batch)));
    const later = await answersRes(token, s.resumeToken, batch);
    for (const r of [...replies, later]) {
      expect(r.status).toBe(200);
      expect(new Set(((await r.json()) as Reply).acknowledged)).toEqual(new Set(batch.map((a) => a.clientId)));
    }
    const rows = await trialRows(s.resumeToken);
    expect(rows.map((r) => r.client_id)).toEqual(batch.map((a) => a.clientId));
    expect(await counterOf(s.resumeToken)).toBe(4);
    // A retry that overlaps new answers: the stored ones are acknowledged, the new ones stored.
    const next = s.upcoming.slice(4, 6).map((t) => one(t));
    const overlap = await answersRes(token, s.resumeToken, [...batch.slice(2), ...next]);
    expect(((await overlap.json()) as Reply).acknowledged).toHaveLength(4);
    expect(await trialRows(s.resumeToken)).toHaveLength(6);
  });

  it('one bad answer refuses the whole batch with its row index, and nothing of it is written', async () => {
    const s = await startOk(token);
    const batch = s.upcoming.slice(0, 4).map((t) => one(t));
    const attention = s.upcoming.find((t) => t.kind === 'attention')!;
    // Row 2 gives an answer that is not 0 or 1.
    const res = await answersRes(token, s.resumeToken, batch.map((a, i) => (i === 2 ? { ...a, answer: 5 } : a)));
    expect(res.status).toBe(422);
    expect((await res.json()).error).toMatchObject({ code: 'validation_failed', issues: [{ path: 'answers.2.answer', message: 'The answer must be 0 or 1.' }] });
    // A gap inside the batch names the row after it.
    const gap = await answersRes(token, s.resumeToken, [batch[0], batch[1], batch[3]]);
    expect(gap.status).toBe(422);
    expect((await gap.json()).error.issues[0]).toMatchObject({ path: 'answers.2.idx', message: 'Answer the trials in order.' });
    // A batch that starts after the next unanswered trial stores nothing.
    const ahead = await answersRes(token, s.resumeToken, batch.slice(1));
    expect(ahead.status).toBe(422);
    expect((await ahead.json()).error.issues[0]).toMatchObject({ path: 'answers.0.idx', message: 'Answer the trials in order.' });
    // The attention check's options are checked against the design.
    const far = await answersRes(token, s.resumeToken, [...batch, one(attention, { answer: 7 })]);
    expect(far.status).toBe(422);
    expect(await trialRows(s.resumeToken)).toHaveLength(0);
    expect(await counterOf(s.resumeToken)).toBe(0);
    // The same batch without the bad answer goes through.
    expect((await answersRes(token, s.resumeToken, batch)).status).toBe(200);
    expect(await trialRows(s.resumeToken)).toHaveLength(4);
  });

  it('a batch of more than 32 answers or of none is refused before anything is read', async () => {
    const s = await startOk(token);
    const many = Array.from({ length: 33 }, (_, i) => ({ clientId: randomUUID(), idx: i, answer: 1, responseMs: 500 }));
    const tooMany = await answersRes(token, s.resumeToken, many);
    expect(tooMany.status).toBe(422);
    expect((await tooMany.json()).error.issues[0]).toMatchObject({ path: 'answers', message: 'Send at most 32 answers at a time.' });
    expect((await answersRes(token, s.resumeToken, [])).status).toBe(422);
    expect(await trialRows(s.resumeToken)).toHaveLength(0);
  });

  it('a sendBeacon body (text/plain, the resume token in the body, no header) is stored; so is a batch carrying only the /r cookie', async () => {
    const s = await startOk(token);
    const batch = s.upcoming.slice(0, 2).map((t) => one(t));
    const beacon = await callRoute(answers, {
      method: 'POST', params: { token }, headers: { 'content-type': 'text/plain;charset=UTF-8' },
      rawBody: JSON.stringify({ resumeToken: s.resumeToken, answers: batch }),
    });
    expect(beacon.status).toBe(200);
    expect(((await beacon.json()) as Reply).acknowledged).toHaveLength(2);
    const next = [one(s.upcoming[2])];
    const cookie = `nw_r_${randomUUID()}=someone-elses-token; nw_r_${studyId}=${s.resumeToken}`;
    const viaCookie = await callRoute(answers, { method: 'POST', params: { token }, headers: { cookie }, body: { answers: next } });
    expect(viaCookie.status).toBe(200);
    expect((await trialRows(s.resumeToken)).map((r) => r.client_id)).toEqual([...batch, ...next].map((a) => a.clientId));
    // Without any resume token the batch belongs to nobody.
    const none = await callRoute(answers, { method: 'POST', params: { token }, body: { answers: [one(s.upcoming[3])] } });
    expect(none.status).toBe(404);
    expect(await trialRows(s.resumeToken)).toHaveLength(3);
  });

  it('answers on another study\'s link are not found, whatever the resume token', async () => {
    const s = await startOk(token);
    const ws = await makeWorkspace();
    const other = await makeLiveStudy(ws.slug);
    const res = await answersRes(other.token, s.resumeToken, [one(s.upcoming[0])]);
    expect(res.status).toBe(404);
    expect(await trialRows(s.resumeToken)).toHaveLength(0);
  });
});

describe('answer batches after the study is paused or closed', () => {
  // Issue 13, finding 12: answers used to go on during a pause while /state said 410. Now the
  // same rule holds for both (respondent/server/link.ts stoppedRefusal); resuming the study lets them on.
  it('paused: new answers refused (410) like /state, accepted again once resumed; closed: refused (410), replays still acknowledged', async () => {
    const ws = await makeWorkspace();
    const { token, studyId } = await makeLiveStudy(ws.slug);
    const s = await startOk(token);
    const db = await em();
    const first = s.upcoming.slice(0, 2).map((t) => one(t));
    expect((await answersRes(token, s.resumeToken, first)).status).toBe(200);

    await sql(db, `update study set state = 'paused' where id = ?`, [studyId]);
    const duringPause = s.upcoming.slice(2, 4).map((t) => one(t));
    const refused = await answersRes(token, s.resumeToken, duringPause);
    expect(refused.status).toBe(410);
    expect((await refused.json()).error.message).toMatch(/paused/);
    expect((await stateRes(token, s.resumeToken)).status).toBe(410);
    expect(await trialRows(s.resumeToken)).toHaveLength(2);
    // The phone kept them; once the study is live again they go through.
    await sql(db, `update study set state = 'live' where id = ?`, [studyId]);
    expect((await answersRes(token, s.resumeToken, duringPause)).status).toBe(200);
    expect(await trialRows(s.resumeToken)).toHaveLength(4);

    await sql(db, `update study set state = 'closed', closed_at = now() where id = ?`, [studyId]);
    const afterClose = await answersRes(token, s.resumeToken, s.upcoming.slice(4, 6).map((t) => one(t)));
    expect(afterClose.status).toBe(410);
    expect((await afterClose.json()).error.code).toBe('gone');
    // The phone's retry of a batch stored before the close is still acknowledged (so it is dropped).
    const replay = await answersRes(token, s.resumeToken, duringPause);
    expect(replay.status).toBe(200);
    expect(((await replay.json()) as Reply).acknowledged).toHaveLength(2);
    // A replay that carries one new answer is refused as a whole: that answer cannot be stored.
    expect((await answersRes(token, s.resumeToken, [...duringPause, one(s.upcoming[4])])).status).toBe(410);
    expect(await trialRows(s.resumeToken)).toHaveLength(4);
    expect(await counterOf(s.resumeToken)).toBe(4);
  });
});

describe('answer batches on an adaptive plan', () => {
  it('each trial is resolved from the answers before it, inside one batch too, and the reply places the next trial', async () => {
    const ws = await makeWorkspace();
    const design = testDesign({ adaptive: { enabled: true, rule: '1u2d', trialsPerBase: 8, reversals: 4 } });
    const { token } = await makeLiveStudy(ws.slug, { design });
    const s = await startOk(token);
    expect(s.adaptive).toBe(true);
    expect(s.upcoming).toHaveLength(1);
    let next: PublicTrial = s.upcoming[0];
    // One at a time, as the phone sends adaptive answers.
    for (let i = 0; i < 3; i++) {
      const r = (await (await answersRes(token, s.resumeToken, [one(next)])).json()) as Reply;
      expect(r.answered).toBe(i + 1);
      expect(r.next?.idx).toBe(i + 1);
      next = r.next!;
    }
    // A held-back pair (sent together after a lost connection): the second trial is the one the first placed.
    const a = one(next);
    const pair = (await (await answersRes(token, s.resumeToken, [a, { clientId: randomUUID(), idx: next.idx + 1, answer: 1, responseMs: 700 }])).json()) as Reply;
    expect(pair).toMatchObject({ answered: 5, conflicts: [] });
    expect(pair.acknowledged).toHaveLength(2);
    // The same pair again: both acknowledged, nothing more stored, the same next trial.
    const again = (await (await answersRes(token, s.resumeToken, [a])).json()) as Reply;
    expect(again.acknowledged).toEqual([a.clientId]);
    expect(again.next?.idx).toBe(pair.next?.idx);
    const rows = await trialRows(s.resumeToken);
    expect(rows.map((r) => r.idx)).toEqual([0, 1, 2, 3, 4]);
    const st = await (await stateRes(token, s.resumeToken)).json();
    expect(st.upcoming[0].idx).toBe(5);
  });
});
