import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { ConsentScreen } from '@/respondent/client/consent-screen';
import { bootJson, type RespondentBoot } from '@/respondent/shared/boot';
import { consentHtml } from '@/respondent/server/consent-html';

// The take-part document's consent form is plain HTML; the live flow then renders ConsentScreen
// over it. Both must be the same markup, or the page would change under the respondent's thumb.
describe('server consent form', () => {
  const cases = [
    { consentText: 'A short survey.\nNo names are stored.', retentionDays: 365, pid: null },
    { consentText: 'Quotes "like this" & <tags> and it\'s fine', retentionDays: 30, pid: 'p"<1>&\'' },
  ];
  for (const c of cases) {
    it(`matches ConsentScreen (pid ${c.pid ? 'given' : 'none'})`, () => {
      const action = '/api/r/abc_DEF-123/start';
      const react = renderToStaticMarkup(createElement(ConsentScreen, { ...c, action, onAgree: () => {} }));
      expect(consentHtml({ ...c, action })).toBe(react);
    });
  }

  it('is a real form posting consent (and the pid) to the start route', () => {
    const html = consentHtml({ consentText: 'x', retentionDays: 7, action: '/api/r/t0k3n/start', pid: 'panel-9' });
    expect(html).toMatch(/^<form [^>]*action="\/api\/r\/t0k3n\/start" method="post">/);
    expect(html).toContain('<input type="hidden" name="pid" value="panel-9"/>');
    expect(html).toContain('<input type="hidden" name="consent" value="true"/>');
    expect(html).toContain('kept for 7 days');
  });
});

describe('boot data block', () => {
  it('cannot close its script element early and parses back to the same data', () => {
    const boot = { token: 't', resumeToken: null, pid: null, initial: null, consentText: '</script><script>alert(1)</script>\u2028', retentionDays: 1, questions: [],
      study: { task: 'pick', itemName: 'Oil', pictureUrl: null, currency: 'EUR', locale: 'en-IE', viewMs: 500, tripMinutes: 10 } } satisfies RespondentBoot;
    const json = bootJson(boot);
    expect(json).not.toMatch(/<\/script/i);
    expect(JSON.parse(json)).toEqual(boot);
  });
});
