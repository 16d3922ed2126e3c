import { DEFAULT_CONSENT, DESIGN_DEFAULTS, type StudyDesignInput } from '@/lib/schemas/study.schema';

// A new study's starting point in the builder. The values a left-out field takes are the
// schema's own (DESIGN_DEFAULTS, which readDesign fills into older stored designs too); the
// rest are the builder's first suggestions for the choices every study must make.

/** A random seed for the trial order (crypto-quality is not needed, only a fresh number). */
export const randomSeed = () => Math.floor(Math.random() * 2_147_483_647);

/**
 * A plain spot-the-saving design on three base prices and an eight-rung ladder; the numbers
 * are our working defaults (common practice, no source). Prices are shown to the exact cent,
 * and the base prices are ones where every rung shows within a tenth of its depth (at 2.49 a
 * 1 % rung could only show 0.80 % or 1.20 %; at 2.99 it shows 1.00 %): lib/promo/ladder-check.ts.
 */
export function newStudyDefaults(seed: number): StudyDesignInput {
  return {
    ...DESIGN_DEFAULTS,
    name: '',
    itemName: '',
    category: '',
    currency: 'EUR',
    task: 'spot',
    basePrices: ['2.99', '9.99', '49'],
    ladder: [0.01, 0.02, 0.03, 0.05, 0.08, 0.12, 0.18, 0.25],
    repetitions: 4,
    catchShare: 0.15,
    practiceTrials: 3,
    orderSeed: seed,
    adaptive: { enabled: false, ...DESIGN_DEFAULTS.adaptive },
    consentText: DEFAULT_CONSENT,
    segmentQuestions: [],
    attentionCheck: { enabled: true, ...DESIGN_DEFAULTS.attentionCheck, options: [...DESIGN_DEFAULTS.attentionCheck.options] },
    targetCompletes: 200,
    priceEnding: 'exact',
  };
}
