import 'server-only';
import { randomUUID } from 'node:crypto';
import { Study } from '@/entities/study';
import type { ExclusionCounts } from '@/lib/exclusions';
import type { AnalysisReport, BaseReport, ModelReport } from '@/lib/psychometrics/report-types';
import { powerLineOf } from '@/lib/psychometrics/study-difference';
import { sameCategory, type RecordEntry, type UncoveredCategory } from '@/lib/record/record';
import { requestComputation } from '@/lib/server/analysis/cache';
import { fitCacheKey, isPoorFit } from '@/lib/server/analysis/study-fit';
import { em } from '@/lib/server/db/orm';
import { sql } from '@/lib/server/db/sql';
import { AppError } from '@/lib/server/http/errors';
import { toDetail } from '@/lib/server/studies/studies';
import type { WorkspaceContext } from '@/lib/server/team/membership';

// The threshold record's data: every closed or imported study of the workspace with what its
// cached fit says (lib/server/analysis/study-fit.ts: all respondents, the study's current
// exclusion rules, the default mid-point target — the fit the results page shows). Nothing is
// refitted here: the record reads a small summary per fit (per-base thresholds, the power line with
// its bootstrap draws, counts — never the curves and bands), stored beside the fit in the same
// cache the first time a page needs it (readEntries; bench: `npm run bench:library`). A
// study whose fit is missing is queued once through the same cache as the results page (a study
// whose data the job cannot fit ends 'failed' with the engine's message); while a workspace has
// its share of the queue waiting, the rest simply show as pending.
// Tests: tests/integration/threshold-record.test.ts.

type FitRow = {
  study_id: string;
  status: 'queued' | 'running' | 'done' | 'failed';
  error: string | null;
  r: {
    bases: Pick<BaseReport, 'basePrice' | 'threshold' | 'verdict'>[] | null;
    power: (AnalysisReport['models']['power']) | null;
    preferred: Pick<ModelReport, 'deviance' | 'devianceDf' | 'devianceMonteCarloP'> | null;
    preferredModel: AnalysisReport['preferredModel'] | null;
    shoppers: number | null;
    unit: 'shopper' | 'trial' | null;
    intervalMethod: string | null;
    counts: ExclusionCounts['respondents'] | null;
  } | null;
};

const FIT_PARTS = `jsonb_build_object(
  'bases', (select jsonb_agg(jsonb_build_object('basePrice', b -> 'basePrice', 'threshold', b -> 'threshold', 'verdict', b -> 'verdict'))
              from jsonb_array_elements(result -> 'report' -> 'bases') b),
  'power', (result -> 'report' -> 'models' -> 'power') - 'thresholds',
  'preferred', (result -> 'report' -> 'models' -> (result -> 'report' ->> 'preferredModel')) - 'thresholds',
  'preferredModel', result -> 'report' -> 'preferredModel',
  'shoppers', result -> 'report' -> 'shoppers',
  'unit', result -> 'report' -> 'unit',
  'intervalMethod', result -> 'report' -> 'intervalMethod',
  'counts', result -> 'counts' -> 'respondents')`;

/** The cache kind of a fit's record summary (same cache key as the fit it was read from). */
export const RECORD_KIND = 'record-entry';

/**
 * The record's part of each study's current fit. Read from small summary rows (kind
 * RECORD_KIND) so a page of 200 studies does not unpack 200 full fit reports; a finished fit
 * without its summary yet is read once the slow way and its summary stored (insert … on conflict
 * do nothing, so two readers store one).
 */
async function readEntries(db: Awaited<ReturnType<typeof em>>, workspaceId: string, studyIds: string[], keys: string[]): Promise<FitRow[]> {
  const args = [workspaceId, `{${studyIds.join(',')}}`, `{${keys.join(',')}}`];
  const scope = `from analysis_result a join study s on s.id = a.study_id
      where s.workspace_id = ? and a.study_id = any(?::uuid[]) and a.cache_key = any(?::text[])`;
  const summaries = await sql<FitRow>(db, `select a.study_id, a.status, a.error, a.result as r ${scope} and a.kind = '${RECORD_KIND}' and a.status = 'done'`, args);
  const have = new Set(summaries.map((r) => r.study_id));
  const missing = studyIds.filter((id) => !have.has(id));
  if (!missing.length) return summaries;
  const fits = await sql<FitRow & { cache_key: string; data_version: number }>(
    db,
    `select a.study_id, a.status, a.error, a.cache_key, a.data_version, case when a.status = 'done' then ${FIT_PARTS} end as r ${scope} and a.kind = 'fit'`,
    [workspaceId, `{${missing.join(',')}}`, args[2]],
  );
  for (const f of fits) {
    if (f.status !== 'done' || !f.r) continue;
    await sql(
      db,
      `insert into analysis_result (id, study_id, kind, cache_key, data_version, status, result, created_at, updated_at)
       values (?, ?, '${RECORD_KIND}', ?, ?, 'done', ?::jsonb, now(), now()) on conflict (study_id, kind, cache_key) do nothing`,
      [randomUUID(), f.study_id, f.cache_key, f.data_version, JSON.stringify(f.r)],
    );
  }
  return [...summaries, ...fits.map(({ study_id, status, error, r }) => ({ study_id, status, error, r }))];
}

