import { afterAll, describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { baseUrl, openBrowser, screenshot, signIn } from '../support/browser';
import { expectAccessible } from '../support/a11y';
import { answerNext } from '../support/respondent-walk';

// The phone flow explains itself: for each task, at 390 × 844, consent → segment question → the
// task's instructions with a drawing → practice with kind feedback → the trials with progress in
// words → thank you. On every screen: each button at least 44 × 44 px, no sideways scroll, and
// axe-core finds no WCAG A/AA violation. Practice answers are stored as practice, never as test
// answers. Once by keyboard alone, once with reduced motion asked for, and the preview's end.

process.env.DATABASE_URL ??= inject('databaseUrl');
process.env.AUTH_SECRET ??= 'e2e-data-layer-secret-0123456789abcdef';

type Task = 'spot' | 'pick' | 'trip';
const PHONE = { width: 390, height: 844 };
const PRACTICE = 2;

async function studyFor(task: Task, name: string) {
  const { makeLiveStudy, testDesign } = await import('../support/respondent-fixtures');
  // 2 bases × 2 rungs × 2 repetitions = 8 test trials; spot and trip add 2 catch trials (the same
  // price as usual), pick none; 2 practice rounds and the attention check.
  const design = testDesign({
    name, task, basePrices: [2.49, 9.99], ladder: [0.05, 0.2], repetitions: 2, catchShare: task === 'pick' ? 0 : 0.2,
    practiceTrials: PRACTICE, viewMs: task === 'pick' ? 1200 : 400, tripMinutes: 15, shelfSize: 4,
  });
  const study = await makeLiveStudy('harbourline', { design });
  const main = 8 + (task === 'pick' ? 0 : 2) + 1;
  return { ...study, main };
}

/** Checks every screen shares: buttons big enough for a thumb, nothing wider than the phone, no accessibility violation. */
async function checkScreen(page: Page, name: string, opts: { buttons?: boolean } = {}) {
  const buttons = await page.$$eval('button', (bs) => bs.filter((b) => b.getClientRects().length > 0).map((b) => {
    const r = b.getBoundingClientRect();
    return { text: (b.textContent ?? '').trim(), w: Math.round(r.width), h: Math.round(r.height) };
  }));
  if (opts.buttons !== false) expect(buttons.length, `${name}: buttons`).toBeGreaterThan(0);
  for (const b of buttons) {
    expect(b.h, `${name}: height of "${b.text}"`).toBeGreaterThanOrEqual(44);
    expect(b.w, `${name}: width of "${b.text}"`).toBeGreaterThanOrEqual(44);
  }
  // Chromium's mobile emulation widens innerWidth to fit an overflowing page: compare with the layout width too.
  expect(await page.evaluate(() => document.documentElement.scrollWidth <= Math.min(window.innerWidth, document.documentElement.clientWidth)), `${name}: no sideways scroll`).toBe(true);
  await expectAccessible(page, name);
}

const money = (s: string | null) => Number((s ?? '').replace(/[^\d.]/g, ''));

/** The two tags of a pick trial while they are in view: left and right prices. */
async function pickPrices(page: Page): Promise<[number, number]> {
  await page.locator('[data-phase="view"]').waitFor();
  const t = await page.getByTestId('price-tag').locator('span.num').allTextContents();
  return [money(t[0]), money(t[1])];
}

async function walkTask(page: Page, task: Task) {
  const study = await studyFor(task, `Pantry oil: ${task} on a phone ${Date.now()}`);
  const name = (s: string) => `phone-${task}-${s}`;
  await page.goto(`${baseUrl()}/r/${study.token}`);
  await page.getByRole('button', { name: 'I agree, start' }).waitFor();
  await page.waitForLoadState('networkidle');
  await checkScreen(page, name('consent'));
  await screenshot(page, name('consent'));
  await page.getByRole('button', { name: 'I agree, start' }).click();
  await page.getByRole('button', { name: '2', exact: true }).waitFor();
  await checkScreen(page, name('question'));
  await page.getByRole('button', { name: '2', exact: true }).click();

  // One instruction screen for the task, with its drawing, saying what will happen and how much.
  const intro = page.getByTestId('instructions');
  await intro.waitFor();
  expect(await intro.getAttribute('data-task')).toBe(task);
  expect(await page.getByTestId('task-picture').isVisible()).toBe(true);
  const introText = await intro.innerText();
  expect(introText).toContain(`First ${PRACTICE} practice rounds show you how you did`);
  expect(introText).toContain(`Then ${study.main} questions`);
  expect(await page.getByTestId('keys-note').isVisible()).toBe(false); // a touch screen: no keyboard talk
  await checkScreen(page, name('instructions'));
  await screenshot(page, name('instructions'));
  await page.getByRole('button', { name: 'Start the practice' }).click();

  const shelf = new Map<string, number>();
  if (task === 'spot') {
    await page.getByTestId('shelf').waitFor();
    for (const li of await page.getByTestId('shelf').locator('li').all()) {
      const [label, price] = await li.locator('span').allTextContents();
      shelf.set(label.trim(), money(price));
    }
    await checkScreen(page, name('shelf'));
    await page.getByRole('button', { name: 'I have looked at them' }).click();
  }

  // Practice: a wrong answer first, then a right one (trip has no right answer), each told kindly.
  const progress = page.getByTestId('progress-words');
  for (const round of [1, 2]) {
    const trial = page.getByTestId('trial');
    await trial.waitFor();
    expect(await trial.getAttribute('data-kind')).toBe('practice');
    expect(await progress.textContent()).toBe(`Practice ${round} of ${PRACTICE}`);
    const right = round === 2;
    if (task === 'pick') {
      const [l, r] = await pickPrices(page);
      expect(l).not.toBe(r);
      const lowerIsLeft = l < r;
      await page.getByRole('button', { name: lowerIsLeft === right ? 'Left' : 'Right', exact: true }).click();
    } else {
      if (round === 1) await checkScreen(page, name('practice'));
      await page.getByRole('button', { name: task === 'spot' ? (right ? 'Lower than usual' : 'The same') : (right ? 'Go to the other store' : 'Buy it here') }).click();
    }
    const fb = page.getByTestId('practice-feedback');
    await fb.waitFor();
    expect(await fb.getAttribute('data-verdict')).toBe(task === 'trip' ? 'choice' : right ? 'right' : 'wrong');
    const words = await fb.innerText();
    expect(words).toMatch(task === 'trip' ? /no right or wrong/ : right ? /Well spotted/ : /Not this time, and that is fine/);
    expect(words).toMatch(/€\d/); // says what the prices were
    expect(words).not.toMatch(/\bscore\b|\d+ ?%|points?\b/i); // never a score
    await checkScreen(page, name(`feedback-${round}`));
    if (round === 1) await screenshot(page, name('practice-feedback'));
    const next = page.getByRole('button', { name: round < PRACTICE ? 'Next practice round' : 'Start the real questions' });
    if (round === PRACTICE) expect(words).toContain('That was the last practice round');
    await next.click();
  }

  // The trials: progress in words, tags sized for the phone, no forced choice between equal prices.
  let answered = 0;
  let sameShown = 0;
  const t0 = Date.now();
  while (!(await page.getByTestId('thanks').count())) {
    const trial = page.getByTestId('trial').or(page.getByTestId('thanks'));
    await trial.first().waitFor();
    if (await page.getByTestId('thanks').count()) break;
    expect(await progress.textContent()).toBe(`${answered} of ${study.main} answered`);
    const kind = await page.getByTestId('trial').getAttribute('data-kind');
    expect(kind).not.toBe('practice');
    if (kind === 'attention') {
      await page.getByRole('button', { name: 'Often' }).click();
    } else if (task === 'pick') {
      const [l, r] = await pickPrices(page);
      expect(l, 'two tags with the same price would force a coin flip').not.toBe(r);
      if (answered === 0) {
        await tagFitsThePhone(page); // while the tags are in view
        await page.locator('[data-phase="choose"]').waitFor();
        await checkScreen(page, name('trial'));
        await screenshot(page, name('trial'));
      }
      await page.getByRole('button', { name: l < r ? 'Left' : 'Right', exact: true }).click();
    } else {
      if (answered === 0) {
        await tagFitsThePhone(page);
        await checkScreen(page, name('trial'));
        await screenshot(page, name('trial'));
      }
      const shown = money(await page.getByTestId('price-tag').first().locator('span.num').textContent());
      if (task === 'spot') {
        const usual = shelf.get((await page.getByRole('heading', { level: 1 }).textContent())!.trim());
        expect(usual).toBeDefined();
        // The usual price again: "The same" is there to say so.
        if (shown === usual) { sameShown++; expect(await page.getByRole('button', { name: 'The same' }).count()).toBe(1); }
        await page.getByRole('button', { name: shown === usual ? 'The same' : 'Lower than usual' }).click();
      } else {
        const there = money(await page.getByTestId('trial').locator('p span.num').textContent());
        // The same price at the other store: "Buy it here" is the sensible answer on offer.
        if (there === shown) { sameShown++; expect(await page.getByRole('button', { name: 'Buy it here' }).count()).toBe(1); }
        await page.getByRole('button', { name: there < shown ? 'Go to the other store' : 'Buy it here' }).click();
      }
    }
    answered++;
  }
  const msPerTrial = Math.round((Date.now() - t0) / answered);
  expect(answered).toBe(study.main);
  if (task !== 'pick') expect(sameShown).toBe(2);
  await page.getByTestId('thanks').waitFor();
  await checkScreen(page, name('thanks'), { buttons: false });
  await screenshot(page, name('thanks'));

  // Practice answers are kept as practice (never analysed), the rest as test, catch and attention.
  const { trialRows } = await import('../support/respondent-fixtures');
  const rows = await trialRows(new URL(page.url()).searchParams.get('resume')!);
  expect(rows.map((r) => r.kind).slice(0, PRACTICE)).toEqual(['practice', 'practice']);
  expect(rows.filter((r) => r.kind === 'practice')).toHaveLength(PRACTICE);
  expect(rows.filter((r) => r.kind === 'test')).toHaveLength(8);
  return msPerTrial;
}

/** The price tag takes about a tenth of the screen, and the trial fits without scrolling. */
async function tagFitsThePhone(page: Page) {
  const box = (await page.getByTestId('price-tag').first().locator('div').first().boundingBox())!;
  expect(box.height).toBeLessThanOrEqual(PHONE.height * 0.12);
  expect(box.width).toBeLessThanOrEqual(PHONE.width * 0.6);
  expect(await page.evaluate(() => document.documentElement.scrollHeight)).toBeLessThanOrEqual(PHONE.height);
}

describe('the phone flow explains itself', () => {
  afterAll(async () => {
    const { orm } = await import('@/lib/server/db/orm');
    await (await orm()).close(true);
  });

  for (const task of ['spot', 'pick', 'trip'] as const) {
    it(`${task}: consent → instructions → practice with feedback → trials in words → thank you, every screen accessible`, async () => {
      const { context, page } = await openBrowser({ phone: true });
      try {
        // Motion is on by default: the progress bar moves (the reduced-motion test turns it off).
        const ms = await walkTask(page, task);
        process.stdout.write(`[phone-flow] ${task}: ${ms} ms a trial for a scripted respondent (screen time and round trips, no thinking)\n`);
      } finally {
        await context.close();
      }
    });
  }

  // Protects the adaptive path: the staircase's next trial arrives while the feedback is read,
  // and must not jump over it; the flow still ends with every answer stored.
  it('adaptive placement: practice feedback stays until the respondent moves on', async () => {
    const { makeLiveStudy, testDesign, trialRows } = await import('../support/respondent-fixtures');
    const design = testDesign({
      name: `Pantry oil: adaptive trip ${Date.now()}`, task: 'trip', basePrices: [9.99], ladder: [0.05, 0.2], catchShare: 0, practiceTrials: PRACTICE,
      adaptive: { enabled: true, trialsPerBase: 8 }, attentionCheck: { enabled: false }, segmentQuestions: [],
    });
    const study = await makeLiveStudy('harbourline', { design });
    const { context, page } = await openBrowser({ phone: true });
    try {
      await page.goto(`${baseUrl()}/r/${study.token}`);
      await page.getByRole('button', { name: 'I agree, start' }).click();
      await page.getByRole('button', { name: 'Start the practice' }).click();
      await page.getByRole('button', { name: 'Buy it here' }).click();
      const fb = page.getByTestId('practice-feedback');
      await fb.waitFor();
      const resume = new URL(page.url()).searchParams.get('resume')!;
      await expect.poll(() => trialRows(resume).then((r) => r.length), { timeout: 20_000 }).toBe(1); // the reply has come back
      await page.waitForTimeout(300);
      expect(await fb.count()).toBe(1);
      await page.getByRole('button', { name: 'Next practice round' }).click();
      let n = 1;
      while ((await answerNext(page)) === 'answered') n++;
      expect(await page.getByTestId('thanks').count()).toBe(1);
      const rows = await trialRows(resume);
      expect(rows).toHaveLength(n);
      expect(rows.filter((r) => r.kind === 'practice')).toHaveLength(PRACTICE);
      expect(n).toBeGreaterThan(PRACTICE);
    } finally {
      await context.close();
    }
  });

  it('keyboard only, on a desktop: every step by Tab, Enter and the answer keys named on screen', async () => {
    const study = await studyFor('pick', `Pantry oil: keyboard ${Date.now()}`);
    const { context, page } = await openBrowser();
    try {
      const focused = () => page.evaluate(() => (document.activeElement?.textContent ?? '').trim());
      await page.goto(`${baseUrl()}/r/${study.token}`);
      await page.waitForLoadState('networkidle');
      await page.keyboard.press('Tab');
      expect(await focused()).toBe('I agree, start');
      await page.keyboard.press('Enter');
      // Each new screen focuses its heading, so one Tab reaches the first answer.
      await page.getByRole('button', { name: '1', exact: true }).waitFor();
      await page.keyboard.press('Tab');
      expect(await focused()).toBe('1');
      await page.keyboard.press('Enter');
      await page.getByTestId('instructions').waitFor();
      expect(await page.getByTestId('keys-note').innerText()).toContain('← for the left tag, → for the right');
      await page.keyboard.press('Tab');
      expect(await focused()).toBe('Start the practice');
      await page.keyboard.press('Enter');
      let answered = 0;
      for (;;) {
        await page.getByTestId('trial').or(page.getByTestId('practice-feedback')).or(page.getByTestId('thanks')).first().waitFor();
        if (await page.getByTestId('thanks').count()) break;
        if (await page.getByTestId('practice-feedback').count()) {
          await page.keyboard.press('Tab');
          expect(await focused()).toMatch(/^(Next practice round|Start the real questions)$/);
          await page.keyboard.press('Enter');
          await page.getByTestId('practice-feedback').waitFor({ state: 'detached' });
          continue;
        }
        const shown = await page.getByTestId('trial').elementHandle();
        if ((await page.getByTestId('trial').getAttribute('data-kind')) === 'attention') {
          await page.keyboard.press('3'); // "Often", the third answer
        } else {
          await page.locator('[data-phase="choose"]').waitFor();
          if (!answered) await screenshot(page, 'keyboard-pick-choose');
          await page.keyboard.press(answered % 2 ? 'ArrowRight' : 'ArrowLeft');
        }
        // The key answered: that trial's screen is gone.
        await page.waitForFunction((el) => !el?.isConnected, shown);
        answered++;
      }
      expect(answered).toBe(PRACTICE + study.main);
      const { trialRows } = await import('../support/respondent-fixtures');
      expect(await trialRows(new URL(page.url()).searchParams.get('resume')!)).toHaveLength(PRACTICE + study.main);
    } finally {
      await context.close();
    }
  });

  it('with reduced motion asked for, nothing moves; without it the progress bar glides', async () => {
    const study = await studyFor('trip', `Pantry oil: still screens ${Date.now()}`);
    const { context, page } = await openBrowser({ phone: true });
    const barTransition = () => page.getByTestId('progress').locator('div').evaluate((el) => getComputedStyle(el).transitionDuration);
    try {
      await page.emulateMedia({ reducedMotion: 'reduce' });
      await page.goto(`${baseUrl()}/r/${study.token}`);
      await page.getByRole('button', { name: 'I agree, start' }).click();
      await page.getByRole('button', { name: '1', exact: true }).click();
      await page.getByRole('button', { name: 'Start the practice' }).click();
      await page.getByTestId('trial').waitFor();
      expect(await page.evaluate(() => matchMedia('(prefers-reduced-motion: reduce)').matches)).toBe(true);
      expect(await barTransition()).toBe('0s');
      await page.emulateMedia({ reducedMotion: 'no-preference' });
      expect(await barTransition()).toBe('0.3s');
      await screenshot(page, 'phone-trip-reduced-motion');
    } finally {
      await context.close();
    }
  });

  it("the analyst's preview goes through the same screens and ends saying nothing was recorded", async () => {
    const study = await studyFor('spot', `Pantry oil: preview ${Date.now()}`);
    const { context, page } = await openBrowser();
    try {
      await signIn(page, 'analyst@harbourline.example', 'harbour-demo-2026');
      await page.goto(`${baseUrl()}/w/harbourline/studies/${study.studyId}/preview`);
      const frame = page.getByTestId('respondent-preview');
      await frame.getByRole('button', { name: 'I agree, start' }).click();
      await frame.getByRole('button', { name: '2', exact: true }).click();
      await frame.getByTestId('instructions').waitFor();
      await expectAccessible(page, 'preview-instructions', { include: '[data-testid="respondent-preview"]' });
      let n = 0;
      while ((await answerNext(page)) === 'answered') n++;
      expect(n).toBe(PRACTICE + study.main);
      const end = page.getByTestId('preview-end');
      expect(await end.innerText()).toContain('Nothing was recorded');
      expect(await page.getByTestId('thanks').count()).toBe(0);
      expect(await page.getByText('Your answers have been saved').count()).toBe(0);
      await screenshot(page, 'preview-end');
      const { em } = await import('@/lib/server/db/orm');
      const rows = await (await em()).getConnection().execute<{ n: string }[]>('select count(*) as n from respondent where study_id = ?', [study.studyId]);
      expect(Number(rows[0].n)).toBe(0);
    } finally {
      await context.close();
    }
  });
});
