// Two more closed studies for the demo workspace's threshold record (issue 15), in other
// categories and at other dates than the kitchen study, so the record has something to compare
// on first start. Everything here is INVENTED for the fictional Harbourline chain: designs,
// observers and answers are drawn from model shoppers (scripts/seed/simulate-responses.ts); no
// shopper took part and nothing is a finding about real people. Both ladders use exact cents and
// pass the builder's ladder check (tests/unit/seed-demo-record.test.ts). Idempotent by name.
import type { EntityManager } from '@mikro-orm/postgresql';
import { RespondentLink } from '@/entities/respondent-link';
import { Study } from '@/entities/study';
import { randomToken } from '@/lib/server/platform/tokens';
import { DEFAULT_EXCLUSION_RULES } from '@/lib/schemas/exclusions.schema';
import { studyDesignSchema, type StudyDesign } from '@/lib/schemas/study.schema';
import { DEMO_DESIGN } from './demo-study';
import { insertRespondents, simulateRespondents, type SimParams } from './simulate-responses';

export interface DemoRecordStudy {
  design: StudyDesign;
  sim: SimParams;
  launchedAt: Date;
  closedAt: Date;
  sources: string[];
}

function study(over: Partial<StudyDesign> & Pick<StudyDesign, 'name' | 'itemName' | 'category' | 'task' | 'basePrices' | 'ladder'>): StudyDesign {
  return studyDesignSchema.parse({ ...DEMO_DESIGN, priceEnding: 'exact', segmentQuestions: [], ...over });
}

const drinks = study({
  name: 'Drinks aisle — pick the lower price',
  itemName: 'Harbourline drinks',
  category: 'Groceries — drinks',
  task: 'pick',
  viewMs: 1200,
  basePrices: [0.95, 1.99, 4.99, 9.99, 17.99],
  ladder: [0.03, 0.05, 0.08, 0.12, 0.18, 0.25, 0.35],
  repetitions: 2,
  catchShare: 0,
  orderSeed: 20251004,
  targetCompletes: 90,
});

const household = study({
  name: 'Household cleaning — spot the saving',
  itemName: 'Harbourline household',
  category: 'Household',
  task: 'spot',
  basePrices: [2.49, 5.99, 10.49, 27.9, 49.9],
  ladder: [0.02, 0.04, 0.06, 0.09, 0.13, 0.18, 0.25, 0.35],
  repetitions: 2,
  catchShare: 0.1,
  orderSeed: 20260611,
  targetCompletes: 100,
});

/** Invented observers: drinks noticed late on cheap items (slope 0.6); household close to Weber's law (0.9). */
export const DEMO_RECORD_STUDIES: DemoRecordStudy[] = [
  {
    design: drinks,
    sim: {
      basePrices: drinks.basePrices, ladder: drinks.ladder, repetitions: drinks.repetitions, catchPerRespondent: 0, respondents: 90,
      refFraction: 0.11, refPrice: 4.99, weberSlope: 0.6, beta: 2.4, lapse: 0.02, guess: 0.5, alphaSd: 0.3,
      careless: { inattentive: 3, speeders: 2, straightLiners: 1 }, seed: 'harbourline-drinks-demo',
    },
    launchedAt: new Date('2025-09-22T08:00:00Z'),
    closedAt: new Date('2025-10-06T17:00:00Z'),
    sources: ['Loyalty app'],
  },
  {
    design: household,
    sim: {
      basePrices: household.basePrices, ladder: household.ladder, repetitions: household.repetitions, catchPerRespondent: 8, respondents: 100,
      refFraction: 0.09, refPrice: 5.99, weberSlope: 0.9, beta: 2.6, lapse: 0.02, guess: 0.07, alphaSd: 0.25,
      careless: { inattentive: 3, speeders: 2, straightLiners: 2 }, seed: 'harbourline-household-demo',
    },
    launchedAt: new Date('2026-06-01T08:00:00Z'),
    closedAt: new Date('2026-06-19T17:00:00Z'),
    sources: ['Newsletter', 'Store QR'],
  },
];

export async function seedDemoRecordStudies(db: EntityManager, workspaceId: string) {
  const out: { id: string; created: boolean }[] = [];
  for (const s of DEMO_RECORD_STUDIES) {
    const existing = await db.findOne(Study, { workspace: workspaceId, name: s.design.name }, { fields: ['id'] });
    if (existing) { out.push({ id: existing.id, created: false }); continue; }
    const id = await db.transactional(async (tx) => {
      const study = tx.create(Study, {
        workspace: workspaceId, name: s.design.name, state: 'closed', design: s.design, exclusionRules: DEFAULT_EXCLUSION_RULES,
        dataVersion: 1, createdAt: s.launchedAt, updatedAt: s.closedAt, launchedAt: s.launchedAt, closedAt: s.closedAt, retentionDays: 365,
      });
      const links = s.sources.map((source) => tx.create(RespondentLink, {
        workspace: workspaceId, study, token: randomToken(), source, quota: null, acceptsPid: false, closedAt: s.closedAt, createdAt: s.launchedAt,
      }));
      await tx.flush();
      await insertRespondents(tx, { workspaceId, studyId: study.id, respondents: simulateRespondents(s.sim), linkIds: links.map((l) => l.id), startedAt: s.launchedAt });
      return study.id;
    });
    out.push({ id, created: true });
  }
  return out;
}
