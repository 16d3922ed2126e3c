import { z } from 'zod';
import type { Task } from '@/lib/psychometrics/types';
import { STUDY_ACTIONS } from '@/lib/study-states';

// The study design: one schema for the builder form, the server actions and route handlers,
// and the respondent flow. Stored as Study.design (jsonb) and frozen once a study goes live.
// Every read of a stored design goes through `readDesign` below, so a design is validated on
// save and on read alike, and a field added later reads with its default in older rows.

export const TASKS = ['spot', 'pick', 'trip'] as const satisfies readonly Task[];
export const TASK_LABELS: Record<Task, string> = {
  spot: 'Spot the saving',
  pick: 'Pick the lower price',
  trip: 'Worth the trip',
};

export const PRICE_ENDINGS = ['exact', 'ends-99', 'ends-49', 'whole'] as const;
export const PRICE_ENDING_LABELS: Record<(typeof PRICE_ENDINGS)[number], string> = {
  exact: 'Exact (to the cent)',
  'ends-99': 'Ends in .99',
  'ends-49': 'Ends in .49',
  whole: 'Whole units',
};

export const CURRENCIES = ['EUR', 'USD', 'GBP', 'CHF', 'SEK', 'NOK', 'DKK', 'PLN', 'CZK', 'CAD', 'AUD', 'NZD', 'JPY'] as const;
export const LOCALES = ['en-GB', 'en-US', 'en-IE', 'de-DE', 'fr-FR', 'nl-NL', 'es-ES', 'it-IT', 'sv-SE', 'da-DK', 'nb-NO', 'pl-PL', 'cs-CZ', 'ja-JP'] as const;

/** The respondents' language: every fixed respondent string comes from its catalogue (respondent/messages). */
export const LANGUAGES = ['en', 'de', 'fr', 'es', 'nl'] as const;
export type Language = (typeof LANGUAGES)[number];
export const LANGUAGE_LABELS: Record<Language, string> = { en: 'English', de: 'German (Deutsch)', fr: 'French (français)', es: 'Spanish (español)', nl: 'Dutch (Nederlands)' };
/** The price format the builder suggests with a language (the analyst may pick another locale). */
export const LANGUAGE_LOCALES: Record<Language, (typeof LOCALES)[number]> = { en: 'en-GB', de: 'de-DE', fr: 'fr-FR', es: 'es-ES', nl: 'nl-NL' };

export const STAIRCASE_RULES = ['1u2d', '1u3d'] as const;
export const STAIRCASE_RULE_LABELS: Record<(typeof STAIRCASE_RULES)[number], string> = {
  '1u2d': '1 up / 2 down (converges on 70.7 % noticed)',
  '1u3d': '1 up / 3 down (converges on 79.4 % noticed)',
};

export const MAX_SEGMENT_QUESTIONS = 5;

export const DEFAULT_CONSENT =
  'This short survey is part of price research by a retailer. You will see prices and answer a few quick questions; ' +
  'there are no right or wrong answers. It takes a few minutes. We do not ask for your name or e-mail address, ' +
  'and your answers are stored under a random number. Taking part is voluntary and you may stop at any time; ' +
  'answers given until then may be kept for the research unless you ask for them to be deleted.';

/**
 * What a left-out field becomes: the builder's starting values and what an older stored design
 * reads as. The schema's `.default()`s and lib/study-defaults.ts both take them from here.
 */
export const DESIGN_DEFAULTS = {
  itemPictureId: null,
  locale: 'en-GB',
  language: 'en',
  shelfSize: 6,
  viewMs: 1200,
  tripMinutes: 20,
  adaptive: { rule: '1u2d', trialsPerBase: 24, reversals: 8 },
  attentionCheck: { question: 'To show you are reading carefully, choose “Often”.', options: ['Never', 'Sometimes', 'Often', 'Always'], correct: 'Often' },
  redirectUrl: '',
  contact: '',
} as const;

const money = z.coerce.number({ error: 'Enter a price.' }).finite('Enter a price.').gt(0, 'Prices must be above zero.').max(1_000_000, 'At most 1,000,000.');
const depth = z.coerce.number({ error: 'Enter a depth.' }).finite().gt(0, 'Depths must be above 0 %.').lt(1, 'Depths must be below 100 %.');

