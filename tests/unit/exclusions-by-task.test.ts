import { describe, expect, it } from 'vitest';
import { binomialUpperTail, brokenRules, falseAlarmsAboveLimit, qualityOf, ruleApplies, type JudgedTrial } from '@/lib/exclusions';
import { DEFAULT_EXCLUSION_RULES, describeRules } from '@/lib/schemas/exclusions.schema';
import { studyDesignSchema, trialsPerRespondent, type StudyDesign } from '@/lib/schemas/study.schema';
import { newStudyDefaults } from '@/lib/study-defaults';
import { createRng, type Rng } from '@/lib/psychometrics/random';
import type { Task } from '@/lib/psychometrics/types';
import { generatePlan } from '@/respondent/shared/plan';
import type { FixedPlan } from '@/respondent/shared/types';

// Each exclusion rule applies only where its task gives it meaning, and the default rules keep
// every honest shopper of a simulated panel. The panel is our own simulation (no published
// source): shoppers' ln thresholds spread with SD 0.5 around 7 %, slope 3 on ln discount,
// lapses 2 %, spot-the-saving false alarms 2–25 %, response times log-normal around 0.9–3 s.

function design(task: Task): StudyDesign {
  return studyDesignSchema.parse({ ...newStudyDefaults(20261202), name: 'Honest panel', itemName: 'Oat flakes 500 g', category: 'Breakfast', task });
}

function honestRespondent(d: StudyDesign, seed: number, rng: Rng): JudgedTrial[] {
  const plan = generatePlan(d, seed) as FixedPlan;
  const lnAlpha = Math.log(0.07) + 0.5 * rng.normal();
  const guess = d.task === 'pick' ? 0.5 : d.task === 'spot' ? 0.02 + 0.23 * rng.next() : 0.02;
  const lapse = 0.02;
  const medianMs = d.task === 'pick' ? 250 + 400 * rng.next() : 900 + 2100 * rng.next();
  return plan.trials.map((t): JudgedTrial => {
    const responseMs = Math.round(medianMs * Math.exp(0.35 * rng.normal()));
    if (t.kind === 'attention') return { kind: 'attention', answer: 0, responseMs };
    const p = t.discount > 0 ? guess + (1 - guess - lapse) / (1 + Math.exp(-3 * (Math.log(t.discount) - lnAlpha))) : guess;
    const answer = rng.next() < p ? 1 : 0;
    return { kind: t.kind, answer, responseMs, lowerSide: t.lowerSide };
  });
}

describe('default exclusion rules on 100 simulated honest respondents per task', () => {
  for (const task of ['spot', 'pick', 'trip'] as const) {
    it(`${task}: none of 100 honest respondents is excluded`, () => {
      const d = design(task);
      const rng = createRng(`honest-${task}`);
      const excluded: string[] = [];
      for (let i = 0; i < 100; i++) {
        const q = qualityOf(task, honestRespondent(d, 1000 + i, rng), true);
        expect(q.testTrials).toBe(trialsPerRespondent(d).test);
        const broken = brokenRules(q, DEFAULT_EXCLUSION_RULES);
        if (broken.length) excluded.push(`${i}: ${broken.join(', ')}`);
      }
      expect(excluded).toEqual([]);
    });
  }
});

describe('pick the lower price has no catch trials', () => {
  it('the schema forces catchShare 0, also for an older stored pick design', () => {
    const stored = { ...newStudyDefaults(1), name: 'Old pick', itemName: 'Tea', category: 'Drinks', task: 'pick', catchShare: 0.1 };
    expect(studyDesignSchema.parse(stored).catchShare).toBe(0);
    expect(studyDesignSchema.parse({ ...stored, task: 'spot' }).catchShare).toBe(0.1);
  });
  it('the trial plan never draws catch trials for pick, even from an unnormalised design', () => {
    const raw = { ...design('pick'), catchShare: 0.2 };
    expect(trialsPerRespondent(raw).catch).toBe(0);
    const plan = generatePlan(raw, 7) as FixedPlan;
    expect(plan.trials.filter((t) => t.kind === 'catch')).toHaveLength(0);
    expect(generatePlan({ ...design('spot'), catchShare: 0.2 }, 7).mode).toBe('fixed');
    expect((generatePlan({ ...design('spot'), catchShare: 0.2 }, 7) as FixedPlan).trials.some((t) => t.kind === 'catch')).toBe(true);
  });
});

