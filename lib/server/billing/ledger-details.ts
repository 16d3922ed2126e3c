import 'server-only';
import { EXCLUSION_RULE_LABELS, rulesOrDefault } from '@/lib/schemas/exclusions.schema';
import { respondentRows, screen } from '@/lib/server/analysis/cells';
import type { EntityManager } from '@mikro-orm/postgresql';
import { sql } from '@/lib/server/db/sql';
import { findBundle } from '@/lib/billing-bundles';
import { receiptNumber } from './receipt-number';

// What a "respondent completed" line of the seat ledger is about, in words: the study, and
// whether that complete is kept in the analysis or excluded by the study's data-quality rules
// as they stand now (lib/exclusions.ts). An excluded complete still used its seat; the ledger
// says so, so a manager sees what the seats bought. Only the respondents on the page are judged.
// A purchase line is named by its receipt number (the one its receipt e-mail carries), never by
// the payment provider's session id.
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

export interface PurchaseDetail {
  /** The number the receipt e-mail carries (NW-…); null while the payment is unconfirmed. */
  receipt: string | null;
  bundle: string;
  seats: number;
}

/** Checkout session id (a purchase line's reference) → its receipt number and bundle, in this workspace only. */
export async function purchaseDetails(db: EntityManager, workspaceId: string, sessionIds: readonly string[]): Promise<Map<string, PurchaseDetail>> {
  const out = new Map<string, PurchaseDetail>();
  if (!sessionIds.length) return out;
  const rows = await sql<{ id: string; checkout_session_id: string; paid_at: Date | null; bundle: string; seats: number }>(
    db,
    `select id, checkout_session_id, paid_at, bundle, seats from purchase
      where workspace_id = ? and checkout_session_id in (select jsonb_array_elements_text(?::jsonb))`,
    [workspaceId, JSON.stringify(sessionIds)],
  );
  for (const r of rows) {
    out.set(r.checkout_session_id, {
      receipt: r.paid_at ? receiptNumber(r.id, new Date(r.paid_at)) : null,
      bundle: findBundle(r.bundle)?.name ?? r.bundle,
      seats: Number(r.seats),
    });
  }
  return out;
}
