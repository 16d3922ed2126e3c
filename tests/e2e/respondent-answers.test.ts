import { afterAll, describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { baseUrl, openBrowser } from '../support/browser';
import { answerNext } from '../support/respondent-walk';

// The phone's answer queue in a real browser: answers kept on the device while the network
// fails, sent from another tab that opens the link (resume), and handed to sendBeacon when the
// page goes away. Protects "nothing lost, nothing twice" where the unit test's fakes stop.

process.env.DATABASE_URL ??= inject('databaseUrl');
process.env.AUTH_SECRET ??= 'e2e-data-layer-secret-0123456789abcdef';

async function rowsOf(resumeToken: string): Promise<number[]> {
  const { em } = await import('@/lib/server/db/orm');
  const { sql } = await import('@/lib/server/db/sql');
  const rows = await sql<{ idx: number }>(await em(), 'select t.idx from trial t join respondent r on r.id = t.respondent_id where r.resume_token = ? order by t.idx', [resumeToken]);
  return rows.map((r) => Number(r.idx));
}

/** Answers the next trial ("Left", or "Often" for the attention check), past instructions and practice feedback. */
async function answerOne(page: Page) {
  expect(await answerNext(page)).toBe('answered');
}

async function studyLink(name: string) {
  const { makeLiveStudy, testDesign } = await import('../support/respondent-fixtures');
  return makeLiveStudy('harbourline', { design: testDesign({ name, viewMs: 300 }) });
}

describe('answers kept on the phone until the server has them', () => {
  afterAll(async () => {
    const { orm } = await import('@/lib/server/db/orm');
    await (await orm()).close(true);
  });

  it('while sending fails the answers stay on the device; another tab opening the link sends them first and carries on from there', async () => {
    const { token } = await studyLink('Pantry oil: offline phone');
    const { context, page } = await openBrowser({ phone: true });
    try {
      // This tab cannot reach the answer endpoint (a dead connection).
      await page.route('**/answers', (r) => r.abort('internetdisconnected'));
      await page.goto(`${baseUrl()}/r/${token}`);
      await page.getByRole('button', { name: 'I agree, start' }).click();
      await page.getByRole('button', { name: '2', exact: true }).click();
      for (let i = 0; i < 5; i++) await answerOne(page);
      await page.getByTestId('reconnecting').waitFor();
      const resume = new URL(page.url()).searchParams.get('resume')!;
      const held = await page.evaluate((key) => JSON.parse(localStorage.getItem(key) ?? '[]').map((a: { idx: number }) => a.idx), `nw-answers:${resume}`);
      expect(held).toEqual([0, 1, 2, 3, 4]);
      expect(await rowsOf(resume)).toEqual([]);

      // The same phone opens the link in another tab (or after the first one crashed).
      const tab = await context.newPage();
      await tab.goto(`${baseUrl()}/r/${token}`);
      await tab.getByTestId('trial').waitFor();
      // It does not show the five answered trials again (nor the instructions): 2 practice + 3 of 13 (12 test + 1 attention; a pick study draws no catch trials) …
      expect(await tab.getByTestId('progress').getAttribute('aria-valuenow')).toBe('3');
      expect(await tab.getByTestId('progress-words').textContent()).toBe('3 of 13 answered');
      // … and sends them before anything else.
      await expect.poll(() => rowsOf(resume), { timeout: 20_000 }).toEqual([0, 1, 2, 3, 4]);
      await page.close();
      for (let i = 0; i < 10; i++) await answerOne(tab); // the rest of 15 (no catch trials in a pick study)
      await tab.getByTestId('thanks').waitFor();
      expect(await rowsOf(resume)).toEqual(Array.from({ length: 15 }, (_, i) => i));
      expect(await tab.evaluate((key) => localStorage.getItem(key), `nw-answers:${resume}`)).toBeNull();
    } finally {
      await context.close();
    }
  });

  it('answers not yet sent when the page goes away are handed to sendBeacon and stored', async () => {
    const { token } = await studyLink('Pantry oil: phone put away');
    const { context, page } = await openBrowser({ phone: true });
    try {
      // Every fetch to the answer endpoint fails here, however slow this machine is; a beacon
      // (not seen by the request interception) is the only way the answers can reach the server.
      await page.route('**/answers', (r) => r.abort('internetdisconnected'));
      await page.goto(`${baseUrl()}/r/${token}`);
      await page.getByRole('button', { name: 'I agree, start' }).click();
      await page.getByRole('button', { name: '2', exact: true }).click();
      await answerOne(page);
      await answerOne(page);
      const resume = new URL(page.url()).searchParams.get('resume')!;
      expect(await rowsOf(resume)).toEqual([]);
      // Leave: pagehide hands the waiting answers to the beacon.
      await page.goto('about:blank');
      await expect.poll(() => rowsOf(resume), { timeout: 10_000 }).toEqual([0, 1]);
    } finally {
      await context.close();
    }
  });
});
