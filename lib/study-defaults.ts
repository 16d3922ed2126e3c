import { DEFAULT_CONSENT, type StudyDesignInput } from '@/lib/schemas/study.schema';

/** A random seed for the trial order (crypto-quality is not needed, only a fresh number). */
export const randomSeed = () => Math.floor(Math.random() * 2_147_483_647);

/**
 * What a new study starts from: a plain spot-the-saving design on three base prices and an
 * eight-rung ladder; numbers are our working defaults (common practice, no source).
 */
export function newStudyDefaults(seed: number): StudyDesignInput {
  return {
    name: '',
    itemName: '',
    itemPictureId: null,
    category: '',
    currency: 'EUR',
    locale: 'en-GB',
    task: 'spot',
    shelfSize: 6,
    viewMs: 1200,
    tripMinutes: 20,
    basePrices: ['2.49', '9.99', '49'],
    ladder: [0.01, 0.02, 0.03, 0.05, 0.08, 0.12, 0.18, 0.25],
    repetitions: 4,
    catchShare: 0.15,
    practiceTrials: 3,
    orderSeed: seed,
    adaptive: { enabled: false, rule: '1u2d', trialsPerBase: 24, reversals: 8 },
    consentText: DEFAULT_CONSENT,
    segmentQuestions: [],
    attentionCheck: { enabled: true, question: 'To show you are reading carefully, choose “Often”.', options: ['Never', 'Sometimes', 'Often', 'Always'], correct: 'Often' },
    targetCompletes: 200,
    redirectUrl: '',
    priceEnding: 'ends-99',
  };
}
