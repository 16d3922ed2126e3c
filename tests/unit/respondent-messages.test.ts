import { createElement, type ReactElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { LANGUAGES, readDesign, type Language } from '@/lib/schemas/study.schema';
import { DEFAULT_ATTENTION, DEFAULT_CONSENTS } from '@/lib/schemas/language-defaults';
import { CATALOGUES, languageFromAcceptLanguage, messagesFor } from '@/respondent/messages/all';
import en from '@/respondent/messages/en';
import { fill, type Messages } from '@/respondent/messages/format';
import { ConsentScreen } from '@/respondent/client/consent-screen';
import { InstructionsScreen } from '@/respondent/client/instructions-screen';
import { PickTrial } from '@/respondent/client/pick-trial';
import { PracticeFeedback } from '@/respondent/client/practice-feedback';
import { PreviewEnd } from '@/respondent/client/preview-end';
import { QuestionScreen } from '@/respondent/client/question-screen';
import { ShelfScreen } from '@/respondent/client/shelf-screen';
import { NeedsScript, Progress, Reconnecting, Stopped, Thanks, Waiting } from '@/respondent/client/status-screens';
import { TrialScreen } from '@/respondent/client/trial-screen';
import { formatPrice } from '@/respondent/shared/price';
import { generatePlan } from '@/respondent/shared/plan';
import type { FlowStudy, PublicTrial } from '@/respondent/shared/types';
import { validDesign } from '../support/study-fixtures';

// Every respondent screen in every language (issue 15). Three checks, each able to fail:
// 1. the catalogues: the same keys and placeholders as English, nothing empty, nothing left in
//    English (a string equal to the English one, unless it is on the short allow-list below);
// 2. a marker catalogue (every string replaced by its key) rendered through every screen: no
//    text is left on any screen once the markers and the study's own content are taken out,
//    so no screen says anything that is not in the catalogue, and every key is shown somewhere;
// 3. each real language rendered through every screen: no sentence of the English catalogue appears.

type Leaf = { path: string; value: string };
function leaves(o: unknown, prefix = ''): Leaf[] {
  if (typeof o === 'string') return [{ path: prefix, value: o }];
  return Object.entries(o as Record<string, unknown>).flatMap(([k, v]) => leaves(v, prefix ? `${prefix}.${k}` : k));
}
const placeholders = (s: string) => [...s.matchAll(/\{(\w+)\}/g)].map((m) => m[1]).sort();

/** Strings that may equal the English one: nothing but placeholders, numbers or signs; and words that are the same in that language. */
const SAME_AS_ENGLISH: Partial<Record<Language, string[]>> = {
  fr: ['picture.minutes', 'shelfItems.variants.0'], // "{n} min" and "mini" are French too
  es: ['shelfItems.variants.0'],
  nl: ['shelfItems.variants.0'],
};

// The study's own content, in tokens the checks can take out again.
const T = { item: 'ITEMNAME', consent: 'CONSENTTEXT', contact: 'CONTACTLINE', question: 'QUESTIONTEXT', option: 'OPTIONONE', option2: 'OPTIONTWO', shelf: 'SHELFITEM', code: 'REFCODE', attention: 'ATTENTIONQ' };
const LOCALE: Record<Language, string> = { en: 'en-GB', de: 'de-DE', fr: 'fr-FR', es: 'es-ES', nl: 'nl-NL' };
const study = (task: FlowStudy['task'], lang: Language): FlowStudy => ({ task, itemName: T.item, pictureUrl: null, currency: 'EUR', locale: LOCALE[lang], viewMs: 1200, tripMinutes: 15, contact: T.contact });
const trial = (over: Partial<PublicTrial> = {}): PublicTrial => ({ idx: 3, kind: 'trial', label: T.item, base: 9.99, price: 8.99, ...over });
const none = () => {};

/** Every screen of the flow with every variant of its words; the server-rendered stop screens use the same Stopped. */
function screens(m: Messages, lang: Language): [string, ReactElement][] {
  const out: [string, ReactElement][] = [];
  const add = (name: string, el: ReactElement) => out.push([name, el]);
  add('consent', createElement(ConsentScreen, { m, consentText: T.consent, contact: T.contact, retentionDays: 90, action: '/r/x/start', pid: null }));
  add('question', createElement(QuestionScreen, { m, question: { id: 'q', text: T.question, options: [T.option, T.option2] }, n: 1, of: 2, onAnswer: none }));
  for (const task of ['spot', 'pick', 'trip'] as const) {
    const s = study(task, lang);
    for (const [practice, questions] of [[0, 1], [1, 36], [3, 36]]) {
      add(`instructions ${task} ${practice}/${questions}`, createElement(InstructionsScreen, { m, study: s, practice, questions, onStart: none }));
    }
    add(`practice trial ${task}`, createElement(TrialScreen, { m, study: s, trial: trial({ kind: 'practice', side: 'right' }), onAnswer: none }));
    add(`trial ${task}`, createElement(TrialScreen, { m, study: s, trial: trial(), onAnswer: none }));
    for (const answer of [0, 1]) {
      for (const t of [trial({ kind: 'practice', side: 'left' }), trial({ kind: 'practice', side: 'right' }), trial({ kind: 'practice', price: 9.99 })]) {
        for (const last of [false, true]) add(`feedback ${task} ${answer} ${t.side ?? 'same'} ${last}`, createElement(PracticeFeedback, { m, study: s, trial: t, answer, last, onNext: none }));
      }
    }
  }
  for (const phase of ['ready', 'view', 'choose'] as const) add(`pick ${phase}`, createElement(PickTrial, { m, study: study('pick', lang), trial: trial({ side: 'left' }), onAnswer: none, initialPhase: phase }));
  add('attention', createElement(TrialScreen, { m, study: study('spot', lang), trial: { idx: 5, kind: 'attention', label: '', base: 0, price: 0, attention: { question: T.attention, options: [T.option, T.option2] } }, onAnswer: none }));
  for (const again of [false, true]) add(`shelf ${again}`, createElement(ShelfScreen, { m, study: study('spot', lang), shelf: [{ label: T.shelf, price: 2.49 }], again, onDone: none }));
  add('progress', createElement(Progress, { m, done: 12, total: 36 }));
  add('progress practice', createElement(Progress, { m, done: 0, total: 36, practice: { n: 1, of: 3 } }));
  add('reconnecting', createElement(Reconnecting, { m }));
  add('thanks', createElement(Thanks, { m, referenceCode: T.code }));
  add('preview end', createElement(PreviewEnd, { m }));
  add('waiting', createElement(Waiting, { m }));
  add('needs script', createElement(NeedsScript, { m }));
  const { titles, ...words } = m.stop;
  for (const code of [...Object.keys(titles), 'rate_limited']) {
    for (const [w, text] of Object.entries(words)) add(`stopped ${code} ${w}`, createElement(Stopped, { m, code, message: fill(text, { n: 120, missing: 2, total: 36 }) }));
  }
  return out;
}

/** What a reader meets on a screen: text and the words of aria-label, aria-valuetext, alt and title. */
function visible(html: string): string {
  const attrs = [...html.matchAll(/\s(?:aria-label|aria-valuetext|alt|title)="([^"]*)"/g)].map((a) => a[1]);
  const text = html.replace(/<[^>]*>/g, ' ');
  return [text, ...attrs].join(' ').replace(/&#x27;/g, '\'').replace(/&quot;/g, '"').replace(/&amp;/g, '&').replace(/&lt;/g, '<').replace(/&gt;/g, '>');
}

describe('the catalogues', () => {
  const english = leaves(en);
  for (const lang of LANGUAGES) {
    it(`${lang}: every English key, the same placeholders, nothing empty, nothing left in English`, () => {
      const mine = new Map(leaves(CATALOGUES[lang]).map((l) => [l.path, l.value]));
      expect([...mine.keys()].sort(), `${lang} has exactly the English keys`).toEqual(english.map((l) => l.path).sort());
      for (const { path, value } of english) {
        const v = mine.get(path)!;
        expect(v.trim(), `${lang} ${path} is written`).not.toBe('');
        expect(placeholders(v), `${lang} ${path} keeps the placeholders`).toEqual(placeholders(value));
        if (lang === 'en') continue;
        const trivial = !/\p{L}/u.test(value.replace(/\{\w+\}/g, ''));
        if (!trivial && !(SAME_AS_ENGLISH[lang] ?? []).includes(path)) expect(v, `${lang} ${path} is translated`).not.toBe(value);
      }
    });
  }

  it('the standard consent text and attention check exist for each language, translated', () => {
    for (const lang of LANGUAGES) {
      expect(DEFAULT_CONSENTS[lang].length, lang).toBeGreaterThanOrEqual(40);
      expect(DEFAULT_ATTENTION[lang].options, lang).toContain(DEFAULT_ATTENTION[lang].correct);
      if (lang !== 'en') {
        expect(DEFAULT_CONSENTS[lang], lang).not.toBe(DEFAULT_CONSENTS.en);
        expect(DEFAULT_ATTENTION[lang].question, lang).not.toBe(DEFAULT_ATTENTION.en.question);
      }
    }
  });
});

describe('every screen says only what its catalogue says', () => {
  // Each string becomes «its key» followed by its placeholders, so the filled values still show.
  const marker = (o: unknown, prefix = ''): unknown => {
    if (typeof o === 'string') return `«${prefix}»${placeholders(o).map((p) => `{${p}}`).join(' ')}`;
    if (Array.isArray(o)) return o.map((v, i) => marker(v, `${prefix}.${i}`));
    return Object.fromEntries(Object.entries(o as Record<string, unknown>).map(([k, v]) => [k, marker(v, prefix ? `${prefix}.${k}` : k)]));
  };
  const markers = marker(en) as Messages;

  it('no fixed word outside the catalogue on any screen, and every key shown on some screen', () => {
    const seen = new Set<string>();
    const prices = new Set([2.49, 8.99, 9.99].map((v) => formatPrice(v, 'EUR', 'en-GB')));
    for (const [name, el] of screens(markers, 'en')) {
      const text = visible(renderToStaticMarkup(el));
      for (const k of text.matchAll(/«([^»]+)»/g)) seen.add(k[1]);
      let rest = text.replace(/«[^»]+»/g, ' ');
      for (const token of [...Object.values(T), ...prices]) rest = rest.split(token).join(' ');
      // What may remain: numbers, signs, arrows and the key names shown on keyboard hints.
      expect(rest.replace(/[\d\s.,:;!?…·%€\-–—←→()"'“”]/g, ''), `${name} shows words that are not in the catalogue`).toBe('');
    }
    // document.title is the server document's <title> (tests/unit/respondent-document.test.ts);
    // shelfItems are the shelf's labels in the plan (below).
    const missing = leaves(en).map((l) => l.path).filter((p) => !seen.has(p) && p !== 'document.title' && !p.startsWith('shelfItems.'));
    expect(missing, 'catalogue keys no screen shows').toEqual([]);
  });
});

describe('every screen in every other language', () => {
  // English sentences, cut at their placeholders; single short words ("Question" is French too) are skipped.
  const englishFragments = leaves(en).flatMap((l) => l.value.split(/\{\w+\}/)).map((f) => f.trim()).filter((f) => f.length >= 12 || (f.includes(" ") && f.length >= 8));
  for (const lang of LANGUAGES.filter((l) => l !== 'en')) {
    it(`${lang}: no English sentence on any screen, and prices in the locale's format`, () => {
      for (const [name, el] of screens(messagesFor(lang), lang)) {
        const text = visible(renderToStaticMarkup(el)).replace(/\s+/g, ' ');
        for (const f of englishFragments) expect(text.includes(f), `${lang} ${name} shows English: "${f}"`).toBe(false);
      }
    });
  }

  it('a German study prints 12,90 € and a French one 12,90 €, an English one €12.90', () => {
    const nbsp = /\u00a0|\u202f/g;
    expect(formatPrice(12.9, 'EUR', 'de-DE').replace(nbsp, ' ')).toBe('12,90 €');
    expect(formatPrice(12.9, 'EUR', 'fr-FR').replace(nbsp, ' ')).toBe('12,90 €');
    expect(formatPrice(12.9, 'EUR', 'en-GB')).toBe('€12.90');
    const html = renderToStaticMarkup(createElement(ShelfScreen, { m: messagesFor('de'), study: study('spot', 'de'), shelf: [{ label: 'Olivenöl', price: 12.9 }], again: false, onDone: none }));
    expect(html.replace(nbsp, ' ')).toContain('12,90 €');
  });
});

describe('the remembered shelf in the study\'s language', () => {
  it('a German spot study names its shelf items in German; the same seed draws the same shelf in every language', () => {
    const design = (language: Language) => readDesign({ ...validDesign({ task: 'spot', shelfSize: 6, basePrices: [2.99, 9.99, 49] }), language });
    const en6 = generatePlan(design('en'), 42).shelf;
    const de6 = generatePlan(design('de'), 42).shelf;
    expect(de6.map((s) => s.price)).toEqual(en6.map((s) => s.price));
    const germanWords = [...messagesFor('de').shelfItems.fillers, ...messagesFor('de').shelfItems.variants];
    for (const item of de6) expect(germanWords.some((w) => item.label.includes(w)), item.label).toBe(true);
    for (const item of de6) expect([...en.shelfItems.fillers, ...en.shelfItems.variants.slice(1)].some((w) => item.label.endsWith(w)), item.label).toBe(false);
  });
});

describe('which language', () => {
  it('a design saved before the language field reads as English; a saved language reads back', () => {
    const old = validDesign() as Record<string, unknown>;
    delete old.language;
    expect(readDesign(old).language).toBe('en');
    expect(readDesign({ ...old, language: 'nl' }).language).toBe('nl');
    expect(() => readDesign({ ...old, language: 'it' })).toThrow(/language/);
  });

  it('an unknown link follows Accept-Language by quality, English when none fits', () => {
    expect(languageFromAcceptLanguage('fr-CH, fr;q=0.9, en;q=0.8')).toBe('fr');
    expect(languageFromAcceptLanguage('it-IT, de;q=0.5, en;q=0.4')).toBe('de');
    expect(languageFromAcceptLanguage('en;q=0.1, nl-BE')).toBe('nl');
    expect(languageFromAcceptLanguage('es;q=0, pt')).toBe('en');
    expect(languageFromAcceptLanguage(null)).toBe('en');
    expect(messagesFor('xx')).toBe(en);
  });
});
