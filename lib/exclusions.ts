import type { Task } from '@/lib/psychometrics/types';
import { RULE_TASKS, type ExclusionRuleId, type ExclusionRules } from '@/lib/schemas/exclusions.schema';

// Data-quality exclusion rules, judged per finished respondent. Each rule applies only where its
// task gives it meaning (RULE_TASKS in lib/schemas/exclusions.schema.ts; the reasons in RULE_NOT_FOR say why not elsewhere):
// - attention check: every task (a question with a right answer means the same everywhere);
// - false alarms on catch trials: "Spot the saving" only. There a catch trial shows the regular
//   price and a "lower" answer is a false alarm. "Pick the lower price" has no catch trials (two
//   equal tags carry no information; its guess rate is 1/2 by design), and in "Worth the trip"
//   going for the same price is a preference the fit ignores, not a false alarm;
// - speeders (median response time): spot and trip. In pick the tags stay up for the set
//   viewing time and the time is taken from when they hide, so a quick tap is a shopper who
//   had already decided, not a speeder;
// - straight-lining: spot (always "lower" or always "the same" across a ladder that reaches deep
//   discounts) and pick, judged on the SIDE tapped (always left, or always right, while the lower
//   tag is on each side half of the time). In trip always "stay" (or always "go") is a real
//   preference of some shoppers and excluding them would bias the threshold.
// The false-alarm rule excludes only when the respondent's false-alarm count is clearly above
// the limit: a one-sided exact binomial test at 5 % against the limit rate, so an honest shopper
// with a few catch trials is not thrown out by chance (2 "lower" answers on 2 catch trials say
// little). Tests: tests/unit/exclusions-by-task.test.ts (100 simulated honest respondents per task).

/** What the rules need to know about one respondent, computed from their trials. */
export interface RespondentQuality {
  /** The study's task: which rules have meaning for this respondent. */
  task: Task;
  catchTrials: number;
  catchYes: number;
  testTrials: number;
  testYes: number;
  /** Pick the lower price: test trials on which the left / right tag was tapped; null when sides were not recorded (imports). */
  leftChosen?: number | null;
  rightChosen?: number | null;
  /** Median response time over test and catch trials, ms; null with no such trials. */
  medianMs: number | null;
  attentionPassed: boolean | null;
}

export const RULE_ORDER: ExclusionRuleId[] = ['attention', 'falseAlarms', 'speeders', 'straightLining'];

export { RULE_TASKS };

/** Why a rule does not apply to a task, in words for the exclusions panel and exports. */
export const RULE_NOT_FOR: Record<ExclusionRuleId, Partial<Record<Task, string>>> = {
  attention: {},
  falseAlarms: {
    pick: 'Pick the lower price has no catch trials: two equal tags carry no information, and its guess rate is 1/2 by design.',
    trip: 'In Worth the trip, going for the same price is a preference, not a false alarm; the fit does not use catch trials.',
  },
  speeders: { pick: 'In Pick the lower price the tags stay up for the set viewing time and the time runs from when they hide, so a quick tap is not speeding.' },
  straightLining: { trip: 'In Worth the trip some shoppers never (or always) find the trip worth it; that is a preference, not careless answering.' },
};

export const ruleApplies = (id: ExclusionRuleId, task: Task): boolean => RULE_TASKS[id].includes(task);

/** One-sided significance level of the false-alarm test (common practice, no source). */
export const FALSE_ALARM_ALPHA = 0.05;

/** P(X ≥ k) for X ~ Binomial(n, p), summed in log space (n is at most a few hundred here). */
export function binomialUpperTail(k: number, n: number, p: number): number {
  if (k <= 0) return 1;
  if (k > n) return 0;
  if (p <= 0) return 0;
  if (p >= 1) return 1;
  let logC = 0; // ln C(n, i), built up from i = 0
  let sum = 0;
  for (let i = 0; i <= n; i++) {
    if (i > 0) logC += Math.log((n - i + 1) / i);
    if (i >= k) sum += Math.exp(logC + i * Math.log(p) + (n - i) * Math.log1p(-p));
  }
  return Math.min(1, sum);
}