const uniqueSorted = (values: number[]) => new Set(values.map((v) => v.toFixed(6))).size === values.length;

export const segmentQuestionSchema = z.object({
  id: z.string().regex(/^[a-z0-9_]{1,32}$/, 'Use lower-case letters, digits and _ (up to 32).'),
  text: z.string().trim().min(3, 'Write the question.').max(200, 'At most 200 characters.'),
  options: z
    .array(z.string().trim().min(1, 'An answer cannot be empty.').max(80, 'At most 80 characters.'))
    .min(2, 'Give at least two answers.')
    .max(8, 'At most eight answers.')
    .refine((o) => new Set(o).size === o.length, 'Each answer only once.'),
});
export type SegmentQuestion = z.infer<typeof segmentQuestionSchema>;

export const attentionCheckSchema = z
  .object({
    enabled: z.boolean(),
    question: z.string().trim().max(200).default(DESIGN_DEFAULTS.attentionCheck.question),
    options: z.array(z.string().trim().min(1).max(80)).min(2).max(6).default([...DESIGN_DEFAULTS.attentionCheck.options]),
    correct: z.string().trim().default(DESIGN_DEFAULTS.attentionCheck.correct),
  })
  .refine((a) => !a.enabled || a.options.includes(a.correct), { message: 'The right answer must be one of the answers.', path: ['correct'] });

export const adaptiveSchema = z.object({
  enabled: z.boolean(),
  rule: z.enum(STAIRCASE_RULES).default(DESIGN_DEFAULTS.adaptive.rule),
  /** Trials per base price when adaptive (the staircase stops earlier when its reversals are reached). */
  trialsPerBase: z.coerce.number().int().min(8, 'At least 8.').max(80, 'At most 80.').default(DESIGN_DEFAULTS.adaptive.trialsPerBase),
  reversals: z.coerce.number().int().min(4).max(20).default(DESIGN_DEFAULTS.adaptive.reversals),
});

