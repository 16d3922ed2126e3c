import 'server-only';
import { csvFile, jsonFile, type FileDownload } from '@/lib/server/http/download';
import { planAboutCsv, planCsv, planJson, type PlanExportHeader } from '@/lib/promo/plan-export';
import { FLOOR_MODEL_SHORT } from '@/lib/promo/model-choice';
import { PRICE_ENDING_LABELS } from '@/lib/schemas/study.schema';
import type { WorkspaceContext } from '@/lib/server/team/membership';
import { planTable } from './plan-table';

// A plan's downloads: `csv` (the table only, so it opens cleanly in a spreadsheet), `about-csv`
// (the side file of Field,Value rows: settings, fit version, exclusion rules, price ending,
// cautions) and `json` (header, summary and rows). The bytes are built by the pure
// lib/promo/plan-export.ts, which `npm run bench:plan` times on 50,000 rows.

export const EXPORT_FORMATS = ['csv', 'about-csv', 'json'] as const;
export type ExportFormat = (typeof EXPORT_FORMATS)[number];

const fileStem = (name: string) => `promo-plan-${name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 60) || 'plan'}`;

/** One export of a plan as a file (the route sends it as a download). */
export async function exportPlan(ctx: WorkspaceContext, planId: string, format: ExportFormat): Promise<FileDownload> {
  const { plan, rows, summary } = await planTable(ctx, planId);
  const generatedAt = new Date().toISOString();
  const header: PlanExportHeader = {
    plan: { id: plan.id, name: plan.name, createdAt: plan.createdAt },
    study: { id: plan.study.id, name: plan.study.name, task: plan.fit.task },
    segment: plan.settings.segment,
    fitVersion: plan.fitVersion,
    exclusionRules: plan.exclusionRules,
    model: FLOOR_MODEL_SHORT[plan.settings.model],
    target: plan.settings.target,
    ending: PRICE_ENDING_LABELS[plan.settings.ending],
    priceList: plan.priceList,
    testedBasePrices: plan.fit.testedBasePrices,
    poorFit: plan.poorFit,
    basis: plan.settings.basis ?? 'point',
    share: plan.settings.share ?? null,
    tolerance: plan.settings.tolerance ?? null,
    fitSource: plan.fit.source ?? null,
  };
  const stem = fileStem(plan.name);
  if (format === 'csv') return csvFile(`${stem}.csv`, planCsv(plan.priceList.currency, rows, plan.fit.source));
  if (format === 'about-csv') return csvFile(`${stem}-about.csv`, planAboutCsv(header, generatedAt));
  return jsonFile(`${stem}.json`, planJson(header, summary, rows, generatedAt));
}
