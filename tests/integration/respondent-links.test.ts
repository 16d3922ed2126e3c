import { describe, expect, it } from 'vitest';
import { GET as entry } from '@/app/r/[token]/route';
import { GET as picture } from '@/app/r/[token]/picture/route';
import { em } from '@/lib/server/db/orm';
import { callRoute, makeWorkspace } from '../support/factories';
import { makeLiveStudy, testDesign } from '../support/respondent-fixtures';
import { answerRes, startOk, startRes } from '../support/respondent-client';
import { randomUUID } from 'node:crypto';

const consent = { consent: true, segmentAnswers: { household: '1' } };

describe('respondent links: unknown 404, closed or paused 410', () => {
  it('an open link continues to the flow keeping ?pid=', async () => {
    const ws = await makeWorkspace();
    const { token } = await makeLiveStudy(ws.slug, { acceptsPid: true });
    const res = await callRoute(entry, { params: { token }, url: `http://127.0.0.1/r/${token}?pid=abc` });
    expect(res.status).toBe(307);
    expect(res.headers.get('location')).toBe(`/r/${token}/take-part?pid=abc`);
  });

  it('unknown token: 404 page and 404 JSON', async () => {
    const res = await callRoute(entry, { params: { token: 'nothing-here-123' } });
    expect(res.status).toBe(404);
    expect(await res.text()).toMatch(/No study at this address/);
    expect((await startRes('nothing-here-123', consent)).status).toBe(404);
  });

  it('paused or closed study and closed link: 410 and nothing stored', async () => {
    const ws = await makeWorkspace();
    for (const state of ['paused', 'closed'] as const) {
      const { token, studyId } = await makeLiveStudy(ws.slug, { state });
      const page = await callRoute(entry, { params: { token } });
      expect(page.status).toBe(410);
      expect(await page.text()).toMatch(state === 'paused' ? /paused/ : /not open/);
      const res = await startRes(token, consent);
      expect(res.status).toBe(410);
      const db = await em();
      expect((await db.getConnection().execute('select count(*)::int as n from respondent where study_id = ?', [studyId]))[0].n).toBe(0);
    }
    const { token, linkId } = await makeLiveStudy(ws.slug);
    const s = await startOk(token, consent);
    const db = await em();
    await db.getConnection().execute('update respondent_link set closed_at = now() where id = ?', [linkId]);
    expect((await callRoute(entry, { params: { token } })).status).toBe(410);
    expect((await startRes(token, consent)).status).toBe(410);
    // Someone already answering through the link is stopped too, as /state tells them (issue 13,
    // finding 12: answers used to go on while /state said 410; tests/integration/respondent-stopped.test.ts).
    expect((await answerRes(token, s.resumeToken, { clientId: randomUUID(), idx: 0, answer: 1, responseMs: 400 })).status).toBe(410);
  });

  it('a plain form post (before the script loads) starts and redirects to the flow with the cookie', async () => {
    const ws = await makeWorkspace();
    const { token, studyId } = await makeLiveStudy(ws.slug, { design: testDesign() });
    const res = await callRoute((await import('@/app/r/[token]/start/route')).POST, {
      method: 'POST', params: { token }, rawBody: 'consent=true', headers: { 'content-type': 'application/x-www-form-urlencoded' },
    });
    expect(res.status).toBe(303);
    // Relative: the origin a server sees behind a proxy or -H 127.0.0.1 is not always the phone's.
    expect(res.headers.get('location')).toMatch(new RegExp(`^/r/${token}/take-part\\?resume=`));
    const cookie = res.headers.get('set-cookie') ?? '';
    expect(cookie).toMatch(new RegExp(`nw_r_${studyId}=`));
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/Path=\/r/);
    expect(cookie).toMatch(/SameSite=lax/i);
  });

  it('no picture: 404', async () => {
    const ws = await makeWorkspace();
    const { token } = await makeLiveStudy(ws.slug);
    expect((await callRoute(picture, { params: { token } })).status).toBe(404);
  });
});