const designFields = z.object({
  name: z.string().trim().min(3, 'Name the study (at least 3 characters).').max(160, 'At most 160 characters.'),
  itemName: z.string().trim().min(2, 'Name the item shown to respondents.').max(80, 'At most 80 characters.'),
  /** StudyAsset id of the uploaded picture, if any. */
  itemPictureId: z.uuid().nullable().default(DESIGN_DEFAULTS.itemPictureId),
  category: z.string().trim().min(2, 'Give the item category.').max(80, 'At most 80 characters.'),
  currency: z.enum(CURRENCIES),
  locale: z.enum(LOCALES).default(DESIGN_DEFAULTS.locale),
  /** The respondents' language; designs saved before it existed read as English. */
  language: z.enum(LANGUAGES).default(DESIGN_DEFAULTS.language),
  task: z.enum(TASKS),
  /** Spot the saving: items on the remembered shelf. */
  shelfSize: z.coerce.number().int().min(3, 'At least 3 items.').max(12, 'At most 12 items.').default(DESIGN_DEFAULTS.shelfSize),
  /** Pick the lower price: how long the two tags stay visible. */
  viewMs: z.coerce.number().int().min(300, 'At least 300 ms.').max(5000, 'At most 5,000 ms.').default(DESIGN_DEFAULTS.viewMs),
  /** Worth the trip: minutes of extra effort for the discounted offer. */
  tripMinutes: z.coerce.number().int().min(1, 'At least 1 minute.').max(120, 'At most 120 minutes.').default(DESIGN_DEFAULTS.tripMinutes),
  basePrices: z
    .array(money)
    .min(1, 'Give at least one base price.')
    .max(12, 'At most 12 base prices.')
    .refine(uniqueSorted, 'Each base price only once.'),
  ladder: z
    .array(depth)
    .min(2, 'The ladder needs at least two rungs.')
    .max(20, 'At most 20 rungs.')
    .refine(uniqueSorted, 'Each rung only once.'),
  repetitions: z.coerce.number().int().min(1, 'At least once.').max(20, 'At most 20.'),
  /** Share of all trials that are catch trials (no discount); always 0 for "pick the lower price" (see normalise). */
  catchShare: z.coerce.number().min(0, 'At least 0 %.').max(0.5, 'At most 50 %.'),
  practiceTrials: z.coerce.number().int().min(0).max(10, 'At most 10.'),
  orderSeed: z.coerce.number().int().min(0).max(2_147_483_647),
  adaptive: adaptiveSchema,
  consentText: z.string().trim().min(40, 'Write a consent text of at least 40 characters.').max(4000, 'At most 4,000 characters.'),
  /** Who runs this study and how respondents reach them; shown with the consent text; required to launch (lib/server/studies/lifecycle.ts). */
  contact: z.string().trim().max(300, 'At most 300 characters.').default(DESIGN_DEFAULTS.contact),
  segmentQuestions: z
    .array(segmentQuestionSchema)
    .max(MAX_SEGMENT_QUESTIONS, `At most ${MAX_SEGMENT_QUESTIONS} segment questions.`)
    .refine((qs) => new Set(qs.map((q) => q.id)).size === qs.length, 'Each question needs its own id.'),
  attentionCheck: attentionCheckSchema,
  targetCompletes: z.coerce.number().int().min(1, 'At least 1.').max(100_000, 'At most 100,000.'),
  redirectUrl: z.union([z.literal(''), z.url('Enter a full URL starting with https://').refine((u) => /^https?:\/\//.test(u), 'Use an http(s) URL.')]).default(DESIGN_DEFAULTS.redirectUrl),
  priceEnding: z.enum(PRICE_ENDINGS),
});

/**
 * Sorted prices and rungs; and "Pick the lower price" never has catch trials: both tags would
 * show the same price, so the tap carries no information (the guess rate is 1/2 by design).
 * Forced here so saved designs and older stored pick designs read alike (catchShare 0).
 */
const normalise = <D extends { basePrices: number[]; ladder: number[]; task: string; catchShare: number }>(d: D): D => ({
  ...d,
  basePrices: [...d.basePrices].sort((a, b) => a - b),
  ladder: [...d.ladder].sort((a, b) => a - b),
  catchShare: d.task === 'pick' ? 0 : d.catchShare,
});

/** Whether a task uses catch trials at all (the builder offers them only then). */
export const taskHasCatchTrials = (task: string) => task !== 'pick';

/** A design an analyst saves (and launches): every limit of the builder applies. */
export const studyDesignSchema = designFields.transform(normalise);

export type StudyDesignInput = z.input<typeof studyDesignSchema>;
export type StudyDesign = z.output<typeof studyDesignSchema>;

/**
 * A design the builder's limits do not bind (yet): an imported study's records what its file
 * held (any number of base prices, depths — none when the file has only catch trials — and
 * segment columns, answers seen only once), and a draft copied from one keeps that until it is
 * edited. The limits are for studies that run, so saving in the builder and launching check
 * them; the types, ranges and defaults apply here too.
 */
export const importedDesignSchema = designFields
  .extend({
    basePrices: z.array(money).min(1, 'Give at least one base price.').refine(uniqueSorted, 'Each base price only once.'),
    ladder: z.array(depth).refine(uniqueSorted, 'Each rung only once.'),
    segmentQuestions: z.array(segmentQuestionSchema.extend({
      text: z.string().trim().min(1, 'Write the question.').max(200, 'At most 200 characters.'),
      options: z.array(z.string().trim().min(1, 'An answer cannot be empty.').max(80, 'At most 80 characters.')).min(1, 'Give at least one answer.'),
    })),
    targetCompletes: z.coerce.number().int().min(1, 'At least 1.'),
  })
  .transform(normalise);

export interface DesignIssue { path: string; message: string }

/** A stored design that does not read: the data are damaged, or the schema moved past them. */
export class StoredDesignError extends Error {
  constructor(public readonly issues: DesignIssue[]) {
    super(`The stored study design is not valid: ${issues.slice(0, 5).map((i) => `${i.path || '(design)'}: ${i.message}`).join('; ')}`);
    this.name = 'StoredDesignError';
  }
}

/** States whose design passed the builder's limits at launch; drafts and imports may not have. */
const LAUNCHED_STATES: readonly string[] = ['live', 'paused', 'closed'];

/**
 * The one way to read a stored design (entity column or raw row): validated, sorted and with
 * the defaults of fields it lacks filled in. `state` says which limits apply: a study that was
 * launched (or an unknown state) is read with the builder's, a draft or an import with
 * `importedDesignSchema`. Throws StoredDesignError naming each bad field.
 */
export function readDesign(raw: unknown, state?: string): StudyDesign {
  const bound = state === undefined || LAUNCHED_STATES.includes(state);
  const parsed = (bound ? studyDesignSchema : importedDesignSchema).safeParse(raw);
  if (!parsed.success) throw new StoredDesignError(parsed.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message })));
  return parsed.data;
}

