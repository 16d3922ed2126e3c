import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { IStudy } from '@/entities/study';
import { brokenRules, emptyCounts, type ExclusionCounts, type RespondentQuality } from '@/lib/exclusions';
import type { ExclusionRuleId, ExclusionRules } from '@/lib/schemas/exclusions.schema';
import type { StudyDesign } from '@/lib/schemas/study.schema';
import { poolShopperCells } from '@/lib/psychometrics/shoppers';
import type { Cell, CatchCell, ShopperCell, Task } from '@/lib/psychometrics/types';
import { em } from '@/lib/server/db/orm';
import { sql, sqlOne } from '@/lib/server/db/sql';
import { loadStudy, toDetail, type StudyDetail } from '@/lib/server/studies/studies';
import type { WorkspaceContext } from '@/lib/server/team/membership';

// Trials → the engine's cells, after the study's exclusion rules. Aggregation happens in SQL
// (GROUP BY respondent, base price and discount) so the engine gets one small count vector per
// shopper — the shopper is the sampled unit of its bootstrap and tests (DESIGN.md → "The
// shopper is the unit") — and the cost stays with shoppers × design, not with trials.
// Imported respondents have ids like any other, so imports are resampled by shopper too.
// Only finished respondents count: completed ones and imported ones (drop-outs are fieldwork
// information, not data for the fit).

/**
 * The study as the analysis returns it: the one study DTO, plus the design facts the results,
 * print and import pages still read at the top level (copied from `design`, never defaulted
 * apart). Server code reads `study.design`; once those pages do too, this is StudyDetail.
 */
export type StudyInfo = StudyDetail & Pick<StudyDesign, 'task' | 'currency' | 'locale' | 'itemName' | 'category' | 'basePrices' | 'segmentQuestions'>;

export function toStudyInfo(s: IStudy): StudyInfo {
  const detail = toDetail(s);
  const { task, currency, locale, itemName, category, basePrices, segmentQuestions } = detail.design;
  return { ...detail, task, currency, locale, itemName, category, basePrices, segmentQuestions };
}

/** The study if it belongs to the workspace; a foreign or missing id is a 404 (pages pass em()). */
export async function findStudy(db: EntityManager, workspaceId: string, studyId: string): Promise<StudyInfo> {
  return toStudyInfo(await loadStudy(db, workspaceId, studyId));
}

export interface RespondentRow extends RespondentQuality {
  id: string;
  segmentAnswers: Record<string, string>;
  trials: number;
}

/**
 * Per finished respondent: what the exclusion rules judge. A response time of 0 means not
 * recorded (imports). `onlyIds` limits it to those respondents (the billing ledger's page).
 */
export async function respondentRows(studyId: string, onlyIds?: readonly string[]): Promise<RespondentRow[]> {
  const rows = await sql(
    await em(),
    `select r.id, r.segment_answers, r.attention_passed, s.design ->> 'task' as task,
            count(t.id) filter (where t.kind = 'catch')::int as catch_n,
            coalesce(sum(t.answer) filter (where t.kind = 'catch'), 0)::int as catch_k,
            count(t.id) filter (where t.kind = 'test')::int as test_n,
            coalesce(sum(t.answer) filter (where t.kind = 'test'), 0)::int as test_k,
            percentile_cont(0.5) within group (order by t.response_ms) filter (where t.kind in ('test', 'catch') and t.response_ms > 0) as median_ms,
            -- pick the lower price: the side tapped (the lower one when answer = 1), for the straight-lining rule
            count(t.id) filter (where t.kind = 'test' and t.shown ->> 'lowerSide' is not null and ((t.shown ->> 'lowerSide' = 'left') = (t.answer = 1)))::int as left_n,
            count(t.id) filter (where t.kind = 'test' and t.shown ->> 'lowerSide' is not null and ((t.shown ->> 'lowerSide' = 'left') <> (t.answer = 1)))::int as right_n
       from respondent r join study s on s.id = r.study_id
       left join trial t on t.respondent_id = r.id and t.kind in ('test', 'catch')
      where r.study_id = ? and r.state in ('completed', 'imported')
        and (?::jsonb is null or r.id::text in (select jsonb_array_elements_text(?::jsonb)))
      group by r.id, s.id order by r.started_at, r.id`,
    [studyId, onlyIds ? JSON.stringify(onlyIds) : null, onlyIds ? JSON.stringify(onlyIds) : null],
  );
  return rows.map((r) => ({
    id: String(r.id),
    segmentAnswers: (r.segment_answers ?? {}) as Record<string, string>,
    task: (r.task ?? 'spot') as Task,
    attentionPassed: r.attention_passed as boolean | null,
    catchTrials: Number(r.catch_n), catchYes: Number(r.catch_k),
    testTrials: Number(r.test_n), testYes: Number(r.test_k),
    medianMs: r.median_ms === null ? null : Number(r.median_ms),
    // Sides are known only where the flow recorded them (imports carry none).
    leftChosen: Number(r.left_n) + Number(r.right_n) > 0 ? Number(r.left_n) : null,
    rightChosen: Number(r.left_n) + Number(r.right_n) > 0 ? Number(r.right_n) : null,
    trials: Number(r.catch_n) + Number(r.test_n),
  }));
}

