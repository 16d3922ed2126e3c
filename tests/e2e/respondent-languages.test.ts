import { afterAll, describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { baseUrl, openBrowser, screenshot } from '../support/browser';
import { expectAccessible } from '../support/a11y';

// Issue 15: a study in German, walked on a phone (390 × 844): every screen in German, prices
// written the German way ("12,90 €"), <html lang="de">, the script free of every catalogue (the
// page's boot data carries the study's own), and no English sentence on the way. Then the pages
// with no study behind them follow the browser's language, and a closed German study says so in German.

process.env.DATABASE_URL ??= inject('databaseUrl');
process.env.AUTH_SECRET ??= 'e2e-data-layer-secret-0123456789abcdef';

const EURO_DE = /^\d{1,3}(\.\d{3})*,\d{2}\u00a0€$/; // 12,90 € (Intl writes a no-break space before the sign)

async function englishOnPage(page: Page): Promise<string[]> {
  const en = (await import('@/respondent/messages/en')).default;
  const text = (await page.locator('body').innerText()).replace(/\s+/g, ' ');
  const sentences = JSON.stringify(en).match(/"[^"]{12,}"/g)!.map((s) => JSON.parse(s) as string).flatMap((s) => s.split(/\{\w+\}/)).map((s) => s.trim()).filter((s) => s.length >= 12);
  return sentences.filter((s) => text.includes(s));
}

describe('a German study on a phone', () => {
  afterAll(async () => {
    const { orm } = await import('@/lib/server/db/orm');
    await (await orm()).close(true);
  });

  it('consent → question → instructions → shelf → practice → trials → thank you, all in German, prices as 12,90 €', async () => {
    const { makeLiveStudy, testDesign, trialRows } = await import('../support/respondent-fixtures');
    const { DEFAULT_ATTENTION, DEFAULT_CONSENTS } = await import('@/lib/schemas/language-defaults');
    const { messagesFor } = await import('@/respondent/messages/all');
    const de = messagesFor('de');
    const design = testDesign({
      name: `Olivenöl auf Deutsch ${Date.now()}`, itemName: 'Olivenöl, 1 l', task: 'spot', language: 'de', locale: 'de-DE', currency: 'EUR',
      basePrices: [12.9, 49.9], ladder: [0.05, 0.2], repetitions: 1, catchShare: 0, practiceTrials: 1, shelfSize: 4,
      consentText: DEFAULT_CONSENTS.de, attentionCheck: { enabled: true, ...DEFAULT_ATTENTION.de },
      segmentQuestions: [{ id: 'haushalt', text: 'Wie viele Personen leben in Ihrem Haushalt?', options: ['1', '2', '3 oder mehr'] }],
      contact: 'Preisforschung, Hafenmarkt GmbH — forschung@hafenmarkt.example',
    });
    const study = await makeLiveStudy('harbourline', { design });
    const { context, page } = await openBrowser({ phone: true });
    const scripts: string[] = [];
    page.on('response', async (res) => {
      if (res.request().resourceType() === 'script') scripts.push(await res.text().catch(() => ''));
    });
    const shot = async (name: string) => {
      expect(await englishOnPage(page), `${name}: English on a German screen`).toEqual([]);
      await expectAccessible(page, `german-${name}`);
      await screenshot(page, `respondent-de-${name}`);
    };
    try {
      await page.goto(`${baseUrl()}/r/${study.token}`);
      await page.getByRole('button', { name: de.consent.agree }).waitFor();
      await page.waitForLoadState('networkidle');
      expect(await page.locator('html').getAttribute('lang')).toBe('de');
      expect(await page.title()).toBe(`${de.document.title} · Notchwise`);
      const consent = await page.locator('body').innerText();
      expect(consent).toContain('Ihre Antworten werden nach dem Ende der Studie noch');
      expect(consent).toContain(DEFAULT_CONSENTS.de.slice(0, 60));
      await shot('consent');
      // Only the chosen catalogue loads: the script holds none of them (the boot data holds German).
      expect(scripts.length).toBeGreaterThan(0);
      for (const lang of ['en', 'de', 'fr', 'es', 'nl'] as const) {
        for (const s of [messagesFor(lang).consent.reference, messagesFor(lang).feedback.last]) {
          expect(scripts.some((js) => js.includes(s)), `${lang} catalogue in the script`).toBe(false);
        }
      }
      expect(await page.locator('#respondent-boot').textContent()).toContain(de.feedback.last);

      await page.getByRole('button', { name: de.consent.agree }).click();
      await page.getByText('Frage 1 von 1').waitFor();
      await shot('question');
      await page.getByRole('button', { name: '2', exact: true }).click();

      const intro = page.getByTestId('instructions');
      await intro.waitFor();
      expect(await intro.innerText()).toContain('Zuerst zeigt Ihnen eine Übungsrunde');
      await shot('instructions');
      await page.getByRole('button', { name: de.instructions.startPractice }).click();

      const shelf = new Map<string, string>();
      await page.getByTestId('shelf').waitFor();
      for (const li of await page.getByTestId('shelf').locator('li').all()) {
        const [label, price] = await li.locator('span').allTextContents();
        expect(price, `shelf price of ${label}`).toMatch(EURO_DE);
        shelf.set(label.trim(), price);
      }
      expect(shelf.get('Olivenöl, 1 l — Mini')).toBe('12,90\u00a0€');
      expect([...shelf.keys()].some((l) => /— (mini|small|regular|large|crate)$/.test(l)), 'English pack sizes').toBe(false);
      await shot('shelf');
      await page.getByRole('button', { name: de.shelf.done }).click();

      // The practice round: answered wrong on purpose, told kindly in German with German prices.
      await page.getByTestId('trial').waitFor();
      expect(await page.getByTestId('progress-words').textContent()).toBe('Übung 1 von 1');
      await shot('practice');
      const tag = await page.getByTestId('price-tag').first().locator('span.num').textContent();
      expect(tag).toMatch(EURO_DE);
      await page.getByRole('button', { name: de.trial.spotNo }).click();
      const fb = page.getByTestId('practice-feedback');
      await fb.waitFor();
      expect(await fb.innerText()).toMatch(/\d,\d{2}\u00a0€/);
      await shot('practice-feedback');
      await page.getByRole('button', { name: de.feedback.startReal }).click();

      let answered = 0;
      for (;;) {
        await page.getByTestId('trial').or(page.getByTestId('thanks')).first().waitFor();
        if (await page.getByTestId('thanks').count()) break;
        expect(await page.getByTestId('progress-words').textContent()).toMatch(/^\d+ von \d+ beantwortet$/);
        if ((await page.getByTestId('trial').getAttribute('data-kind')) === 'attention') {
          if (answered === 0) await shot('attention');
          await page.getByRole('button', { name: 'Oft', exact: true }).click();
        } else {
          expect(await page.getByTestId('price-tag').first().locator('span.num').textContent()).toMatch(EURO_DE);
          if (answered === 0) await shot('trial');
          await page.getByRole('button', { name: de.trial.spotYes }).click();
        }
        answered++;
      }
      expect(answered).toBe(2 * 2 + 1);
      expect(await page.getByTestId('thanks').innerText()).toContain(de.thanks.saved);
      await shot('thanks');
      const rows = await trialRows(new URL(page.url()).searchParams.get('resume')!);
      expect(rows).toHaveLength(1 + answered);
    } finally {
      await context.close();
    }
  });

  it('a closed German study says so in German; an unknown link follows Accept-Language (English when none fits)', async () => {
    const { makeLiveStudy, testDesign } = await import('../support/respondent-fixtures');
    const { messagesFor } = await import('@/respondent/messages/all');
    const closed = await makeLiveStudy('harbourline', { design: testDesign({ name: `Geschlossen ${Date.now()}`, language: 'de', locale: 'de-DE' }), state: 'closed' });
    const res = await fetch(`${baseUrl()}/r/${closed.token}`, { headers: { 'accept-language': 'fr' } });
    expect(res.status).toBe(410);
    const html = await res.text();
    expect(html).toContain('<html lang="de">');
    expect(html).toContain(messagesFor('de').stop.closed);

    for (const [header, lang] of [['fr-FR,fr;q=0.9,en;q=0.5', 'fr'], ['pt-BR, es;q=0.3', 'es'], ['ja', 'en'], ['', 'en']] as const) {
      const unknown = await fetch(`${baseUrl()}/r/no-such-link-${lang}-0000`, { headers: header ? { 'accept-language': header } : {} });
      expect(unknown.status).toBe(404);
      const page = await unknown.text();
      expect(page, header).toContain(`<html lang="${lang}">`);
      expect(page, header).toContain(messagesFor(lang).stop.unknownLink);
    }

    const { context, page } = await openBrowser({ phone: true });
    try {
      await page.setExtraHTTPHeaders({ 'accept-language': 'nl-NL,nl;q=0.9' });
      await page.goto(`${baseUrl()}/r/no-such-link-nl-0000`);
      await page.getByTestId('stopped').waitFor();
      expect(await page.locator('h1').textContent()).toBe(messagesFor('nl').stop.titles.not_found);
      await screenshot(page, 'respondent-nl-unknown-link');
    } finally {
      await context.close();
    }
  });
});
