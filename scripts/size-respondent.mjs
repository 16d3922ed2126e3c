// `npm run size:respondent`: the gzipped JavaScript a phone downloads to reach a trial screen.
// Builds the app into TEST_DIST_DIR (or reuses that build with --reuse), starts it against the
// throw-away test database with a seeded live study, opens the link in Chromium at phone size,
// consents, answers the segment question, starts from the task's instructions, waits for the first trial, and sums the gzipped
// size of every JavaScript response fetched on the way. Last line: respondent_js_gz_kb=<n>.
import { existsSync, mkdtempSync } from 'node:fs';
import { randomBytes, randomUUID } from 'node:crypto';
import { gzipSync } from 'node:zlib';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';
import { chromium } from 'playwright-core';
import { ROOT } from './lib/project.mjs';
import { prepareTestDatabase, testEnv, buildTestApp, startTestApp, TEST_DIST_DIR } from './lib/test-env.mjs';

const reuse = process.argv.includes('--reuse') && existsSync(path.join(ROOT, TEST_DIST_DIR, 'BUILD_ID'));
const design = {
  name: 'Bundle size check', itemName: 'Olive oil', itemPictureId: null, category: 'Pantry', currency: 'EUR', locale: 'en-IE', task: 'pick',
  shelfSize: 6, viewMs: 1200, tripMinutes: 20, basePrices: [2.49, 9.99, 49], ladder: [0.03, 0.06, 0.12, 0.24], repetitions: 1, catchShare: 0.2,
  practiceTrials: 2, orderSeed: 3, adaptive: { enabled: false, rule: '1u2d', trialsPerBase: 24, reversals: 8 },
  consentText: 'A short price survey. No names or e-mail addresses are stored; answers are kept under a random number.',
  segmentQuestions: [{ id: 'household', text: 'How many people live in your household?', options: ['1', '2', '3 or more'] }],
  attentionCheck: { enabled: true, question: 'To show you are reading carefully, choose “Often”.', options: ['Never', 'Sometimes', 'Often', 'Always'], correct: 'Often' },
  targetCompletes: 10, redirectUrl: '', priceEnding: 'exact',
};

async function seedStudy(url) {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    const ws = await client.query(`select id from workspace where slug = 'harbourline'`);
    const wsId = ws.rows[0].id;
    const studyId = randomUUID();
    const token = randomBytes(24).toString('base64url');
    await client.query(`insert into study (id, workspace_id, name, state, design, data_version, created_at, updated_at, launched_at) values ($1, $2, $3, 'live', $4, 0, now(), now(), now())`, [studyId, wsId, design.name, design]);
    await client.query(`insert into respondent_link (id, workspace_id, study_id, token, source, accepts_pid, created_at) values ($1, $2, $3, $4, 'size check', false, now())`, [randomUUID(), wsId, studyId, token]);
    return { studyId, token };
  } finally {
    await client.end();
  }
}

async function main() {
  const url = await prepareTestDatabase({ fresh: false });
  const env = testEnv(url);
  if (!reuse) buildTestApp(env);
  const children = await startTestApp(env);
  const profile = mkdtempSync(path.join(os.tmpdir(), 'notchwise-size-'));
  let context;
  try {
    const { token } = await seedStudy(url);
    context = await chromium.launchPersistentContext(profile, {
      executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium', headless: true,
      args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
      viewport: { width: 390, height: 844 }, deviceScaleFactor: 2, isMobile: true, hasTouch: true,
    });
    const page = context.pages()[0] ?? (await context.newPage());
    const scripts = new Map();
    page.on('response', async (res) => {
      const type = res.headers()['content-type'] ?? '';
      if (res.request().resourceType() !== 'script' && !type.includes('javascript')) return;
      try {
        const body = await res.body();
        scripts.set(res.url(), gzipSync(body).length);
      } catch { /* redirects have no body */ }
    });
    await page.goto(`${env.E2E_BASE_URL}/r/${token}`, { waitUntil: 'networkidle' });
    await page.getByRole('button', { name: 'I agree, start' }).click();
    await page.getByRole('button', { name: '2', exact: true }).click();
    await page.getByRole('button', { name: 'Start the practice' }).click();
    await page.getByTestId('trial').waitFor();
    await page.waitForLoadState('networkidle');
    let total = 0;
    for (const [u, size] of [...scripts].sort((a, b) => b[1] - a[1])) {
      total += size;
      process.stdout.write(`${(size / 1024).toFixed(1).padStart(7)} kB  ${new URL(u).pathname}\n`);
    }
    process.stdout.write(`${scripts.size} scripts\nrespondent_js_gz_kb=${(total / 1024).toFixed(1)}\n`);
  } finally {
    await context?.close();
    for (const c of children) c.kill('SIGTERM');
  }
}

main().catch((err) => {
  process.stderr.write(`size:respondent failed: ${err instanceof Error ? err.stack : String(err)}\n`);
  process.exit(1);
});
