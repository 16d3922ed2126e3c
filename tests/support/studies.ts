// Test studies with simulated responses, inserted straight into the tables.
import { randomUUID } from 'node:crypto';
import { em } from '@/lib/server/db';
import { DEMO_DESIGN, DEMO_SIM } from '@/scripts/seed/demo-study';
import { insertRespondents, simulateRespondents, type SimParams } from '@/scripts/seed/simulate-responses';

export async function makeSimulatedStudy(workspaceSlug: string, opts: { state?: string; sim?: Partial<SimParams>; name?: string; withLinks?: boolean } = {}) {
  const db = await em();
  const [ws] = await db.execute<{ id: string }[]>('select id from workspace where slug = ?', [workspaceSlug]);
  const studyId = randomUUID();
  const sim: SimParams = { ...DEMO_SIM, respondents: 40, seed: `test-${studyId}`, ...opts.sim };
  const knex = db.getKnex();
  const linkId = randomUUID();
  await knex.transaction(async (trx) => {
    await trx('study').insert({
      id: studyId, workspace_id: ws.id, name: opts.name ?? 'Simulated study', state: opts.state ?? 'closed',
      design: JSON.stringify({ ...DEMO_DESIGN, name: opts.name ?? 'Simulated study' }), exclusion_rules: null, data_version: 1,
      created_at: new Date(), updated_at: new Date(),
    });
    if (opts.withLinks !== false) {
      await trx('respondent_link').insert({ id: linkId, workspace_id: ws.id, study_id: studyId, token: randomUUID().replace(/-/g, ''), source: 'Panel B', accepts_pid: false, created_at: new Date() });
    }
    await insertRespondents(db, trx, { workspaceId: ws.id, studyId, respondents: simulateRespondents(sim), linkIds: opts.withLinks === false ? [] : [linkId] });
  });
  return { studyId, workspaceId: ws.id };
}
