import { execFileSync } from 'node:child_process';
import { existsSync, rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { GET as takePart } from '@/app/r/[token]/take-part/route';
import { POST as start } from '@/app/r/[token]/start/route';
import { GET as asset } from '@/app/r-assets/[file]/route';
import { em } from '@/lib/server/db/orm';
import { RESPONDENT_DIST } from '@/respondent/bundle';
import { BOOT_ID, type RespondentBoot } from '@/respondent/shared/boot';
import { callRoute, makeWorkspace, uid } from '../support/factories';
import { makeLiveStudy, setBalance, balanceOf } from '../support/respondent-fixtures';
import { startOk } from '../support/respondent-client';

const DIST = path.resolve(import.meta.dirname, '../..', RESPONDENT_DIST);

const page = (token: string, query = '', headers: Record<string, string> = {}) =>
  callRoute(takePart, { params: { token }, url: `http://127.0.0.1/r/${token}/take-part${query}`, headers });

function bootOf(html: string): RespondentBoot {
  const m = new RegExp(`<script type="application/json" id="${BOOT_ID}">(.*?)</script>`).exec(html);
  expect(m, 'boot data block').not.toBeNull();
  return JSON.parse(m![1]) as RespondentBoot;
}

describe('take-part: a complete HTML document outside the App Router runtime', () => {
  beforeAll(() => {
    // The document links the vite bundle's hashed files; build it once if this checkout has not.
    if (!existsSync(path.join(DIST, '.vite', 'manifest.json'))) execFileSync('npm', ['run', '--silent', 'build:respondent'], { stdio: 'ignore' });
  }, 120_000);

  it('an open link: the consent form server-rendered, one module script, boot data, no inline script and no Next.js runtime', async () => {
    const ws = await makeWorkspace();
    const { token } = await makeLiveStudy(ws.slug, { acceptsPid: true });
    const res = await page(token, '?pid=panel-7');
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/^text\/html/);
    const html = await res.text();
    expect(html).toMatch(new RegExp(`<form class="[^"]*" action="/r/${token}/start" method="post">`));
    expect(html).toContain('<input type="hidden" name="pid" value="panel-7"/>');
    expect(html).toContain('I agree, start');
    const scripts = [...html.matchAll(/<script([^>]*)>/g)].map((m) => m[1]);
    expect(scripts).toHaveLength(2);
    expect(scripts[0]).toMatch(/^ type="application\/json" id="respondent-boot"$/);
    expect(scripts[1]).toMatch(/^ type="module" src="\/r-assets\/main-[\w-]+\.js"$/);
    expect(html).not.toContain('/_next/');
    expect(html).toMatch(/<link rel="stylesheet" href="\/r-assets\/[\w-]+\.css"\/>/);
    const boot = bootOf(html);
    expect(boot).toMatchObject({ token, pid: 'panel-7', resumeToken: null, initial: null, retentionDays: 365 });
    expect(boot.questions.map((q) => q.id)).toEqual(['household']);
  });

  it('a link without pid pass-through drops ?pid=', async () => {
    const ws = await makeWorkspace();
    const { token } = await makeLiveStudy(ws.slug);
    const html = await (await page(token, '?pid=panel-7')).text();
    expect(html).not.toContain('name="pid"');
    expect(bootOf(html).pid).toBeNull();
  });

  it('resume by ?resume= or by cookie: the waiting screen and the state to continue from', async () => {
    const ws = await makeWorkspace();
    const { token, studyId } = await makeLiveStudy(ws.slug);
    const s = await startOk(token);
    for (const res of [await page(token, `?resume=${s.resumeToken}`), await page(token, '', { cookie: `nw_r_${studyId}=${s.resumeToken}` })]) {
      const html = await res.text();
      expect(html).toContain('data-testid="waiting"');
      expect(html).not.toContain('<form');
      const boot = bootOf(html);
      expect(boot.resumeToken).toBe(s.resumeToken);
      expect(boot.initial?.phase).toBe('trials');
      expect(boot.initial?.upcoming[0].idx).toBe(0);
    }
  });

  it('without script: the form as served posts to start, which redirects to the flow with the resume cookie; the flow then resumes', async () => {
    const ws = await makeWorkspace();
    const { token, studyId } = await makeLiveStudy(ws.slug, { acceptsPid: true });
    const html = await (await page(token, '?pid=panel-8')).text();
    // What a browser without script submits: the form's action and its fields, urlencoded.
    const action = /<form [^>]*action="([^"]+)"/.exec(html)![1];
    const fields = new URLSearchParams([...html.matchAll(/<input type="hidden" name="(\w+)" value="([^"]*)"\/>/g)].map((m) => [m[1], m[2]]));
    expect(action).toBe(`/r/${token}/start`);
    expect(Object.fromEntries(fields)).toEqual({ pid: 'panel-8', consent: 'true' });
    const res = await callRoute(start, { method: 'POST', url: `http://127.0.0.1${action}`, params: { token }, rawBody: fields.toString(), headers: { 'content-type': 'application/x-www-form-urlencoded' } });
    expect(res.status).toBe(303);
    const location = res.headers.get('location')!;
    expect(location).toMatch(new RegExp(`^/r/${token}/take-part\\?resume=[\\w-]+$`));
    const cookie = (res.headers.get('set-cookie') ?? '').split(';')[0];
    expect(cookie).toMatch(new RegExp(`^nw_r_${studyId}=[\\w-]+$`));
    const db = await em();
    const stored = await db.getConnection().execute('select pid, resume_token from respondent where study_id = ?', [studyId]);
    expect(stored).toEqual([{ pid: 'panel-8', resume_token: cookie.split('=')[1] }]);
    // Reopening the flow with only the cookie resumes at the segment question, not the consent form.
    const flow = await (await page(token, '', { cookie })).text();
    expect(flow).not.toContain('<form');
    expect(bootOf(flow).initial?.phase).toBe('questions');
  });

  it('without script, a refused start (no seats left) answers with the stop screen and its status, storing nothing', async () => {
    const ws = await makeWorkspace();
    const { token, studyId, workspaceId } = await makeLiveStudy(ws.slug);
    await setBalance(workspaceId, await balanceOf(workspaceId), 0);
    const res = await callRoute(start, { method: 'POST', params: { token }, rawBody: 'consent=true', headers: { 'content-type': 'application/x-www-form-urlencoded' } });
    expect(res.status).toBe(409);
    const html = await res.text();
    expect(html).toContain('data-testid="stopped" data-code="study_full"');
    expect(html).toContain('<title>This study is full · Notchwise</title>');
    expect(html).not.toContain('<script');
    const db = await em();
    expect((await db.getConnection().execute('select count(*)::int as n from respondent where study_id = ?', [studyId]))[0].n).toBe(0);
  });

  it('unknown 404, closed 410, full workspace: a stop screen with no script', async () => {
    const unknown = await page('nothing-here-123');
    expect(unknown.status).toBe(404);
    const ws = await makeWorkspace();
    const closed = await makeLiveStudy(ws.slug, { state: 'closed' });
    const gone = await page(closed.token);
    expect(gone.status).toBe(410);
    const full = await makeLiveStudy(ws.slug);
    await setBalance(full.workspaceId, await balanceOf(full.workspaceId), 0);
    const fullRes = await page(full.token);
    for (const [res, code] of [[unknown, 'not_found'], [gone, 'gone'], [fullRes, 'study_full']] as const) {
      const html = await res.text();
      expect(html).toContain(`data-testid="stopped" data-code="${code}"`);
      expect(html).not.toContain('<script');
    }
    const db = await em();
    expect((await db.getConnection().execute('select count(*)::int as n from respondent where study_id = ?', [full.studyId]))[0].n).toBe(0);
  });
});

describe('/r-assets/[file]', () => {
  it('serves hashed bundle files with their type and a year of immutable caching; anything else is a 404', async () => {
    const name = `probe-${uid()}.js`.replace(/[^\w.-]/g, '');
    writeFileSync(path.join(DIST, name), 'export {};');
    try {
      const ok = await callRoute(asset, { params: { file: name } });
      expect(ok.status).toBe(200);
      expect(ok.headers.get('content-type')).toBe('text/javascript; charset=utf-8');
      expect(ok.headers.get('cache-control')).toBe('public, max-age=31536000, immutable');
      expect(await ok.text()).toBe('export {};');
    } finally {
      rmSync(path.join(DIST, name));
    }
    for (const file of ['../package.json', '.vite', 'manifest.json', 'missing-abc.js', 'x.html']) {
      expect((await callRoute(asset, { params: { file } })).status).toBe(404);
    }
  });
});
