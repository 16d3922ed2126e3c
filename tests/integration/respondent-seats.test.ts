import { describe, expect, it } from 'vitest';
import { makeWorkspace } from '../support/factories';
import { balanceOf, makeLiveStudy, setBalance, testDesign } from '../support/respondent-fixtures';
import { answerAll, completeRes, startOk, startRes } from '../support/respondent-client';
import { em } from '@/lib/server/db/orm';

// A short plan keeps twenty respondents quick.
const short = () => testDesign({ basePrices: [9.99], ladder: [0.05, 0.2], catchShare: 0, practiceTrials: 0, attentionCheck: { enabled: false }, segmentQuestions: [] });
const consent = { consent: true, segmentAnswers: {} };

async function completesOf(workspaceId: string) {
  const db = await em();
  const rows = await db.getConnection().execute<{ n: string }[]>(`select count(*) as n from seat_ledger_entry where workspace_id = ? and reason = 'complete'`, [workspaceId]);
  return Number(rows[0].n);
}

describe('seats are used exactly once, never below zero', () => {
  it('20 respondents against a balance of 5: five start and complete, fifteen are told the study is full', async () => {
    const ws = await makeWorkspace();
    const { token, workspaceId } = await makeLiveStudy(ws.slug, { design: short() });
    await setBalance(workspaceId, await balanceOf(workspaceId), 5);
    const starts = await Promise.all(Array.from({ length: 20 }, () => startRes(token, consent)));
    const ok = starts.filter((r) => r.status === 200);
    const full = starts.filter((r) => r.status === 409);
    expect(ok).toHaveLength(5);
    expect(full).toHaveLength(15);
    for (const r of full) expect((await r.json()).error).toMatchObject({ code: 'study_full', message: expect.stringMatching(/this study is full/i) });
    const started = await Promise.all(ok.map((r) => r.json()));
    for (const s of started) await answerAll(token, s);
    const completes = await Promise.all(started.flatMap((s) => [completeRes(token, s.resumeToken), completeRes(token, s.resumeToken)]));
    expect(completes.every((r) => r.status === 200)).toBe(true);
    expect(await balanceOf(workspaceId)).toBe(0);
    expect(await completesOf(workspaceId)).toBe(5);
    expect((await startRes(token, consent)).status).toBe(409);
  });

  it('a complete retried or sent twice at once makes one ledger entry and bumps the data version once', async () => {
    const ws = await makeWorkspace();
    const { token, workspaceId, studyId } = await makeLiveStudy(ws.slug, { design: short() });
    const before = await balanceOf(workspaceId);
    const s = await startOk(token, consent);
    await answerAll(token, s);
    const [a, b] = await Promise.all([completeRes(token, s.resumeToken), completeRes(token, s.resumeToken)]);
    expect([a.status, b.status]).toEqual([200, 200]);
    expect((await completeRes(token, s.resumeToken)).status).toBe(200);
    expect(await balanceOf(workspaceId)).toBe(before - 1);
    const db = await em();
    const [st] = await db.getConnection().execute('select data_version from study where id = ?', [studyId]);
    expect(st.data_version).toBe(1);
  });

  it('a respondent whose seat lapsed cannot take the balance below zero', async () => {
    const ws = await makeWorkspace();
    const { token, workspaceId } = await makeLiveStudy(ws.slug, { design: short() });
    const s = await startOk(token, consent);
    await answerAll(token, s);
    await setBalance(workspaceId, await balanceOf(workspaceId), 0);
    const res = await completeRes(token, s.resumeToken);
    expect(res.status).toBe(409);
    expect((await res.json()).error.code).toBe('study_full');
    expect(await balanceOf(workspaceId)).toBe(0);
  });

  it('a link quota counts completes and respondents still answering', async () => {
    const ws = await makeWorkspace();
    const { token } = await makeLiveStudy(ws.slug, { design: short(), quota: 2 });
    await startOk(token, consent);
    await startOk(token, consent);
    expect((await startRes(token, consent)).status).toBe(409);
  });

  it('a panel id completes at most once: a second start without the resume token is refused, after completion too', async () => {
    const ws = await makeWorkspace();
    const { token, workspaceId } = await makeLiveStudy(ws.slug, { design: short(), acceptsPid: true });
    const body = { ...consent, pid: 'panel-778' };
    const pair = await Promise.all([startRes(token, body), startRes(token, body)]);
    expect(pair.map((r) => r.status).sort()).toEqual([200, 409]);
    const sa = await pair.find((r) => r.status === 200)!.json();
    await answerAll(token, sa);
    expect((await completeRes(token, sa.resumeToken)).status).toBe(200);
    const again = await startRes(token, body);
    expect(again.status).toBe(409);
    expect((await again.json()).error.code).toBe('already_taken_part');
    const db = await em();
    const rows = await db.getConnection().execute(`select count(*)::int as n from respondent where workspace_id = ? and pid = 'panel-778'`, [workspaceId]);
    expect(rows[0].n).toBe(1);
  });
});