describe('each rule only where its task gives it meaning', () => {
  const base = { catchTrials: 10, catchYes: 10, testTrials: 80, testYes: 80, medianMs: 250, attentionPassed: false, leftChosen: 80, rightChosen: 0 };
  it('spot: every rule can exclude', () => {
    expect(brokenRules({ ...base, task: 'spot' }, DEFAULT_EXCLUSION_RULES)).toEqual(['attention', 'falseAlarms', 'speeders', 'straightLining']);
  });
  it('pick: no false-alarm or speed rule; straight-lining is the same side every time', () => {
    expect(brokenRules({ ...base, task: 'pick' }, DEFAULT_EXCLUSION_RULES)).toEqual(['attention', 'straightLining']);
    // all answers "lower chosen" on both sides is a good shopper, not straight-lining
    expect(brokenRules({ ...base, task: 'pick', attentionPassed: true, leftChosen: 40, rightChosen: 40 }, DEFAULT_EXCLUSION_RULES)).toEqual([]);
    // imports carry no sides: nothing to judge
    expect(brokenRules({ ...base, task: 'pick', attentionPassed: true, leftChosen: null, rightChosen: null }, DEFAULT_EXCLUSION_RULES)).toEqual([]);
  });
  it('trip: only the attention check and speed', () => {
    expect(brokenRules({ ...base, task: 'trip' }, DEFAULT_EXCLUSION_RULES)).toEqual(['attention', 'speeders']);
    expect(ruleApplies('straightLining', 'trip')).toBe(false);
  });
  it('export headers leave out rules without meaning for the task', () => {
    expect(describeRules(DEFAULT_EXCLUSION_RULES, 'pick').join(' ')).not.toMatch(/false alarm|response time/);
    expect(describeRules(DEFAULT_EXCLUSION_RULES, 'pick').join(' ')).toMatch(/same side/);
    expect(describeRules(DEFAULT_EXCLUSION_RULES, 'spot')).toHaveLength(4);
  });
});

describe('false alarms: excluded only when clearly above the limit', () => {
  it('the exact binomial tail matches hand values', () => {
    expect(binomialUpperTail(9, 10, 0.5)).toBeCloseTo(11 / 1024, 12);
    expect(binomialUpperTail(0, 10, 0.5)).toBe(1);
    expect(binomialUpperTail(2, 2, 0.5)).toBeCloseTo(0.25, 12);
  });
  it('a few false alarms on few catch trials keep the respondent; many on many exclude', () => {
    expect(falseAlarmsAboveLimit(2, 2, 0.5)).toBe(false);
    expect(falseAlarmsAboveLimit(6, 10, 0.5)).toBe(false);
    expect(falseAlarmsAboveLimit(8, 10, 0.5)).toBe(false); // P = 0.055
    expect(falseAlarmsAboveLimit(9, 10, 0.5)).toBe(true); // P = 0.011
    expect(falseAlarmsAboveLimit(5, 10, 0.5)).toBe(false);
  });
  it('a yes-sayer on a spot study is caught by two rules', () => {
    const d = design('spot');
    const plan = generatePlan(d, 5) as FixedPlan;
    const trials = plan.trials.map((t): JudgedTrial => ({ kind: t.kind, answer: 1, responseMs: 1200 }));
    expect(brokenRules(qualityOf('spot', trials, true), DEFAULT_EXCLUSION_RULES)).toEqual(['falseAlarms', 'straightLining']);
  });
  it('an always-left tapper on a pick study is caught', () => {
    const plan = generatePlan(design('pick'), 5) as FixedPlan;
    const trials = plan.trials.map((t): JudgedTrial => ({ kind: t.kind, answer: t.lowerSide === 'left' ? 1 : 0, responseMs: 300, lowerSide: t.lowerSide }));
    expect(brokenRules(qualityOf('pick', trials, true), DEFAULT_EXCLUSION_RULES)).toEqual(['straightLining']);
  });
});
