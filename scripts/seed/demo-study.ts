// The demo workspace's closed study with SIMULATED responses. Every parameter below is
// invented for the fictional Harbourline scenario and every answer is drawn from a model
// observer (scripts/seed/simulate-responses.ts): no shopper took part, nothing here is a
// finding about real people. Idempotent: a study with this name in the demo workspace is kept.
import type { EntityManager } from '@mikro-orm/postgresql';
import { RespondentLink } from '@/entities/respondent-link';
import { Study } from '@/entities/study';
import { randomToken } from '@/lib/server/platform/tokens';
import { DEFAULT_CONSENT, studyDesignSchema } from '@/lib/schemas/study.schema';
import { DEFAULT_EXCLUSION_RULES } from '@/lib/schemas/exclusions.schema';
import { insertRespondents, simulateRespondents, type SimParams } from './simulate-responses';

export const DEMO_STUDY_NAME = 'Kitchen & home — notice thresholds';

export const DEMO_DESIGN = studyDesignSchema.parse({
  name: DEMO_STUDY_NAME,
  itemName: 'Harbourline Home kitchenware',
  itemPictureId: null,
  category: 'Kitchen & home',
  currency: 'EUR',
  locale: 'en-IE',
  task: 'spot',
  shelfSize: 6,
  viewMs: 1200,
  tripMinutes: 20,
  basePrices: [3.49, 12.99, 39, 129, 449],
  // No 1 % rung: at €3.49 cents can only show it as 0.86 % off (the builder's ladder check, tests/unit/seed-ladders.test.ts).
  ladder: [0.02, 0.03, 0.05, 0.08, 0.12, 0.18, 0.25],
  repetitions: 2,
  catchShare: 0.1,
  practiceTrials: 2,
  orderSeed: 20260301,
  adaptive: { enabled: false, rule: '1u2d', trialsPerBase: 24, reversals: 8 },
  consentText: DEFAULT_CONSENT,
  contact: 'Harbourline Home pricing research (fictional), privacy@harbourline.example — quote your reference code to have your answers deleted.',
  segmentQuestions: [{ id: 'shop_often', text: 'How often do you shop this category?', options: ['Every month', 'A few times a year', 'Rarely'] }],
  attentionCheck: { enabled: true, question: 'To show you are reading carefully, choose “Often”.', options: ['Never', 'Sometimes', 'Often', 'Always'], correct: 'Often' },
  targetCompletes: 120,
  redirectUrl: '',
  priceEnding: 'ends-99',
});

/** Invented observer: Weber slope 0.8 (a smaller fraction on dearer items), lapse 2 %. */
export const DEMO_SIM: SimParams = {
  basePrices: DEMO_DESIGN.basePrices,
  ladder: DEMO_DESIGN.ladder,
  repetitions: DEMO_DESIGN.repetitions,
  catchPerRespondent: 9,
  respondents: 120,
  refFraction: 0.07,
  refPrice: 39,
  weberSlope: 0.8,
  beta: 2.6,
  lapse: 0.02,
  guess: 0.08,
  alphaSd: 0.2,
  segment: {
    questionId: 'shop_often',
    answers: [
      { answer: 'Every month', share: 0.35, alphaShift: -0.12 },
      { answer: 'A few times a year', share: 0.45, alphaShift: 0 },
      { answer: 'Rarely', share: 0.2, alphaShift: 0.18 },
    ],
  },
  careless: { inattentive: 4, speeders: 3, straightLiners: 3 },
  seed: 'harbourline-kitchen-demo',
  priceEnding: DEMO_DESIGN.priceEnding,
  currency: DEMO_DESIGN.currency,
};

export async function seedDemoStudy(db: EntityManager, workspaceId: string) {
  const existing = await db.findOne(Study, { workspace: workspaceId, name: DEMO_STUDY_NAME }, { fields: ['id'] });
  if (existing) return { id: existing.id, created: false };
  const closedAt = new Date('2026-03-20T17:00:00Z');
  const launchedAt = new Date('2026-03-02T08:00:00Z');
  const id = await db.transactional(async (tx) => {
    const study = tx.create(Study, {
      workspace: workspaceId, name: DEMO_STUDY_NAME, state: 'closed', design: DEMO_DESIGN, exclusionRules: DEFAULT_EXCLUSION_RULES,
      dataVersion: 1, createdAt: launchedAt, updatedAt: closedAt, launchedAt, closedAt, retentionDays: 365,
    });
    const links = ['Newsletter', 'Store QR'].map((source) => tx.create(RespondentLink, {
      workspace: workspaceId, study, token: randomToken(), source, quota: null, acceptsPid: false, closedAt, createdAt: launchedAt,
    }));
    await tx.flush();
    await insertRespondents(tx, { workspaceId, studyId: study.id, respondents: simulateRespondents(DEMO_SIM), linkIds: links.map((l) => l.id), startedAt: launchedAt });
    return study.id;
  });
  return { id, created: true };
}
