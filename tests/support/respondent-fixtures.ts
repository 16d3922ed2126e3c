// Live studies with a respondent link, made directly through the data layer for respondent tests.
import { randomBytes } from 'node:crypto';
import { em } from '@/lib/server/db/orm';
import { studyDesignSchema, type StudyDesign, type StudyDesignInput } from '@/lib/schemas/study.schema';
import { Study } from '@/entities/study';
import { RespondentLink } from '@/entities/respondent-link';
import { adjustSeats } from '@/lib/server/billing/seat-ledger';
import { Workspace } from '@/entities/workspace';
import { uid } from './factories';

export function testDesign(over: Partial<StudyDesignInput> = {}): StudyDesign {
  return studyDesignSchema.parse({
    name: 'Olive oil notice test', itemName: 'Olive oil', category: 'Pantry', currency: 'EUR', locale: 'en-IE', task: 'pick',
    basePrices: [2.49, 9.99, 49], ladder: [0.02, 0.05, 0.1, 0.2], repetitions: 1, catchShare: 0.2, practiceTrials: 2, orderSeed: 11,
    adaptive: { enabled: false }, consentText: 'A short price survey. No names or e-mail addresses are stored; answers are kept under a random number.',
    segmentQuestions: [{ id: 'household', text: 'How many people live in your household?', options: ['1', '2', '3 or more'] }],
    attentionCheck: { enabled: true }, targetCompletes: 50, redirectUrl: '', priceEnding: 'exact',
    contact: 'Pricing research, Test Grocers Ltd — research@example.test',
    ...over,
  });
}

export async function makeLiveStudy(slug: string, opts: { design?: StudyDesign; state?: 'live' | 'paused' | 'closed' | 'draft'; quota?: number | null; acceptsPid?: boolean } = {}) {
  const db = await em();
  const ws = await db.findOneOrFail(Workspace, { slug });
  const design = opts.design ?? testDesign();
  const study = db.create(Study, { workspace: ws, name: design.name, state: opts.state ?? 'live', design, launchedAt: new Date() });
  const token = randomBytes(24).toString('base64url');
  const link = db.create(RespondentLink, { workspace: ws, study, token, source: `test ${uid()}`, quota: opts.quota ?? null, acceptsPid: opts.acceptsPid ?? false });
  await db.flush();
  return { studyId: study.id, linkId: link.id, token, workspaceId: ws.id, design };
}

/** Moves the workspace's balance to exactly `target` with an adjustment entry. */
export async function setBalance(workspaceId: string, current: number, target: number) {
  await adjustSeats(await em(), workspaceId, target - current, `test-${uid()}`);
}

/** Summed here, not through the ledger module, so a wrong sum there fails the seat tests. */
export async function balanceOf(workspaceId: string): Promise<number> {
  const db = await em();
  const rows = await db.getConnection().execute<{ b: string }[]>('select coalesce(sum(delta),0) as b from seat_ledger_entry where workspace_id = ?', [workspaceId]);
  return Number(rows[0].b);
}

export async function trialRows(respondentToken: string) {
  const db = await em();
  return db.getConnection().execute<{ idx: number; kind: string; discount: number; base_price: number; answer: number; client_id: string }[]>(
    'select t.idx, t.kind, t.discount, t.base_price, t.answer, t.client_id from trial t join respondent r on r.id = t.respondent_id where r.resume_token = ? order by t.idx',
    [respondentToken],
  );
}