/** Whether a false-alarm count is clearly (one-sided exact test at FALSE_ALARM_ALPHA) above the limit rate. */
export function falseAlarmsAboveLimit(catchYes: number, catchTrials: number, maxRate: number): boolean {
  if (catchTrials <= 0 || catchYes / catchTrials <= maxRate) return false;
  return binomialUpperTail(catchYes, catchTrials, maxRate) < FALSE_ALARM_ALPHA;
}

function straightLined(q: RespondentQuality): boolean {
  if (q.task === 'pick') {
    const l = q.leftChosen ?? null, r = q.rightChosen ?? null;
    if (l === null || r === null || l + r < 2) return false;
    return l === 0 || r === 0;
  }
  return q.testTrials >= 2 && (q.testYes === 0 || q.testYes === q.testTrials);
}

/**
 * The rules a respondent breaks, in a fixed order (the first one is what "excluded by" names in
 * exports). A rule with nothing to judge (no catch trials, no attention check), or without
 * meaning for the study's task, never excludes.
 */
export function brokenRules(q: RespondentQuality, rules: ExclusionRules): ExclusionRuleId[] {
  const out: ExclusionRuleId[] = [];
  for (const id of RULE_ORDER) {
    if (!rules[id].enabled || !ruleApplies(id, q.task)) continue;
    if (id === 'attention' && q.attentionPassed === false) out.push(id);
    if (id === 'falseAlarms' && falseAlarmsAboveLimit(q.catchYes, q.catchTrials, rules.falseAlarms.maxRate)) out.push(id);
    if (id === 'speeders' && q.medianMs !== null && q.medianMs < rules.speeders.minMedianMs) out.push(id);
    if (id === 'straightLining' && straightLined(q)) out.push(id);
  }
  return out;
}

export interface ExclusionCounts {
  respondents: { before: number; after: number };
  trials: { before: number; after: number };
  /** Respondents broken per rule (a respondent may break several). */
  byRule: Record<ExclusionRuleId, number>;
}

export function emptyCounts(): ExclusionCounts {
  return {
    respondents: { before: 0, after: 0 },
    trials: { before: 0, after: 0 },
    byRule: { attention: 0, falseAlarms: 0, speeders: 0, straightLining: 0 },
  };
}

/** One answered trial as the rules see it (the trial table's columns). */
export interface JudgedTrial {
  kind: 'practice' | 'test' | 'catch' | 'attention';
  answer: number;
  responseMs: number;
  /** Pick the lower price: where the lower tag stood. */
  lowerSide?: 'left' | 'right';
}

/**
 * A respondent's quality figures from their trials: the same sums that respondentRows()
 * (lib/server/analysis/cells.ts) makes in SQL, for simulations and tests.
 */
export function qualityOf(task: Task, trials: readonly JudgedTrial[], attentionPassed: boolean | null): RespondentQuality {
  const q: RespondentQuality = { task, catchTrials: 0, catchYes: 0, testTrials: 0, testYes: 0, medianMs: null, attentionPassed, leftChosen: null, rightChosen: null };
  const times: number[] = [];
  let left = 0, right = 0;
  for (const t of trials) {
    if (t.kind !== 'test' && t.kind !== 'catch') continue;
    if (t.responseMs > 0) times.push(t.responseMs);
    if (t.kind === 'catch') { q.catchTrials++; q.catchYes += t.answer; continue; }
    q.testTrials++; q.testYes += t.answer;
    if (t.lowerSide) { if ((t.lowerSide === 'left') === (t.answer === 1)) left++; else right++; }
  }
  if (left + right > 0) { q.leftChosen = left; q.rightChosen = right; }
  if (times.length) {
    times.sort((a, b) => a - b);
    const m = (times.length - 1) / 2;
    q.medianMs = (times[Math.floor(m)] + times[Math.ceil(m)]) / 2; // percentile_cont(0.5)
  }
  return q;
}
