import { randomBytes } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { POST as createLink } from '@/app/api/w/[workspace]/studies/[study]/links/route';
import { POST as startRoute } from '@/app/r/[token]/start/route';
import { em } from '@/lib/server/db/orm';
import { newLinkToken } from '@/lib/server/studies/respondent-links';
import { newResumeToken } from '@/respondent/server/trials';
import { RespondentLink } from '@/entities/respondent-link';
import { callRoute, makeWorkspace, signInAs } from '../support/factories';
import { makeLiveStudy, testDesign } from '../support/respondent-fixtures';
import { answerAll, answerRes, completeRes, startOk, startRes, stateRes } from '../support/respondent-client';

const BASE64URL = /^[A-Za-z0-9_-]+$/;
/** Bits of randomness in a base64url string of uniformly random bytes: 6 per character. */
const bitsOf = (t: string) => (BASE64URL.test(t) ? t.length * 6 : 0);
const consent = { consent: true, segmentAnswers: { household: '2' } };
const short = () => testDesign({ basePrices: [2.49], ladder: [0.05, 0.1], practiceTrials: 0, catchShare: 0, attentionCheck: { enabled: false } });

describe('respondent link and resume tokens', () => {
  it('link tokens made by the links route are base64url with at least 128 bits of randomness, all different', async () => {
    const ws = await makeWorkspace();
    const { studyId } = await makeLiveStudy(ws.slug);
    signInAs(ws.owner);
    for (let i = 0; i < 3; i++) {
      const res = await callRoute(createLink, { method: 'POST', params: { workspace: ws.slug, study: studyId }, body: { source: `Panel ${i}`, acceptsPid: false } });
      expect(res.status, await res.clone().text()).toBeLessThan(300);
    }
    const rows = await (await em()).find(RespondentLink, { study: studyId });
    const made = rows.map((r) => r.token).filter((t) => t.length > 32);
    // Exactly the three links the route made carry a long token (the fixture's own link is shorter).
    expect(made).toHaveLength(3);
    for (const t of made) expect(bitsOf(t)).toBeGreaterThanOrEqual(128);
    // The generator itself: 32 random bytes each time (256 bits), no repeats, the whole alphabet in use.
    const many = Array.from({ length: 500 }, newLinkToken);
    expect(new Set(many).size).toBe(500);
    expect(many.every((t) => t.length === 43 && bitsOf(t) >= 128)).toBe(true);
    expect(new Set(many.join('')).size).toBeGreaterThan(60);
  });

  it('resume tokens handed to respondents: at least 128 bits, different per respondent', async () => {
    const ws = await makeWorkspace();
    const { token } = await makeLiveStudy(ws.slug, { design: short() });
    const a = await startOk(token, consent);
    const b = await startOk(token, consent);
    for (const t of [a.resumeToken, b.resumeToken]) expect(bitsOf(t)).toBeGreaterThanOrEqual(128);
    expect(a.resumeToken).not.toBe(b.resumeToken);
    const many = Array.from({ length: 500 }, newResumeToken);
    expect(new Set(many).size).toBe(500);
    expect(many.every((t) => bitsOf(t) >= 128)).toBe(true);
  });

  it('a guessed resume token reads nothing', async () => {
    const ws = await makeWorkspace();
    const { token } = await makeLiveStudy(ws.slug, { design: short() });
    await startOk(token, consent);
    expect((await stateRes(token, randomBytes(32).toString('base64url'))).status).toBe(404);
  });
});

describe('the pid pass-through cannot be used to reach another respondent', () => {
  async function panelStudy() {
    const ws = await makeWorkspace();
    const first = await makeLiveStudy(ws.slug, { design: short(), acceptsPid: true });
    const db = await em();
    const second = db.create(RespondentLink, { workspace: first.workspaceId, study: first.studyId, token: randomBytes(32).toString('base64url'), source: 'Second panel', acceptsPid: true });
    await db.flush();
    return { ws, first, secondToken: second.token };
  }

  it("someone else's pid, on another link of the study or on this one, without the resume token: 409, none of their token, plan or answers", async () => {
    const { first, secondToken } = await panelStudy();
    const owner = await startOk(first.token, { ...consent, pid: 'panel-1001' });
    const firstTrial = owner.upcoming[0];
    expect((await answerRes(first.token, owner.resumeToken, { clientId: crypto.randomUUID(), idx: firstTrial.idx, answer: 1, responseMs: 800 })).status).toBe(200);

    for (const link of [secondToken, first.token]) {
      const res = await startRes(link, { ...consent, pid: 'panel-1001' });
      expect(res.status).toBe(409);
      const text = await res.text();
      expect(JSON.parse(text).error).toMatchObject({ code: 'already_taken_part', message: expect.stringMatching(/another device/) });
      expect(text).not.toContain(owner.resumeToken);
      expect(text).not.toMatch(/upcoming|answered|shelf/);
    }
    // The plain form post (no script) is refused the same way, with no resume token in a redirect.
    const form = await callRoute(startRoute, { method: 'POST', params: { token: secondToken }, rawBody: 'pid=panel-1001', headers: { 'content-type': 'application/x-www-form-urlencoded' } });
    expect(form.status).toBe(409);
    expect(form.headers.get('location')).toBeNull();
    expect(await form.text()).not.toContain(owner.resumeToken);

    // The first device carries on untouched.
    const own = await stateRes(first.token, owner.resumeToken);
    expect(own.status).toBe(200);
    expect((await own.json()).answered).toBe(1);
  });

  it('after completion the pid is refused as already taken part; a pid in another study is unrelated', async () => {
    const { ws, first } = await panelStudy();
    const s = await startOk(first.token, { ...consent, pid: 'panel-2002' });
    await answerAll(first.token, s);
    expect((await completeRes(first.token, s.resumeToken)).status).toBe(200);
    const again = await startRes(first.token, { ...consent, pid: 'panel-2002' });
    expect(again.status).toBe(409);
    expect(await again.text()).not.toContain(s.resumeToken);

    const other = await makeLiveStudy(ws.slug, { design: short(), acceptsPid: true });
    const fresh = await startOk(other.token, { ...consent, pid: 'panel-2002' });
    expect(fresh.resumeToken).not.toBe(s.resumeToken);
    expect(fresh.answered).toBe(0);
  });

  it('with its own resume token the same device resumes its pid', async () => {
    const { first } = await panelStudy();
    const s = await startOk(first.token, { ...consent, pid: 'panel-3003' });
    const res = await startRes(first.token, { ...consent, pid: 'panel-3003' }, { 'x-resume-token': s.resumeToken });
    expect(res.status).toBe(200);
    expect((await res.json()).resumeToken).toBe(s.resumeToken);
  });
});
