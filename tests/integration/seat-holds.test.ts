// Issue 13, point 4: seats cannot be held hostage. A start holds its seat only briefly (until its
// first answer, then for the drop-out window), one address can start only so many respondents
// through one link, and the fieldwork monitor shows held vs used seats. Each case failed on the
// code before: a start held its seat for 24 hours, with no per-link limit.
process.env.RATE_LIMIT_STARTS_PER_LINK_ADDRESS = '3';

import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import { GET as fieldworkGET } from '@/app/api/w/[workspace]/studies/[study]/fieldwork/route';
import { em } from '@/lib/server/db/orm';
import { ANSWERING_HOLD_MINUTES, START_HOLD_MINUTES } from '@/lib/server/billing/seat-holds';
import { DROP_OUT_MINUTES } from '@/lib/server/studies/fieldwork';
import { startRespondent } from '@/respondent/server/respondents';
import { callRoute, makeMember, makeWorkspace, signInAs } from '../support/factories';
import { balanceOf, makeLiveStudy, setBalance, testDesign } from '../support/respondent-fixtures';
import { answersRes, answerFor, startOk, startRes, type Started } from '../support/respondent-client';

const short = () => testDesign({ basePrices: [9.99], ladder: [0.05, 0.2], catchShare: 0, practiceTrials: 0, attentionCheck: { enabled: false }, segmentQuestions: [] });
const consent = { consent: true as const, segmentAnswers: {} };

/** Moves a respondent's last activity (and start) back by `minutes`. */
async function backdate(resumeToken: string, minutes: number) {
  const db = await em();
  await db.getConnection().execute(
    `update respondent set last_seen_at = now() - make_interval(mins => ?), started_at = now() - make_interval(mins => ?) where resume_token = ?`,
    [minutes, minutes, resumeToken],
  );
}

async function answerFirst(token: string, s: Started) {
  const t = s.upcoming[0];
  const res = await answersRes(token, s.resumeToken, [{ clientId: randomUUID(), idx: t.idx, answer: answerFor(t), responseMs: 800 }]);
  expect(res.status).toBe(200);
}

describe('a start holds a seat only briefly', () => {
  it('the hold windows are the ones the monitor uses: a start never holds longer than the drop-out window', () => {
    expect(ANSWERING_HOLD_MINUTES).toBe(DROP_OUT_MINUTES);
    expect(START_HOLD_MINUTES).toBeLessThan(ANSWERING_HOLD_MINUTES);
  });

  it('starts that never answer block another study of the workspace only until their start hold lapses', async () => {
    const ws = await makeWorkspace();
    const a = await makeLiveStudy(ws.slug, { design: short() });
    const b = await makeLiveStudy(ws.slug, { design: short() });
    await setBalance(a.workspaceId, await balanceOf(a.workspaceId), 3);
    // Three links' worth of starts that never answer (3 per address per link here).
    const idle = [await startOk(a.token, consent), await startOk(a.token, consent), await startOk(a.token, consent)];
    const full = await startRes(b.token, consent);
    expect(full.status).toBe(409);
    expect((await full.json()).error.code).toBe('study_full');
    for (const s of idle) await backdate(s.resumeToken, START_HOLD_MINUTES + 1);
    expect((await startRes(b.token, consent)).status).toBe(200);
  });

  it('after a first answer the seat is held for the drop-out window, then released', async () => {
    const ws = await makeWorkspace();
    const { token, workspaceId } = await makeLiveStudy(ws.slug, { design: short() });
    await setBalance(workspaceId, await balanceOf(workspaceId), 1);
    const s = await startOk(token, consent);
    await answerFirst(token, s);
    await backdate(s.resumeToken, START_HOLD_MINUTES + 1);
    expect((await startRes(token, consent)).status, 'still answering: the seat stays held').toBe(409);
    await backdate(s.resumeToken, ANSWERING_HOLD_MINUTES + 1);
    expect((await startRes(token, consent)).status, 'quiet past the drop-out window: released').toBe(200);
  });

  it('a lapsed start frees its seat for the next start; no seat is used until someone completes', async () => {
    const ws = await makeWorkspace();
    const { token, workspaceId } = await makeLiveStudy(ws.slug, { design: short() });
    await setBalance(workspaceId, await balanceOf(workspaceId), 1);
    const late = await startOk(token, consent);
    await backdate(late.resumeToken, START_HOLD_MINUTES + 1);
    const other = await startOk(token, consent);
    expect(other.resumeToken).not.toBe(late.resumeToken);
    expect(await balanceOf(workspaceId)).toBe(1);
  });
});

describe('one address cannot start many respondents through one link', () => {
  it('the route counts new starts per link and address: the fourth from one address is a 429; resumes do not count', async () => {
    const ws = await makeWorkspace();
    const { token } = await makeLiveStudy(ws.slug, { design: short() });
    const first = await startOk(token, consent);
    await startOk(token, consent);
    await startOk(token, consent);
    const res = await startRes(token, consent);
    expect(res.status).toBe(429);
    expect(res.headers.get('retry-after')).toMatch(/^\d+$/);
    // The first respondent resuming with its token is not a new start.
    expect((await startRes(token, consent, { 'x-resume-token': first.resumeToken })).status).toBe(200);
  });

  it('the limit is per link and per address: another address, or another link from the same address, still starts', async () => {
    const ws = await makeWorkspace();
    const a = await makeLiveStudy(ws.slug, { design: short() });
    const b = await makeLiveStudy(ws.slug, { design: short() });
    const start = (token: string, address: string) => startRespondent(token, consent, () => null, { address });
    for (let i = 0; i < 3; i++) await start(a.token, '198.51.100.7');
    await expect(start(a.token, '198.51.100.7')).rejects.toMatchObject({ status: 429 });
    await expect(start(a.token, '198.51.100.8')).resolves.toMatchObject({ resumeToken: expect.any(String) });
    await expect(start(b.token, '198.51.100.7')).resolves.toMatchObject({ resumeToken: expect.any(String) });
  });
});

describe('the monitor shows held vs used seats', () => {
  let ws: Awaited<ReturnType<typeof makeWorkspace>>;
  beforeAll(async () => {
    ws = await makeWorkspace();
    signInAs(await makeMember(ws.slug, 'viewer'));
  });

  it('held now (this study, the workspace) and used by this study', async () => {
    const a = await makeLiveStudy(ws.slug, { design: short() });
    const b = await makeLiveStudy(ws.slug, { design: short() });
    const s1 = await startOk(a.token, consent);
    await startOk(a.token, consent);
    await startOk(b.token, consent);
    await backdate(s1.resumeToken, START_HOLD_MINUTES + 1); // lapsed: no longer held
    const res = await callRoute(fieldworkGET, { params: { workspace: ws.slug, study: a.studyId } });
    expect(res.status).toBe(200);
    const f = await res.json();
    expect(f.seats).toEqual({ usedHere: 0, heldHere: 1, heldInWorkspace: 2, holdMinutes: { start: START_HOLD_MINUTES, answering: ANSWERING_HOLD_MINUTES } });
  });
});
