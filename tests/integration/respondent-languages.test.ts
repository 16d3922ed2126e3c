// Issue 15: a study in another language speaks it on every server path a respondent meets:
// the take-part document (with the retention frozen at launch, in German), the JSON refusals
// the phone shows as they are (paused, full, panel id taken or too long), the no-script stop
// page, and the shelf's item names in the plan. English studies are untouched (other tests).
import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { GET as takePart } from '@/app/r/[token]/take-part/route';
import { POST as start } from '@/app/r/[token]/start/route';
import { em } from '@/lib/server/db/orm';
import { messagesFor } from '@/respondent/messages/all';
import { fill } from '@/respondent/messages/format';
import { callRoute, makeWorkspace } from '../support/factories';
import { balanceOf, makeLiveStudy, setBalance, testDesign } from '../support/respondent-fixtures';
import { answersRes, completeRes, startOk, startRes } from '../support/respondent-client';

const de = messagesFor('de');
const fr = messagesFor('fr');
const q = async (text: string, params: unknown[] = []) => (await em()).getConnection().execute(text, params);
const german = (over = {}) => testDesign({ language: 'de', locale: 'de-DE', segmentQuestions: [], attentionCheck: { enabled: false }, ...over });
const page = (token: string, headers: Record<string, string> = {}) =>
  callRoute(takePart, { params: { token }, url: `http://127.0.0.1/r/${token}/take-part`, headers });
const errorOf = async (res: Response) => ((await res.json()) as { error: { code: string; message: string } }).error;

describe('a German study on the server', () => {
  it('the consent document: <html lang="de">, German screen and promises with the frozen retention, German boot catalogue', async () => {
    const ws = await makeWorkspace();
    const { token, studyId } = await makeLiveStudy(ws.slug, { design: german() });
    await q('update study set retention_days = 120 where id = ?', [studyId]);
    const html = await (await page(token, { 'accept-language': 'fr' })).text();
    expect(html).toContain('<html lang="de">');
    expect(html).toContain(`<title>${de.document.title} · Notchwise</title>`);
    expect(html).toContain(fill(de.consent.retention, { days: 120 }));
    expect(html).toContain(de.consent.reference);
    const boot = JSON.parse(/<script type="application\/json" id="respondent-boot">(.*?)<\/script>/s.exec(html)![1]);
    expect(boot.language).toBe('de');
    expect(boot.messages.consent.agree).toBe(de.consent.agree);
    expect(html).not.toContain(messagesFor('en').consent.agree);
  });

  it('refusals the phone shows are German: paused (410), full (409), panel id taken (409); the page for a too-long panel id (422)', async () => {
    const ws = await makeWorkspace();
    const paused = await makeLiveStudy(ws.slug, { design: german() });
    const s = await startOk(paused.token, { consent: true, segmentAnswers: {} });
    await q(`update study set state = 'paused' where id = ?`, [paused.studyId]);
    const stopped = await answersRes(paused.token, s.resumeToken, [{ clientId: randomUUID(), idx: s.upcoming[0].idx, answer: 1, responseMs: 700 }]);
    expect(stopped.status).toBe(410);
    expect(await errorOf(stopped)).toEqual({ code: 'gone', message: de.stop.paused });
    const completing = await completeRes(paused.token, s.resumeToken);
    expect((await errorOf(completing)).message).toBe(de.stop.paused);

    const pids = await makeLiveStudy(ws.slug, { design: german(), acceptsPid: true });
    // A too-long panel id is refused by the page before the consent screen (the JSON start's schema refuses it too, for the API).
    const long = await callRoute(takePart, { params: { token: pids.token }, url: `http://127.0.0.1/r/${pids.token}/take-part?pid=${'x'.repeat(121)}` });
    expect(long.status).toBe(422);
    const longPage = await long.text();
    expect(longPage).toContain('<html lang="de">');
    expect(longPage).toContain(fill(de.stop.pidTooLong, { n: 120 }));
    await startOk(pids.token, { consent: true, segmentAnswers: {}, pid: 'panel-7' });
    const taken = await startRes(pids.token, { consent: true, segmentAnswers: {}, pid: 'panel-7' });
    expect(taken.status).toBe(409);
    expect(await errorOf(taken)).toEqual({ code: 'already_taken_part', message: de.stop.pidTaken });

    const full = await makeLiveStudy(ws.slug, { design: german() });
    await setBalance(full.workspaceId, await balanceOf(full.workspaceId), 0);
    const refused = await startRes(full.token, { consent: true, segmentAnswers: {} });
    expect(refused.status).toBe(409);
    expect(await errorOf(refused)).toEqual({ code: 'study_full', message: de.stop.fullAtStart });
    const fullPage = await (await page(full.token)).text();
    expect(fullPage).toContain('<html lang="de">');
    expect(fullPage).toContain(de.stop.titles.study_full);
    expect(fullPage).toContain(de.stop.full);
  });

  it('the no-script start on a closed French study answers with a French stop page', async () => {
    const ws = await makeWorkspace();
    const { token } = await makeLiveStudy(ws.slug, { design: testDesign({ language: 'fr', locale: 'fr-FR' }), state: 'closed' });
    const res = await callRoute(start, {
      method: 'POST', url: `http://127.0.0.1/r/${token}/start`, params: { token },
      rawBody: new URLSearchParams({ consent: 'true' }).toString(), headers: { 'content-type': 'application/x-www-form-urlencoded', 'accept-language': 'de' },
    });
    expect(res.status).toBe(410);
    const html = await res.text();
    expect(html).toContain('<html lang="fr">');
    expect(html).toContain(fr.stop.titles.gone);
    expect(html).toContain(fr.stop.closed);
  });

  it('a German spot study plans its shelf with German item names', async () => {
    const ws = await makeWorkspace();
    const { token } = await makeLiveStudy(ws.slug, { design: german({ task: 'spot', itemName: 'Olivenöl', basePrices: [2.99, 9.99], shelfSize: 5, catchShare: 0.2 }) });
    const s = await startOk(token, { consent: true, segmentAnswers: {} });
    const words = [...de.shelfItems.variants, ...de.shelfItems.fillers];
    expect(s.shelf).toHaveLength(5);
    for (const item of s.shelf) expect(words.some((w) => item.label.endsWith(w)), item.label).toBe(true);
  });
});