/** At most this many missing fits are queued per page view (the queue's fairness limit refuses more anyway). */
const QUEUE_PER_VIEW = 4;

export async function listRecord(ctx: WorkspaceContext, opts: { queueMissing?: boolean } = {}): Promise<RecordEntry[]> {
  const db = await em();
  const studies = (await db.find(Study, { workspace: ctx.workspace.id, state: { $in: ['closed', 'imported'] } }, { orderBy: { closedAt: 'desc', createdAt: 'desc' } })).map(toDetail);
  if (!studies.length) return [];
  const keys = studies.map((s) => fitCacheKey(s, {}).cacheKey);
  const rows = await readEntries(db, ctx.workspace.id, studies.map((s) => s.id), keys);
  const byStudy = new Map(rows.map((r) => [r.study_id, r]));
  let queued = 0;
  const out: RecordEntry[] = [];
  for (const s of studies) {
    let row = byStudy.get(s.id);
    if (!row && opts.queueMissing && queued < QUEUE_PER_VIEW) {
      queued++;
      try {
        const { cacheKey } = fitCacheKey(s, {});
        const c = await requestComputation({ studyId: s.id, kind: 'fit', cacheKey, dataVersion: s.dataVersion, queue: 'analysis', payload: { segment: null, target: null } });
        row = { study_id: s.id, status: c.status, error: c.error, r: null };
      } catch (err) {
        if (!(err instanceof AppError && err.status === 429)) throw err;
      }
    }
    out.push(toEntry(s, row));
  }
  return out;
}

function toEntry(s: ReturnType<typeof toDetail>, row: FitRow | undefined): RecordEntry {
  const base = {
    studyId: s.id, name: s.name, state: s.state as 'closed' | 'imported', category: s.design.category, currency: s.design.currency,
    locale: s.design.locale, date: s.closedAt ?? s.updatedAt, basePrices: [...s.design.basePrices].sort((a, b) => a - b),
  };
  const empty = {
    respondents: null, shoppers: null, unit: null, thresholds: [], weberSlope: null, weberSlopeCi: null,
    preferredModel: null, intervalMethod: null, poorFit: false, line: null,
  };
  if (!row || !row.r || row.status !== 'done') {
    const message = row?.status === 'failed' ? row.error ?? 'The fit could not be computed.'
      : row ? 'The fit is being computed; reload in a moment.' : 'Not fitted yet: open the study’s results, or reload this page.';
    return { ...base, ...empty, status: row?.status === 'failed' ? 'failed' : 'pending', message };
  }
  const r = row.r;
  const bases = r.bases ?? [];
  const power = r.power;
  const partial = { bases, models: { [r.preferredModel ?? 'weber']: r.preferred }, preferredModel: r.preferredModel } as unknown as AnalysisReport;
  return {
    ...base, status: 'ready', message: null,
    respondents: r.counts?.after ?? null, shoppers: r.shoppers ?? null, unit: r.unit ?? null,
    thresholds: bases.map((b) => ({ basePrice: b.basePrice, amount: b.threshold.amount, amountCi: b.threshold.amountCi, bound: b.threshold.bound ?? null })),
    weberSlope: power?.weberSlope ?? null, weberSlopeCi: power?.weberSlopeCi ?? null,
    preferredModel: r.preferredModel ?? null, intervalMethod: r.intervalMethod ?? null,
    poorFit: r.preferred ? isPoorFit(partial) : bases.some((b) => b.verdict === 'poor fit'),
    line: power ? powerLineOf({ models: { power } as AnalysisReport['models'], shoppers: r.shoppers, bases: bases as BaseReport[] }) : null,
  };
}

/** Categories on the workspace's price lists that no closed or imported study measured. */
export async function uncoveredCategories(ctx: WorkspaceContext, entries: RecordEntry[]): Promise<UncoveredCategory[]> {
  const db = await em();
  const listed = await sql<{ category: string; items: number; lists: string[] }>(
    db,
    `select trim(i.category) as category, count(*)::int as items, array_agg(distinct l.name order by l.name) as lists
       from price_list_item i join price_list l on l.id = i.price_list_id
      where l.workspace_id = ? and i.category is not null and trim(i.category) <> ''
      group by trim(i.category) order by trim(i.category)`,
    [ctx.workspace.id],
  );
  const measuring = await sql<{ name: string; category: string }>(
    db,
    `select name, design ->> 'category' as category from study where workspace_id = ? and state in ('draft', 'live', 'paused')`,
    [ctx.workspace.id],
  );
  const out: UncoveredCategory[] = [];
  for (const l of listed) {
    if (entries.some((e) => sameCategory(e.category, l.category))) continue;
    const prev = out.find((o) => sameCategory(o.category, l.category));
    if (prev) { prev.items += l.items; prev.priceLists = [...new Set([...prev.priceLists, ...l.lists])]; continue; }
    out.push({ category: l.category, items: l.items, priceLists: l.lists, inProgress: measuring.filter((m) => m.category && sameCategory(m.category, l.category)).map((m) => m.name) });
  }
  return out;
}
