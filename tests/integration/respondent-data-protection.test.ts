// Issue 13, points 5 and 7: what respondents are told is what the code does, and panel ids
// cannot be used against a panelist. Each case failed on the code before: nothing was ever
// deleted, the retention shown was the workspace's current setting, no contact or reference
// code existed, a long panel id on the plain-form start was a 500, the refusals told a finished
// panel id from one in progress, and anyone could use up a panelist's id first.
import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import { POST as createPOST } from '@/app/api/w/[workspace]/studies/route';
import { POST as statePOST } from '@/app/api/w/[workspace]/studies/[study]/state/route';
import { POST as deletionPOST } from '@/app/api/w/[workspace]/studies/[study]/respondent-deletions/route';
import { POST as linksPOST, GET as linksGET } from '@/app/api/w/[workspace]/studies/[study]/links/route';
import { GET as takePart } from '@/app/r/[token]/take-part/route';
import { POST as start } from '@/app/r/[token]/start/route';
import { em } from '@/lib/server/db/orm';
import { AuditEvent } from '@/entities/audit-event';
import { handleMaintenance } from '@/lib/server/platform/job-handlers';
import { getFitState } from '@/lib/server/analysis/study-fit';
import { authorise } from '@/lib/server/team/membership';
import { pidSignature } from '@/respondent/server/panel-ids';
import { callRoute, makeMember, makeWorkspace, signInAs } from '../support/factories';
import { validDesign } from '../support/study-fixtures';
import { makeLiveStudy, testDesign } from '../support/respondent-fixtures';
import { makeSimulatedStudy } from '../support/studies';
import { answerAll, completeRes, startOk, startRes, stateRes } from '../support/respondent-client';

const short = () => testDesign({ basePrices: [9.99], ladder: [0.05, 0.2], catchShare: 0, practiceTrials: 0, attentionCheck: { enabled: false }, segmentQuestions: [] });
const consent = { consent: true, segmentAnswers: {} };
const q = async (text: string, params: unknown[] = []) => (await em()).getConnection().execute(text, params);
const page = (token: string, query = '', headers: Record<string, string> = {}) =>
  callRoute(takePart, { params: { token }, url: `http://127.0.0.1/r/${token}/take-part${query}`, headers });
const formStart = (token: string, fields: Record<string, string>, headers: Record<string, string> = {}) =>
  callRoute(start, { method: 'POST', url: `http://127.0.0.1/r/${token}/start`, params: { token }, rawBody: new URLSearchParams(fields).toString(), headers: { 'content-type': 'application/x-www-form-urlencoded', ...headers } });

describe('launch: a contact line is required, and the retention is frozen', () => {
  let ws: Awaited<ReturnType<typeof makeWorkspace>>;
  beforeAll(async () => {
    ws = await makeWorkspace();
    signInAs(await makeMember(ws.slug, 'analyst'));
  });
  const newStudy = async (over = {}) => (await (await callRoute(createPOST, { method: 'POST', params: { workspace: ws.slug }, body: validDesign(over) })).json()).id as string;
  const launch = (study: string) => callRoute(statePOST, { method: 'POST', params: { workspace: ws.slug, study }, body: { action: 'launch' } });

  it('without "who runs this study" the launch is refused with a field error, and the study stays a draft', async () => {
    const id = await newStudy({ contact: '' });
    const res = await launch(id);
    expect(res.status).toBe(422);
    expect((await res.json()).error.issues).toEqual([{ path: 'contact', message: expect.stringMatching(/who runs this study/i) }]);
    expect((await q('select state, retention_days from study where id = ?', [id]))[0]).toEqual({ state: 'draft', retention_days: null });
  });

  it('the consent screen shows the contact and the retention frozen at launch, not a later setting', async () => {
    await q('update workspace set retention_days = 90 where slug = ?', [ws.slug]);
    const id = await newStudy({ contact: 'Pricing research, Test Grocers Ltd — research@example.test' });
    expect((await launch(id)).status).toBe(200);
    expect((await q('select retention_days from study where id = ?', [id]))[0].retention_days).toBe(90);
    await q('update workspace set retention_days = 3650 where slug = ?', [ws.slug]);
    const link = await (await callRoute(linksPOST, { method: 'POST', params: { workspace: ws.slug, study: id }, body: { source: 'newsletter' } })).json();
    const token = new URL(link.url).pathname.split('/').pop()!;
    const html = await (await page(token)).text();
    const text = html.replace(/<!-- -->/g, '');
    expect(text).toContain('kept for 90 days after the study closes, then deleted');
    expect(text).not.toContain('3650 days');
    expect(text).toContain('Who runs this study: Pricing research, Test Grocers Ltd — research@example.test');
  });
});

