import 'server-only';
import { EXCLUSION_RULE_LABELS, rulesOrDefault } from '@/lib/schemas/exclusions.schema';
import { respondentRows, screen } from '@/lib/server/analysis/cells';
import type { EntityManager } from '@mikro-orm/postgresql';
import { sql } from '@/lib/server/db/sql';

// What a "respondent completed" line of the seat ledger is about, in words: the study, and
// whether that complete is kept in the analysis or excluded by the study's data-quality rules
// as they stand now (lib/exclusions.ts). An excluded complete still used its seat; the ledger
// says so, so a manager sees what the seats bought. Only the respondents on the page are judged.
// Tests: tests/integration/ledger-exclusions.test.ts.

export interface CompleteDetail {
  studyId: string;
  studyName: string;
  /** The labels of the rules the respondent breaks now; empty when kept. */
  excludedBy: string[];
}

/** Respondent id → what the ledger says about that complete; ids of other workspaces are skipped. */
export async function completeDetails(db: EntityManager, workspaceId: string, respondentIds: readonly string[]): Promise<Map<string, CompleteDetail>> {
  const out = new Map<string, CompleteDetail>();
  const uuids = respondentIds.filter((id) => /^[0-9a-f-]{36}$/i.test(id));
  if (!uuids.length) return out;
  const rows = await sql<{ id: string; study_id: string; name: string; exclusion_rules: unknown }>(
    db,
    `select r.id, s.id as study_id, s.name, s.exclusion_rules from respondent r join study s on s.id = r.study_id
      where r.workspace_id = ? and r.id::text in (select jsonb_array_elements_text(?::jsonb))`,
    [workspaceId, JSON.stringify(uuids)],
  );
  const byStudy = new Map<string, typeof rows>();
  for (const r of rows) byStudy.set(r.study_id, [...(byStudy.get(r.study_id) ?? []), r]);
  for (const [studyId, list] of byStudy) {
    const { excluded } = screen(await respondentRows(studyId, list.map((r) => r.id)), rulesOrDefault(list[0].exclusion_rules));
    for (const r of list) {
      out.set(r.id, { studyId, studyName: r.name, excludedBy: (excluded.get(r.id) ?? []).map((id) => EXCLUSION_RULE_LABELS[id]) });
    }
  }
  return out;
}
