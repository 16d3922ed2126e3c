import { describe, expect, it } from 'vitest';
import { renderToStaticMarkup } from 'react-dom/server';
import { estimatedMinutes, estimatedSeconds, studyDesignSchema, trialsPerRespondent } from '@/lib/schemas/study.schema';
import { PracticeFeedback, practiceVerdict } from '@/respondent/client/practice-feedback';
import { InstructionsScreen } from '@/respondent/client/instructions-screen';
import { Progress } from '@/respondent/client/status-screens';
import type { FlowStudy, PublicTrial } from '@/respondent/shared/types';
import en from '@/respondent/messages/en';
import { validDesign } from '../support/study-fixtures';

// The builder's minutes against a measured respondent, and the words of the phone flow's
// practice feedback, instructions and progress (the e2e test walks them in Chromium).

describe("the builder's minutes match a measured respondent", () => {
  // A phone walk-through: 36 "pick the lower price" trials (1.2 s view) took about 100 s; the old
  // estimate (4 s a trial + viewing + a minute) said 4 minutes.
  const walkThrough = studyDesignSchema.parse(validDesign({
    task: 'pick', viewMs: 1200, basePrices: [2.49, 9.99, 49], ladder: [0.05, 0.1, 0.2], repetitions: 3, catchShare: 0, practiceTrials: 0,
    attentionCheck: { enabled: false },
  }));

  it('36 pick trials: about 100 s of trials (within 10 %), about 2 minutes in all', () => {
    expect(trialsPerRespondent(walkThrough).total).toBe(27);
    const d36 = { ...walkThrough, repetitions: 4 };
    expect(trialsPerRespondent(d36).total).toBe(36);
    const s = estimatedSeconds(d36);
    expect(s.trials).toBeGreaterThanOrEqual(90);
    expect(s.trials).toBeLessThanOrEqual(110);
    expect(estimatedMinutes(d36)).toBe(2);
  });

  it('a longer view, practice rounds and the spot shelf all add time; trip reads slower than pick taps', () => {
    const d = { ...walkThrough, repetitions: 4 };
    expect(estimatedSeconds({ ...d, viewMs: 2400 }).trials).toBeGreaterThan(estimatedSeconds(d).trials);
    expect(estimatedSeconds({ ...d, practiceTrials: 3 }).other).toBeGreaterThan(estimatedSeconds(d).other);
    expect(estimatedSeconds({ ...d, task: 'spot' }).other).toBeGreaterThan(estimatedSeconds({ ...d, task: 'trip' }).other);
    expect(estimatedSeconds({ ...d, task: 'trip' }).trials).toBeGreaterThan(estimatedSeconds(d).trials);
  });
});

const study = (task: FlowStudy['task']): FlowStudy => ({ task, itemName: 'Olive oil', pictureUrl: null, currency: 'EUR', locale: 'en-IE', viewMs: 1200, tripMinutes: 15, contact: 'Harbourline pricing team, research@harbourline.example' });
const practice = (over: Partial<PublicTrial> = {}): PublicTrial => ({ idx: 0, kind: 'practice', label: 'Olive oil', base: 9.99, price: 6.99, ...over });

describe('practice feedback', () => {
  it('knows the right answer for spot and pick, and that trip has none', () => {
    expect(practiceVerdict(study('spot'), practice(), 1)).toBe(true);
    expect(practiceVerdict(study('spot'), practice(), 0)).toBe(false);
    expect(practiceVerdict(study('spot'), practice({ price: 9.99 }), 0)).toBe(true);
    expect(practiceVerdict(study('pick'), practice({ side: 'right' }), 1)).toBe(true);
    expect(practiceVerdict(study('pick'), practice({ side: 'right' }), 0)).toBe(false);
    expect(practiceVerdict(study('trip'), practice(), 1)).toBeNull();
  });

  it('says a wrong answer kindly, with the prices, never as a score', () => {
    const html = renderToStaticMarkup(PracticeFeedback({ m: en, study: study('pick'), trial: practice({ side: 'right' }), answer: 0, last: false, onNext: () => {} }));
    expect(html).toContain('Not this time, and that is fine');
    expect(html).toContain('€6.99');
    expect(html).toContain('right tag');
    expect(html).toContain('data-verdict="wrong"');
    expect(html).not.toMatch(/score|wrong!|incorrect|%/i);
  });

  it('the last practice round leads into the real questions', () => {
    const html = renderToStaticMarkup(PracticeFeedback({ m: en, study: study('trip'), trial: practice(), answer: 1, last: true, onNext: () => {} }));
    expect(html).toContain('no right or wrong');
    expect(html).toContain('That was the last practice round');
    expect(html).toContain('Start the real questions');
  });
});

describe('instructions and progress', () => {
  it('one instruction screen per task, with its drawing, the practice and the question count', () => {
    for (const task of ['spot', 'pick', 'trip'] as const) {
      const html = renderToStaticMarkup(InstructionsScreen({ m: en, study: study(task), practice: 2, questions: 36, onStart: () => {} }));
      expect(html).toContain(`data-task="${task}"`);
      expect(html).toContain('<svg');
      expect(html).toContain('First 2 practice rounds');
      expect(html).toContain('Then 36 questions');
    }
    expect(renderToStaticMarkup(InstructionsScreen({ m: en, study: study('pick'), practice: 0, questions: 5, onStart: () => {} }))).not.toContain('practice');
  });

  it('progress in words: "12 of 36 answered", practice counted on its own', () => {
    expect(renderToStaticMarkup(Progress({ m: en, done: 12, total: 36 }))).toContain('12 of 36 answered');
    const p = renderToStaticMarkup(Progress({ m: en, done: 0, total: 36, practice: { n: 1, of: 2 } }));
    expect(p).toContain('Practice 1 of 2');
    expect(p).toContain('aria-valuetext="Practice 1 of 2"');
  });
});
