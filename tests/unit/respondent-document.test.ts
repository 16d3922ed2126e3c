import { createElement } from 'react';
import { renderToString } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { LiveFlow } from '@/respondent/client/live-flow';
import { Stopped } from '@/respondent/client/status-screens';
import { consentDocument, resumeDocument, stoppedDocument } from '@/respondent/server/document';
import { bootJson, ROOT_ID, type RespondentBoot } from '@/respondent/shared/boot';
import { respondentUrls } from '@/respondent/shared/urls';
import en from '@/respondent/messages/en';
import { messagesFor } from '@/respondent/messages/all';
import { refusal } from '@/respondent/server/words';

// The respondent documents rendered on the server from the flow's own components. Whether the
// vite bundle is built does not matter here: these checks read only the first screen.

const study = { task: 'pick', itemName: 'Oil', pictureUrl: null, currency: 'EUR', locale: 'en-IE', viewMs: 500, tripMinutes: 10, contact: 'Pricing team, Example Foods Ltd — privacy@example.test' } as const;
const boot = (over: Partial<RespondentBoot> = {}): RespondentBoot => ({
  token: 'abc_DEF-123', resumeToken: null, pid: null, initial: null, study, retentionDays: 365, questions: [],
  consentText: 'A short survey.\nNo names are stored.', language: 'en', messages: en, ...over,
});
const firstScreen = (html: string) => {
  const m = new RegExp(`<main id="${ROOT_ID}"[^>]*>(.*)</main>`, 's').exec(html);
  expect(m, 'the document has its flow root').not.toBeNull();
  return m![1];
};
const consentPage = async (b: RespondentBoot) => (await consentDocument({ action: respondentUrls(b.token).start, boot: b })).text();

describe('the server-rendered consent screen', () => {
  for (const b of [boot(), boot({ pid: 'p"<1>&\'', consentText: 'Quotes "like this" & <tags> and it\'s fine', retentionDays: 30 })]) {
    it(`is exactly what the phone's flow renders first, so hydrating it changes nothing (pid ${b.pid ? 'given' : 'none'})`, async () => {
      const flow = renderToString(createElement(LiveFlow, {
        token: b.token, resumeToken: b.resumeToken, pid: b.pid, initial: b.initial, study: b.study,
        consentText: b.consentText, retentionDays: b.retentionDays, questions: b.questions, messages: b.messages,
      }));
      expect(firstScreen(await consentPage(b))).toBe(flow);
    });
  }

  it('is a real form posting consent (and the panel id) to the start route, so it works without script', async () => {
    const html = firstScreen(await consentPage(boot({ token: 't0k3n-abcdef', pid: 'panel-9', retentionDays: 7 })));
    const form = /<form ([^>]*)>/.exec(html)?.[1] ?? '';
    expect(form).toContain('method="post"');
    expect(form).toContain('action="/r/t0k3n-abcdef/start"');
    expect(html).toContain('<input type="hidden" name="pid" value="panel-9"/>');
    expect(html).toContain('<input type="hidden" name="consent" value="true"/>');
    expect(html).toMatch(/<button type="submit"[^>]*>I agree, start<\/button>/);
    expect(html).toContain('kept for 7 days');
  });

  it('escapes hostile consent text and panel ids once: no markup of theirs reaches the page', async () => {
    const html = await consentPage(boot({ consentText: '</main><script>alert(1)</script>', pid: '"><script>alert(2)</script>' }));
    expect(html).not.toMatch(/<script>alert/);
    expect(html).toContain('&lt;/main&gt;&lt;script&gt;alert(1)&lt;/script&gt;');
    expect(html).toContain('value="&quot;&gt;&lt;script&gt;alert(2)&lt;/script&gt;"');
  });
});

describe('the other respondent documents', () => {
  it('a stop screen: its status, its title, the flow’s own Stopped markup and no script at all', async () => {
    const res = await stoppedDocument({ status: 410, code: 'gone', message: 'This study is paused at the moment. Please try again later.' });
    expect(res.status).toBe(410);
    expect(res.headers.get('content-type')).toBe('text/html; charset=utf-8');
    const html = await res.text();
    expect(html.startsWith('<!doctype html><html lang="en">')).toBe(true);
    expect(html).toContain('<title>This study is not open · Notchwise</title>');
    expect(firstScreen(html)).toBe(renderToString(createElement(Stopped, { m: en, code: 'gone', message: 'This study is paused at the moment. Please try again later.' })));
    expect(html).not.toContain('<script');
  });

  it('a resumed visit: "One moment" with a note for browsers without script, and no consent form', async () => {
    const html = firstScreen(await (await resumeDocument({ boot: boot({ resumeToken: 'r-token' }) })).text());
    expect(html).toContain('data-testid="waiting"');
    expect(html).toMatch(/<noscript>.*need JavaScript.*<\/noscript>/s);
    expect(html).not.toContain('<form');
  });
});

describe('the documents speak the study’s language', () => {
  it('a German consent page: <html lang="de">, a German title and screen, the German catalogue in the boot data', async () => {
    const de = messagesFor('de');
    const html = await consentPage(boot({ language: 'de', messages: de }));
    expect(html.startsWith('<!doctype html><html lang="de">')).toBe(true);
    expect(html).toContain(`<title>${de.document.title} · Notchwise</title>`);
    expect(firstScreen(html)).toContain(`>${de.consent.agree}</button>`);
    expect(firstScreen(html)).not.toContain(en.consent.agree);
  });

  it('a refusal worded for a French study renders as a French stop page, whatever the caller passes', async () => {
    const html = await (await stoppedDocument(refusal('fr', 410, 'gone', 'paused'))).text();
    expect(html.startsWith('<!doctype html><html lang="fr">')).toBe(true);
    expect(html).toContain(messagesFor('fr').stop.titles.gone);
    expect(html).toContain(messagesFor('fr').stop.paused);
  });
});

describe('boot data block', () => {
  it('cannot close its script element early and parses back to the same data', () => {
    const b = boot({ token: 't', consentText: '</script><script>alert(1)</script>\u2028', retentionDays: 1 });
    const json = bootJson(b);
    expect(json).not.toMatch(/<\/script/i);
    expect(JSON.parse(json)).toEqual(b);
  });
});
