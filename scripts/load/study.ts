// A live study with one link and a seat balance, written straight into the tables with `pg`
// (the bench and the fault tests run outside the app, without its server-only modules).
// `storedFacts` reads back what the exactly-once checks compare: trials (and duplicate
// (respondent, idx) pairs), respondents, completes, seats used and the balance, so a retried answer
// or complete that was stored twice shows up.
// Keep the columns here in step with the entities when a migration changes them.
import { randomBytes, randomUUID } from 'node:crypto';
import type { Pool } from 'pg';
import { studyDesignSchema, type StudyDesign } from '../../lib/schemas/study.schema';

export interface LoadStudy {
  workspaceId: string;
  studyId: string;
  linkToken: string;
  design: StudyDesign;
  seats: number;
}

/** A fixed-plan "pick the lower price" design; 3 base prices × 4 rungs × `repetitions`. */
export function loadDesign(repetitions = 3): StudyDesign {
  return studyDesignSchema.parse({
    name: 'Load check: pantry oil', itemName: 'Olive oil', category: 'Pantry', currency: 'EUR', locale: 'en-IE', task: 'pick',
    basePrices: [2.49, 9.99, 49], ladder: [0.02, 0.05, 0.1, 0.2], repetitions, catchShare: 0.2, practiceTrials: 2, orderSeed: 7,
    adaptive: { enabled: false }, viewMs: 300,
    consentText: 'A short price survey (simulated load). No names or e-mail addresses are stored.',
    segmentQuestions: [{ id: 'household', text: 'How many people live in your household?', options: ['1', '2', '3 or more'] }],
    attentionCheck: { enabled: true }, targetCompletes: 50, redirectUrl: '', priceEnding: 'exact',
  });
}

export async function createLoadStudy(pool: Pool, opts: { seats: number; design?: StudyDesign; name?: string }): Promise<LoadStudy> {
  const workspaceId = randomUUID();
  const studyId = randomUUID();
  const design = opts.design ?? loadDesign();
  const linkToken = randomBytes(24).toString('base64url');
  const c = await pool.connect();
  try {
    await c.query('begin');
    await c.query('insert into workspace (id, slug, name, retention_days, created_at) values ($1, $2, $3, 365, now())', [workspaceId, `load-${workspaceId.slice(0, 8)}`, opts.name ?? 'Load check (simulated)']);
    await c.query(`insert into seat_ledger_entry (id, workspace_id, delta, reason, reference, note, created_at) values ($1, $2, $3, 'adjustment', $4, 'Load check seats', now())`, [randomUUID(), workspaceId, opts.seats, `load-${workspaceId}`]);
    await c.query(`insert into study (id, workspace_id, name, state, design, data_version, created_at, updated_at, launched_at) values ($1, $2, $3, 'live', $4, 0, now(), now(), now())`, [studyId, workspaceId, design.name, JSON.stringify(design)]);
    await c.query(`insert into respondent_link (id, workspace_id, study_id, token, source, accepts_pid, created_at) values ($1, $2, $3, $4, 'Load check', false, now())`, [randomUUID(), workspaceId, studyId, linkToken]);
    await c.query('commit');
  } catch (err) {
    await c.query('rollback');
    throw err;
  } finally {
    c.release();
  }
  return { workspaceId, studyId, linkToken, design, seats: opts.seats };
}

/** What was stored, for the exactly-once checks. */
export async function storedFacts(pool: Pool, s: Pick<LoadStudy, 'workspaceId' | 'studyId'>) {
  const q = async (sql: string, p: unknown[]) => Number((await pool.query(sql, p)).rows[0].n);
  return {
    trials: await q('select count(*) as n from trial where study_id = $1', [s.studyId]),
    duplicates: await q('select count(*) as n from (select respondent_id, idx from trial where study_id = $1 group by 1, 2 having count(*) > 1) d', [s.studyId]),
    respondents: await q('select count(*) as n from respondent where study_id = $1', [s.studyId]),
    completes: await q(`select count(*) as n from respondent where study_id = $1 and state = 'completed'`, [s.studyId]),
    seatsUsed: await q(`select count(*) as n from seat_ledger_entry where workspace_id = $1 and reason = 'complete'`, [s.workspaceId]),
    balance: await q('select coalesce(sum(delta), 0) as n from seat_ledger_entry where workspace_id = $1', [s.workspaceId]),
    countMismatches: await q(`select count(*) as n from respondent r where r.study_id = $1 and r.answered_count <> (select count(*) from trial t where t.respondent_id = r.id)`, [s.studyId]),
  };
}
