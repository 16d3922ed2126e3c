import { z } from 'zod';
import type { Task } from '@/lib/psychometrics/types';

// Data-quality exclusion rules: one schema for the results page form, the route handler that
// saves them into Study.exclusionRules, the analysis cache key and every export header.

export const exclusionRulesSchema = z.object({
  /** Spot the saving: exclude respondents whose false alarms on catch trials are clearly above this share (lib/exclusions.ts). */
  falseAlarms: z.object({
    enabled: z.boolean(),
    maxRate: z.coerce.number({ error: 'Enter a share.' }).min(0.05, 'At least 5 %.').max(1, 'At most 100 %.'),
  }),
  /** Exclude respondents who failed the attention check. */
  attention: z.object({ enabled: z.boolean() }),
  /** Exclude respondents whose median response time is below this many milliseconds. */
  speeders: z.object({
    enabled: z.boolean(),
    minMedianMs: z.coerce.number({ error: 'Enter milliseconds.' }).int('Whole milliseconds.').min(100, 'At least 100 ms.').max(10_000, 'At most 10,000 ms.'),
  }),
  /** Exclude respondents who gave the same answer (pick: tapped the same side) on every test trial. */
  straightLining: z.object({ enabled: z.boolean() }),
});

export type ExclusionRules = z.infer<typeof exclusionRulesSchema>;
export type ExclusionRuleId = keyof ExclusionRules;

/**
 * Defaults for a study whose rules were never saved. The thresholds are our own working
 * choices (common practice, no source): a respondent who "notices" a saving on more than half
 * of the screens that had none is guessing; a median under 400 ms is faster than reading a price.
 */
export const DEFAULT_EXCLUSION_RULES: ExclusionRules = {
  falseAlarms: { enabled: true, maxRate: 0.5 },
  attention: { enabled: true },
  speeders: { enabled: true, minMedianMs: 400 },
  straightLining: { enabled: true },
};

export const EXCLUSION_RULE_LABELS: Record<ExclusionRuleId, string> = {
  falseAlarms: 'Catch-trial false alarms clearly above the limit',
  attention: 'Failed the attention check',
  speeders: 'Median response time under the limit',
  straightLining: 'Same answer on every trial',
};

/** Stored rules (possibly null or from an older shape) → valid rules, falling back to defaults. */
export function rulesOrDefault(stored: unknown): ExclusionRules {
  const parsed = exclusionRulesSchema.safeParse(stored);
  return parsed.success ? parsed.data : DEFAULT_EXCLUSION_RULES;
}

/** The tasks on which each rule has meaning (why, per rule: lib/exclusions.ts). */
export const RULE_TASKS: Record<ExclusionRuleId, readonly Task[]> = {
  attention: ['spot', 'pick', 'trip'],
  falseAlarms: ['spot'],
  speeders: ['spot', 'trip'],
  straightLining: ['spot', 'pick'],
};

/**
 * A one-line description of each rule in force, for export headers and the printed report.
 * With the study's task, rules without meaning for it are left out (they never exclude there).
 */
export function describeRules(r: ExclusionRules, task?: Task): string[] {
  const on = (id: keyof ExclusionRules) => r[id].enabled && (!task || RULE_TASKS[id].includes(task));
  const out: string[] = [];
  if (on('falseAlarms')) out.push(`excluded: false alarms on catch trials clearly above ${Math.round(r.falseAlarms.maxRate * 100)} % (one-sided exact binomial test at 5 %)`);
  if (on('attention')) out.push('excluded: failed the attention check');
  if (on('speeders')) out.push(`excluded: median response time under ${r.speeders.minMedianMs} ms`);
  if (on('straightLining')) out.push(task === 'pick' ? 'excluded: tapped the same side on every test trial' : 'excluded: the same answer on every test trial');
  return out.length ? out : ['no exclusion rules in force'];
}
