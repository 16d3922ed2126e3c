import type { ExclusionRuleId, ExclusionRules } from '@/lib/schemas/exclusions.schema';

/** What the rules need to know about one respondent, computed from their trials. */
export interface RespondentQuality {
  catchTrials: number;
  catchYes: number;
  testTrials: number;
  testYes: number;
  /** Median response time over test and catch trials, ms; null with no such trials. */
  medianMs: number | null;
  attentionPassed: boolean | null;
}

export const RULE_ORDER: ExclusionRuleId[] = ['attention', 'falseAlarms', 'speeders', 'straightLining'];

/**
 * The rules a respondent breaks, in a fixed order (the first one is what "excluded by" names in
 * exports). A rule with nothing to judge (no catch trials, no attention check) never excludes.
 */
export function brokenRules(q: RespondentQuality, rules: ExclusionRules): ExclusionRuleId[] {
  const out: ExclusionRuleId[] = [];
  for (const id of RULE_ORDER) {
    if (!rules[id].enabled) continue;
    if (id === 'attention' && q.attentionPassed === false) out.push(id);
    if (id === 'falseAlarms' && q.catchTrials > 0 && q.catchYes / q.catchTrials > rules.falseAlarms.maxRate) out.push(id);
    if (id === 'speeders' && q.medianMs !== null && q.medianMs < rules.speeders.minMedianMs) out.push(id);
    if (id === 'straightLining' && q.testTrials >= 2 && (q.testYes === 0 || q.testYes === q.testTrials)) out.push(id);
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