export interface Screened {
  counts: ExclusionCounts;
  /** Respondent id → the rules broken (only excluded respondents are present). */
  excluded: Map<string, ExclusionRuleId[]>;
  kept: RespondentRow[];
}

export function screen(rows: RespondentRow[], rules: ExclusionRules): Screened {
  const counts = emptyCounts();
  const excluded = new Map<string, ExclusionRuleId[]>();
  const kept: RespondentRow[] = [];
  const allOn: ExclusionRules = {
    falseAlarms: { ...rules.falseAlarms, enabled: true }, attention: { enabled: true },
    speeders: { ...rules.speeders, enabled: true }, straightLining: { enabled: true },
  };
  for (const r of rows) {
    counts.respondents.before++;
    counts.trials.before += r.trials;
    // byRule counts every rule, on or off, so the panel shows what switching a rule on would do.
    for (const id of brokenRules(r, allOn)) counts.byRule[id]++;
    const broken = brokenRules(r, rules);
    if (broken.length) { excluded.set(r.id, broken); continue; }
    kept.push(r);
    counts.respondents.after++;
    counts.trials.after += r.trials;
  }
  return { counts, excluded, kept };
}

export interface CellData { cells: Cell[]; catchCells: CatchCell[] }

export interface ShopperCellData extends CellData {
  /** One row per kept shopper, base and discount (discount 0: that shopper's catch trials). */
  shopperCells: ShopperCell[];
}

/**
 * Per-shopper cells of the kept respondents (optionally only those who gave `answer` to
 * segment question `questionId`), plus the pooled cells they sum to (the dots on the charts).
 * Discount-0 trials and kind 'catch' both count as catch trials.
 */
export async function loadShopperCells(studyId: string, keptIds: string[], segment?: { questionId: string; answer: string } | null): Promise<ShopperCellData> {
  if (!keptIds.length) return { cells: [], catchCells: [], shopperCells: [] };
  const params: unknown[] = [studyId, JSON.stringify(keptIds)];
  let segmentSql = '';
  if (segment) { segmentSql = 'and r.segment_answers ->> ? = ?'; params.push(segment.questionId, segment.answer); }
  const rows = await sql<{ rid: string; base_price: number; discount: number; n: number; k: number }>(
    await em(),
    `select r.id::text as rid, t.base_price, case when t.kind = 'catch' or t.discount = 0 then 0 else t.discount end as discount,
            count(*)::int as n, sum(t.answer)::int as k
       from trial t join respondent r on r.id = t.respondent_id
      where t.study_id = ? and t.kind in ('test', 'catch')
        and r.id::text in (select jsonb_array_elements_text(?::jsonb)) ${segmentSql}
      group by 1, 2, 3 order by 1, 2, 3`,
    params,
  );
  const shopperCells: ShopperCell[] = rows.map((r) => ({
    respondent: String(r.rid), basePrice: Number(r.base_price), discount: Number(r.discount), n: Number(r.n), k: Number(r.k),
  }));
  const pooled = poolShopperCells(shopperCells);
  pooled.cells.sort((a, b) => a.basePrice - b.basePrice || a.discount - b.discount);
  pooled.catchCells.sort((a, b) => a.basePrice - b.basePrice);
  return { ...pooled, shopperCells };
}

/** Whether any finished respondent answered a test trial (cheap check before queueing a fit). */
export async function hasAnsweredTests(studyId: string): Promise<boolean> {
  const row = await sqlOne<{ ok: boolean }>(
    await em(),
    `select exists (select 1 from trial t join respondent r on r.id = t.respondent_id
       where t.study_id = ? and t.kind = 'test' and r.state in ('completed', 'imported')) as ok`,
    [studyId],
  );
  return Boolean(row?.ok);
}

/** For pages: the caller's study with its design read for analysis; another workspace's is a 404. */
export async function getStudyInfo(ctx: WorkspaceContext, studyId: string): Promise<StudyInfo> {
  return findStudy(await em(), ctx.workspace.id, studyId);
}
