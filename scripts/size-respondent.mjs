// `npm run size:respondent`: the gzipped JavaScript a phone downloads to reach a trial screen.
// Builds the app into TEST_DIST_DIR (or reuses that build with --reuse), starts it against the
// throw-away test database with a seeded live study, opens the link in Chromium at phone size,
// consents, answers the segment question, starts from the task's instructions, waits for the first trial, and sums the gzipped
// size of every JavaScript response fetched on the way. Last line: respondent_js_gz_kb=<n>.
// The study is German: a phone gets its study's catalogue in the page's boot data, never in the
// script (respondent/messages/format.ts). Exits 1 when the scripts exceed LIMIT_KB gzipped or
// hold any sentence of any message catalogue (respondent/messages/<language>.ts).
import { existsSync, mkdtempSync, readFileSync } from 'node:fs';
import { randomBytes, randomUUID } from 'node:crypto';
import { gzipSync } from 'node:zlib';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';
import { chromium } from 'playwright-core';
import { ROOT } from './lib/project.mjs';
import { prepareTestDatabase, testEnv, buildTestApp, startTestApp, TEST_DIST_DIR } from './lib/test-env.mjs';

const LIMIT_KB = 80;
const LANGUAGES = ['en', 'de', 'fr', 'es', 'nl'];

/** Sentences of a catalogue (its quoted strings, cut at {placeholders}), long enough to be its own. */
function catalogueSentences(lang) {
  const source = readFileSync(path.join(ROOT, 'respondent/messages', `${lang}.ts`), 'utf8');
  const quoted = [...source.matchAll(/'((?:[^'\\\n]|\\.)*)'/g)].map((m) => m[1]);
  return quoted.flatMap((q) => q.split(/\{\w+\}/)).map((f) => f.trim()).filter((f) => f.length >= 16 && f.includes(' '));
}
/** A string as a bundler may write it: as is, or with non-ASCII characters as \uXXXX escapes. */
const spellings = (s) => [s, s.replace(/[^\x00-\x7f]/g, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`)];

const reuse = process.argv.includes('--reuse') && existsSync(path.join(ROOT, TEST_DIST_DIR, 'BUILD_ID'));
const design = {
  name: 'Bundle size check', itemName: 'Olivenöl', itemPictureId: null, category: 'Pantry', currency: 'EUR', locale: 'de-DE', language: 'de', task: 'pick',
  shelfSize: 6, viewMs: 1200, tripMinutes: 20, basePrices: [2.49, 9.99, 49], ladder: [0.03, 0.06, 0.12, 0.24], repetitions: 1, catchShare: 0.2,
  practiceTrials: 2, orderSeed: 3, adaptive: { enabled: false, rule: '1u2d', trialsPerBase: 24, reversals: 8 },
  consentText: 'Eine kurze Preisumfrage. Namen und E-Mail-Adressen werden nicht gespeichert; die Antworten stehen unter einer zufälligen Nummer.',
  segmentQuestions: [{ id: 'household', text: 'Wie viele Personen leben in Ihrem Haushalt?', options: ['1', '2', '3 oder mehr'] }],
  attentionCheck: { enabled: true, question: 'Um zu zeigen, dass Sie aufmerksam lesen, wählen Sie bitte „Oft“.', options: ['Nie', 'Manchmal', 'Oft', 'Immer'], correct: 'Oft' },
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

const failures = [];

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
    const bodies = new Map();
    page.on('response', async (res) => {
      const type = res.headers()['content-type'] ?? '';
      if (res.request().resourceType() !== 'script' && !type.includes('javascript')) return;
      try {
        const body = await res.body();
        scripts.set(res.url(), gzipSync(body).length);
        bodies.set(res.url(), body.toString('utf8'));
      } catch { /* redirects have no body */ }
    });
    await page.goto(`${env.E2E_BASE_URL}/r/${token}`, { waitUntil: 'networkidle' });
    await page.getByRole('button', { name: 'Einverstanden, los geht’s' }).click();
    await page.getByRole('button', { name: '2', exact: true }).click();
    await page.getByRole('button', { name: 'Übung starten' }).click();
    await page.getByTestId('trial').waitFor();
    await page.waitForLoadState('networkidle');
    let total = 0;
    for (const [u, size] of [...scripts].sort((a, b) => b[1] - a[1])) {
      total += size;
      process.stdout.write(`${(size / 1024).toFixed(1).padStart(7)} kB  ${new URL(u).pathname}\n`);
    }
    const bundled = [];
    for (const lang of LANGUAGES) {
      const hit = catalogueSentences(lang).find((s) => [...bodies.values()].some((js) => spellings(s).some((v) => js.includes(v))));
      if (hit) bundled.push(`${lang} ("${hit}")`);
    }
    const kb = total / 1024;
    process.stdout.write(`${scripts.size} scripts; catalogues in the scripts: ${bundled.length ? bundled.join(', ') : 'none (the page\'s boot data holds its own)'}\n`);
    process.stdout.write(`respondent_js_gz_kb=${kb.toFixed(1)}\n`);
    if (kb > LIMIT_KB) failures.push(`the respondent scripts are ${kb.toFixed(1)} kB gzipped, over the ${LIMIT_KB} kB budget`);
    if (bundled.length) failures.push(`message catalogues are bundled into the respondent script: ${bundled.join(', ')}; only the boot data may carry the study's one`);
  } finally {
    await context?.close();
    for (const c of children) c.kill('SIGTERM');
  }
}

main().then(() => {
  for (const f of failures) process.stderr.write(`size:respondent failed: ${f}\n`);
  if (failures.length) process.exit(1);
}).catch((err) => {
  process.stderr.write(`size:respondent failed: ${err instanceof Error ? err.stack : String(err)}\n`);
  process.exit(1);
});
