import { describe, expect, it } from 'vitest';
import { DESIGN_DEFAULTS, StoredDesignError, readDesign, studyDesignSchema } from '@/lib/schemas/study.schema';
import { newStudyDefaults } from '@/lib/study-defaults';
import { STUDY_STATES, STUDY_STATE_LABELS } from '@/lib/study-states';
import { Study } from '@/entities/study';
import { DEMO_DESIGN } from '@/scripts/seed/demo-study';
import { validDesign } from '../support/study-fixtures';

// readDesign is the one way a stored design is read (entity column, respondent link, analysis):
// these checks protect its three promises — defaults filled, damage refused by field, and every
// shape we have ever stored (builder, demo seed, import) still read.

/** A design as stored before the fields with defaults were written out: none of them present. */
function legacyDesign(): Record<string, unknown> {
  const d: Record<string, unknown> = { ...validDesign(), basePrices: ['49', '2.49', '9.99'], repetitions: '3' };
  for (const key of ['itemPictureId', 'locale', 'shelfSize', 'viewMs', 'tripMinutes', 'redirectUrl']) delete d[key];
  d.adaptive = { enabled: false };
  d.attentionCheck = { enabled: false };
  return d;
}

const issuesOf = (raw: unknown, state?: string) => {
  try {
    readDesign(raw, state);
  } catch (err) {
    if (err instanceof StoredDesignError) return err.issues;
    throw err;
  }
  throw new Error('the design was read although it is not valid');
};

describe('readDesign', () => {
  it('fills every default of a design stored without them, and sorts prices and rungs', () => {
    const d = readDesign(legacyDesign(), 'closed');
    expect(d).toMatchObject({
      itemPictureId: DESIGN_DEFAULTS.itemPictureId, locale: DESIGN_DEFAULTS.locale, shelfSize: DESIGN_DEFAULTS.shelfSize,
      viewMs: DESIGN_DEFAULTS.viewMs, tripMinutes: DESIGN_DEFAULTS.tripMinutes, redirectUrl: DESIGN_DEFAULTS.redirectUrl,
      adaptive: { enabled: false, ...DESIGN_DEFAULTS.adaptive },
      attentionCheck: { enabled: false, ...DESIGN_DEFAULTS.attentionCheck },
    });
    expect(d.basePrices).toEqual([2.49, 9.99, 49]);
    expect(d.repetitions).toBe(3);
  });

  it('reads the demo seed design exactly as stored (a JSON round trip through the jsonb column)', () => {
    expect(readDesign(JSON.parse(JSON.stringify(DEMO_DESIGN)), 'closed')).toEqual(DEMO_DESIGN);
  });

  it('refuses a damaged design, naming each bad field by its path', () => {
    const bad = { ...validDesign(), task: 'guess', basePrices: [9.99, -1], attentionCheck: { enabled: true, options: ['A', 'B'], correct: 'C' } };
    const paths = issuesOf(bad, 'live').map((i) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['task', 'basePrices.1', 'attentionCheck.correct']));
    expect(() => readDesign(bad, 'live')).toThrow(/stored study design is not valid: .*task/);
    expect(issuesOf(null).map((i) => i.path)).toEqual(['']);
  });

  it('reads an imported study with what its file held, but holds a launched study to the builder’s limits', () => {
    const imported = {
      ...validDesign(), ladder: [0.05], basePrices: Array.from({ length: 14 }, (_, i) => i + 1),
      segmentQuestions: Array.from({ length: 7 }, (_, i) => ({ id: `q${i}`, text: 'hh', options: ['only'] })), targetCompletes: 250_000,
    };
    for (const state of ['imported', 'draft']) expect(readDesign(imported, state).segmentQuestions).toHaveLength(7);
    const paths = issuesOf(imported, 'closed').map((i) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['ladder', 'basePrices', 'segmentQuestions', 'targetCompletes']));
    // Types and ranges still bind an import: a depth of 100 % is refused there too.
    expect(issuesOf({ ...imported, ladder: [1] }, 'imported').map((i) => i.path)).toContain('ladder.0');
  });

  it('a new study starts from the same defaults that a stored design is filled with', () => {
    const fresh = studyDesignSchema.parse(validDesign());
    const seed = newStudyDefaults(7);
    for (const key of ['itemPictureId', 'locale', 'shelfSize', 'viewMs', 'tripMinutes', 'redirectUrl'] as const) expect(seed[key]).toEqual(DESIGN_DEFAULTS[key]);
    expect(readDesign(fresh)).toEqual(fresh);
  });
});

describe('study states', () => {
  it('the Study entity’s state column allows exactly the one list of states, each with a label', () => {
    const items = (Study.meta.properties.state as { items?: readonly string[] }).items;
    expect(items).toEqual([...STUDY_STATES]);
    expect(Object.keys(STUDY_STATE_LABELS).sort()).toEqual([...STUDY_STATES].sort());
  });
});