describe('a reference code on the thank-you screen; an analyst deletes one respondent by it', () => {
  it('the code is in the completed state, not the respondent id; deleting by it removes the respondent and their answers, audited, and the fit follows', async () => {
    const ws = await makeWorkspace();
    const analyst = await makeMember(ws.slug, 'analyst');
    const { token, studyId } = await makeLiveStudy(ws.slug, { design: short() });
    const s = await startOk(token, consent);
    await answerAll(token, s);
    expect((await completeRes(token, s.resumeToken)).status).toBe(200);
    const done = await (await stateRes(token, s.resumeToken)).json();
    expect(done.phase).toBe('completed');
    expect(done.referenceCode).toMatch(/^[0-9A-HJKMNP-TV-Z]{5}-[0-9A-HJKMNP-TV-Z]{5}$/);
    const [row] = await q('select id, reference_code from respondent where resume_token = ?', [s.resumeToken]);
    expect(row.reference_code).toBe(done.referenceCode);
    expect(done.referenceCode).not.toContain(String(row.id).slice(0, 5).toUpperCase());
    const [{ data_version: before }] = await q('select data_version from study where id = ?', [studyId]);

    signInAs(analyst);
    const p = { workspace: ws.slug, study: studyId };
    const wrong = await callRoute(deletionPOST, { method: 'POST', params: p, body: { code: 'ZZZZZ-ZZZZZ' } });
    expect(wrong.status).toBe(404);
    expect((await wrong.json()).error.issues[0].path).toBe('code');
    // Typed loosely (lower case, no dash, O for 0): the same code.
    const typed = done.referenceCode.toLowerCase().replace('-', ' ').replace(/0/g, 'o');
    const res = await callRoute(deletionPOST, { method: 'POST', params: p, body: { code: typed } });
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ deleted: true, referenceCode: done.referenceCode });
    expect(await q('select id from respondent where id = ?', [row.id])).toEqual([]);
    expect(await q('select id from trial where respondent_id = ?', [row.id])).toEqual([]);
    expect((await q('select data_version from study where id = ?', [studyId]))[0].data_version).toBe(before + 1);
    const events = await (await em()).find(AuditEvent, { workspace: { slug: ws.slug }, action: 'respondent.deleted' });
    expect(events.map((e) => e.detail)).toEqual([{ studyId, referenceCode: done.referenceCode }]);
    // A viewer may not delete.
    signInAs(await makeMember(ws.slug, 'viewer'));
    expect((await callRoute(deletionPOST, { method: 'POST', params: p, body: { code: done.referenceCode } })).status).toBe(403);
  });
});

describe('the daily purge deletes what the consent screen said it would, when it said it would', () => {
  it('a study closed longer than its frozen retention loses its respondents and answers; the fit stays and renders', async () => {
    const ws = await makeWorkspace();
    const { studyId } = await makeSimulatedStudy(ws.slug);
    const { studyId: keptId } = await makeSimulatedStudy(ws.slug, { name: 'Closed recently' });
    // Launched with 30 days; the workspace's setting changed to ten years since: the frozen value rules.
    await q('update workspace set retention_days = 3650 where slug = ?', [ws.slug]);
    await q(`update study set retention_days = 30, closed_at = now() - interval '31 days' where id = ?`, [studyId]);
    await q(`update study set retention_days = 30, closed_at = now() - interval '29 days' where id = ?`, [keptId]);
    expect((await q('select count(*)::int as n from respondent where study_id = ?', [studyId]))[0].n).toBe(40);

    const out = (await handleMaintenance('purge-respondents')) as { studies: number; respondents: number };
    expect(out.studies).toBeGreaterThanOrEqual(1);
    expect((await q('select count(*)::int as n from respondent where study_id = ?', [studyId]))[0].n).toBe(0);
    expect((await q('select count(*)::int as n from trial where study_id = ?', [studyId]))[0].n).toBe(0);
    expect((await q('select purged_at is not null as purged from study where id = ?', [studyId]))[0].purged).toBe(true);
    expect((await q('select count(*)::int as n from respondent where study_id = ?', [keptId]))[0].n, 'closed 29 days ago: kept').toBe(40);
    const events = await (await em()).find(AuditEvent, { workspace: { slug: ws.slug }, action: 'study.responses_purged' });
    expect(events.map((e) => e.detail)).toEqual([{ studyId, respondents: 40, retentionDays: 30 }]);

    // Results still render from the fit computed before the purge: aggregate counts per cell only.
    const fit = await getFitState(await authorise(ws.owner, ws.slug, 'viewer'), studyId);
    expect(fit.fit.status).toBe('ready');
    if (fit.fit.status === 'ready') expect(fit.fit.report.bases).toHaveLength(5);
    expect(JSON.stringify(fit.cells)).not.toMatch(/respondent/i);
    // Run again: nothing more to do for this study.
    await handleMaintenance('purge-respondents');
    expect(await (await em()).fork().count(AuditEvent, { workspace: { slug: ws.slug }, action: 'study.responses_purged' })).toBe(1);
  }, 180_000);
});