/** Geometric spacing between a minimum and maximum depth (fractions), N rungs, rounded to 0.1 %. */
export function geometricLadder(min: number, max: number, rungs: number): number[] {
  if (!(min > 0 && max < 1 && max > min && rungs >= 2)) return [];
  const ratio = Math.pow(max / min, 1 / (rungs - 1));
  const out = Array.from({ length: rungs }, (_, i) => Math.round(min * Math.pow(ratio, i) * 1000) / 1000);
  return [...new Set(out)];
}

/** Trials one respondent answers (practice and attention check included). */
export function trialsPerRespondent(d: Pick<StudyDesign, 'basePrices' | 'ladder' | 'repetitions' | 'catchShare' | 'practiceTrials' | 'adaptive' | 'attentionCheck'> & Partial<Pick<StudyDesign, 'task'>>): {
  test: number;
  catch: number;
  practice: number;
  attention: number;
  total: number;
} {
  const test = d.adaptive.enabled ? d.basePrices.length * d.adaptive.trialsPerBase : d.basePrices.length * d.ladder.length * d.repetitions;
  const catchTrials = d.catchShare > 0 && (d.task === undefined || taskHasCatchTrials(d.task)) ? Math.round((test * d.catchShare) / (1 - d.catchShare)) : 0;
  const attention = d.attentionCheck.enabled ? 1 : 0;
  return { test, catch: catchTrials, practice: d.practiceTrials, attention, total: test + catchTrials + d.practiceTrials + attention };
}

/**
 * Seconds to answer once a trial screen allows it. Pick the lower price is measured: a phone
 * walk-through of 36 trials took about 100 s, 2.8 s a trial, of which 1.9 s is the screen's own
 * get-ready (0.7 s) and viewing time (1.2 s), so about 1 s to tap; the e2e run of the flow
 * (tests/e2e/respondent-phone-flow.test.ts) prints the screen time a scripted respondent spends.
 * Spot and trip are our working estimates (common practice, no source): one tag against a
 * remembered price; a sentence to read and a decision.
 */
const ANSWER_SECONDS = { spot: 2.5, pick: 1, trip: 3.5 } as const;
/** Consent, segment questions and the task's instructions; then reading each practice feedback (working estimates). */
const START_SECONDS = 40;
const FEEDBACK_SECONDS = 5;

/** A respondent's time in seconds: the trials themselves, and everything around them (start, feedback, shelf). */
export function estimatedSeconds(d: StudyDesign): { trials: number; other: number } {
  const t = trialsPerRespondent(d);
  const screen = d.task === 'pick' ? 0.7 + d.viewMs / 1000 : 0; // pick-trial.tsx: READY_MS, then the view
  // Spot the saving shows its shelf (2 s an item) first and again every 12 trials (SPOT_BLOCK in respondent/shared/plan.ts).
  const shelf = d.task === 'spot' ? d.shelfSize * 2 * (1 + Math.floor((t.total - t.practice) / 12)) : 0;
  return { trials: t.total * (screen + (ANSWER_SECONDS[d.task] ?? ANSWER_SECONDS.trip)), other: START_SECONDS + t.practice * FEEDBACK_SECONDS + shelf };
}

/** Estimated minutes for one respondent (estimatedSeconds, rounded; at least 1). */
export function estimatedMinutes(d: StudyDesign): number {
  const s = estimatedSeconds(d);
  return Math.max(1, Math.round((s.trials + s.other) / 60));
}

/** A move between study states (launch, pause, resume, close). */
export const studyStateChangeSchema = z.object({ action: z.enum(STUDY_ACTIONS, { error: 'Use one of: launch, pause, resume, close.' }) });