describe('panel ids on every start path', () => {
  const long = 'p'.repeat(500);

  it('longer than 120 characters: a field error on the JSON start, the stop screen (422, not 500) on the plain-form start and the page; nothing stored', async () => {
    const ws = await makeWorkspace();
    const { token, studyId } = await makeLiveStudy(ws.slug, { design: short(), acceptsPid: true });
    const json = await startRes(token, { ...consent, pid: long });
    expect(json.status).toBe(422);
    const form = await formStart(token, { consent: 'true', pid: long });
    expect(form.status).toBe(422);
    expect(await form.text()).toContain('at most 120 characters');
    const doc = await page(token, `?pid=${long}`);
    expect(doc.status).toBe(422);
    expect(await doc.text()).not.toContain('<form');
    expect((await q('select count(*)::int as n from respondent where study_id = ?', [studyId]))[0].n).toBe(0);
  });

  it('the refusal is the same whether the id finished or is still answering elsewhere', async () => {
    const ws = await makeWorkspace();
    const { token } = await makeLiveStudy(ws.slug, { design: short(), acceptsPid: true });
    const finished = await startOk(token, { ...consent, pid: 'panel-finished' });
    await answerAll(token, finished);
    expect((await completeRes(token, finished.resumeToken)).status).toBe(200);
    await startOk(token, { ...consent, pid: 'panel-answering' });
    const a = await startRes(token, { ...consent, pid: 'panel-finished' });
    const b = await startRes(token, { ...consent, pid: 'panel-answering' });
    expect(a.status).toBe(b.status);
    expect(await a.json()).toEqual(await b.json());
    const fa = await formStart(token, { consent: 'true', pid: 'panel-finished' });
    const fb = await formStart(token, { consent: 'true', pid: 'panel-answering' });
    expect([fa.status, await fa.text()]).toEqual([fb.status, await fb.text()]);
  });

  it('on a signing link nobody can use a panelist\'s id first: only the address the panel signed starts, and it keeps its id', async () => {
    const ws = await makeWorkspace();
    signInAs(await makeMember(ws.slug, 'analyst'));
    const { studyId } = await makeLiveStudy(ws.slug, { design: short() });
    const created = await callRoute(linksPOST, { method: 'POST', params: { workspace: ws.slug, study: studyId }, body: { source: 'panel B', acceptsPid: true, signsPid: true } });
    const link = await created.json();
    expect(link.pidSecret).toMatch(/^[\w-]{40,}$/);
    const token = new URL(link.url).pathname.split('/').pop()!;
    const pid = `member-${randomUUID().slice(0, 6)}`;
    const sig = pidSignature(link.pidSecret, pid);

    // A stranger who knows the id but not the key: refused on every path, and the id stays free.
    expect((await page(token, `?pid=${pid}`)).status).toBe(403);
    expect((await page(token, `?pid=${pid}&sig=${'0'.repeat(64)}`)).status).toBe(403);
    expect((await startRes(token, { ...consent, pid })).status).toBe(403);
    expect((await formStart(token, { consent: 'true', pid })).status).toBe(403);
    expect((await q('select count(*)::int as n from respondent where study_id = ?', [studyId]))[0].n).toBe(0);

    // The panelist, from the panel's signed address: the page keeps the signature in a cookie for the start.
    const doc = await page(token, `?pid=${pid}&sig=${sig}`);
    expect(doc.status).toBe(200);
    const cookie = (doc.headers.get('set-cookie') ?? '').split(';')[0];
    expect(cookie).toMatch(/^nw_p_\w+=[0-9a-f]{64}$/);
    const ok = await formStart(token, { consent: 'true', pid }, { cookie });
    expect(ok.status).toBe(303);
    expect((await q('select pid from respondent where study_id = ?', [studyId]))).toEqual([{ pid }]);

    // Viewers see the link, not its key.
    signInAs(await makeMember(ws.slug, 'viewer'));
    const listed = await (await callRoute(linksGET, { params: { workspace: ws.slug, study: studyId } })).json();
    expect(listed.links[0].pidSecret).toBeNull();
  });
});
