import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { PromoPlan, type IPromoPlan } from '@/entities/promo-plan';
import { PriceList } from '@/entities/price-list';
import { floorParams, type FloorModel, type FloorParams } from '@/lib/psychometrics/promo-floor';
import { PsychometricsInputError } from '@/lib/psychometrics/errors';
import type { PromoPlanCreate, PromoPlanSettings } from '@/lib/schemas/promo-plan.schema';
import { defaultFloorModel } from '@/lib/promo/model-choice';
import { unreachableTarget } from '@/lib/promo/floor-table';
import { basisData, type BasisData } from '@/lib/promo/floor-basis';
import { getStudyFit } from '@/lib/server/analysis/study-fit';
import { getPooledFit } from '@/lib/server/analysis/pooled-fit';
import { fitSourceOf, type FitSource } from '@/lib/promo/fit-source';
import { Study } from '@/entities/study';
import { sql } from '@/lib/server/db/sql';
import { recordAudit } from '@/lib/server/team/audit';
import { em } from '@/lib/server/db/orm';
import { lockKey } from '@/lib/server/db/sql';
import { AppError, notFoundError } from '@/lib/server/http/errors';
import { requireUuid } from '@/lib/server/platform/ids';
import type { WorkspaceContext } from '@/lib/server/team/membership';

// Promotion plans: a study's fit (or one segment answer's) applied to a price list. Created from
// getStudyFit, the contract the analysis offers; while that fit is still computing nothing is
// stored and the route answers 202 with Retry-After: 5. A plan keeps only the fit's parameters
// (StoredFit: floorParams for the chosen model, tested base prices, task, currency, …), so its
// floors are recomputed, never refitted, and a later change to the study leaves it as it was.
// The floor basis (point estimate, cautious end of the interval, share of shoppers) and the
// ending tolerance are settings; what the bases need from the report is stored as `basis`
// (lib/promo/floor-basis.ts), so older plans without it read as point floors with no limit.
// A pooled fit (pooledStudyIds, lib/server/analysis/pooled-fit.ts) stands in for a study's fit; the
// plan's `study` is then the first one chosen. Either way the plan stores its FitSource
// (lib/promo/fit-source.ts): which studies, and the list categories the fit is borrowed for.
// Refusals (422): a list in another currency than the study, a target notice rate the model
// never reaches, power with one tested base price, a share of shoppers the study does not
// report (no shopper ids, or no mixed model); 409 for a name already used.
// Tests: tests/integration/promo-plans.test.ts; e2e promotions.test.ts.

/** What a plan stores about its fit (PromoPlan.fit): enough to recompute every floor. */
export interface StoredFit {
  params: FloorParams;
  testedBasePrices: number[];
  task: string;
  currency: string;
  locale: string;
  preferredModel: string;
  intervalMethod: string;
  warnings: string[];
  /** What the cautious and share bases need, and the bounds; absent in older plans. */
  basis?: BasisData;
  /** Which studies the fit comes from and the list categories it is borrowed for (lib/promo/fit-source.ts); absent in older plans. */
  source?: FitSource;
}

export interface PromoPlanDto {
  id: string;
  name: string;
  createdAt: string;
  createdBy: string | null;
  settings: PromoPlanSettings;
  fitVersion: number;
  exclusionRules: Record<string, unknown> | null;
  poorFit: boolean;
  fit: StoredFit;
  study: { id: string; name: string };
  priceList: { id: string; name: string; currency: string; itemCount: number };
}


function toDto(p: IPromoPlan): PromoPlanDto {
  return {
    id: p.id, name: p.name, createdAt: p.createdAt.toISOString(), createdBy: p.createdBy?.name ?? null,
    settings: p.settings as unknown as PromoPlanSettings, fitVersion: p.fitVersion,
    exclusionRules: p.exclusionRules ?? null, poorFit: p.poorFit, fit: p.fit as unknown as StoredFit,
    study: { id: p.study.id, name: p.study.name },
    priceList: { id: p.priceList.id, name: p.priceList.name, currency: p.priceList.currency, itemCount: p.priceList.itemCount },
  };
}

const invalid = (path: string, message: string) => new AppError(422, 'validation_failed', message, [{ path, message }]);

export type CreatePlanResult = { status: 'created'; plan: PromoPlanDto } | { status: 'pending'; message: string };

/**
 * Creates a plan from the study's current fit. While the fit is still computing nothing is
 * stored and the caller is told to try again; the floors later come from the stored
 * parameters, so the plan reproduces exactly even after the study's data move on.
 */
export async function createPromoPlan(ctx: WorkspaceContext, input: PromoPlanCreate): Promise<CreatePlanResult> {
  const db = await em();
  requireUuid(input.priceListId, 'That price list');
  const list = await db.findOne(PriceList, { id: input.priceListId, workspace: ctx.workspace.id });
  if (!list) throw notFoundError('That price list');
  const pooledIds = [...new Set([input.studyId, ...input.pooledStudyIds])];
  if (pooledIds.length > 1 && input.segment) throw invalid('segment', 'A pooled fit uses all respondents of each study; choose no segment.');
  const fit = pooledIds.length > 1 ? await getPooledFit(ctx, pooledIds) : await getStudyFit(ctx, input.studyId, { segment: input.segment });
  if (fit.status === 'pending') return { status: 'pending', message: `The study’s fit is still being computed (${fit.message.replace(/…$/, '')}). Nothing was saved yet; try again in a few seconds.` };
  if (fit.status === 'empty') throw invalid('studyId', fit.message);
  if (fit.currency !== list.currency) {
    throw invalid('priceListId', `The price list is in ${list.currency} but the study tested prices in ${fit.currency}. Thresholds depend on the price level, so a plan needs a list in the study’s currency.`);
  }
  const model: FloorModel = input.model === 'preferred' ? defaultFloorModel(fit.report) : input.model;
  let params: FloorParams;
  try {
    params = floorParams(fit.report, model);
  } catch (err) {
    if (err instanceof PsychometricsInputError) throw invalid('model', 'The power model needs at least two tested base prices; choose free or Weber.');
    throw err;
  }
  const target = input.target === 'mid-point' ? null : input.target;
  const why = unreachableTarget(params, target ?? undefined);
  if (why) throw invalid('target', why);
  const basis = basisData(fit.report, model, params);
  if (input.basis === 'share') {
    if (basis.shareUnavailable) throw invalid('basis', basis.shareUnavailable);
    if (!basis.shares.some((x) => x.share === input.share)) {
      throw invalid('share', `The study reports the discount that ${basis.shares.map((x) => `${Math.round(x.share * 100)} %`).join(', ')} of shoppers notice; choose one of these.`);
    }
  }
  if (input.basis === 'cautious' && basis.cautiousLnRatio.every((r) => r === null)) {
    throw invalid('basis', 'The study’s fit has no intervals for this model (no bootstrap); use the point estimate.');
  }
  const settings: PromoPlanSettings = {
    model, modelChoice: input.model, target: input.basis === 'share' ? null : target, ending: input.ending, segment: input.segment,
    basis: input.basis, share: input.basis === 'share' ? input.share : null, tolerance: input.tolerancePoints / 100,
  };
  const stored: StoredFit = {
    params, testedBasePrices: fit.basePrices, task: fit.task, currency: fit.currency, locale: fit.locale,
    preferredModel: fit.report.preferredModel, intervalMethod: fit.report.intervalMethod, warnings: fit.report.warnings, basis,
    source: await sourceOf(db, ctx, pooledIds, list.id),
  };
  const id = await db.transactional(async (tx) => {
    // Serialises plan creation per workspace so a double-submitted form stores one plan.
    await lockKey(tx, `promo_plan:${ctx.workspace.id}`);
    if (await tx.count(PromoPlan, { workspace: ctx.workspace.id, name: input.name })) {
      throw new AppError(409, 'conflict', `A plan named “${input.name}” already exists in this workspace.`, [{ path: 'name', message: 'A plan with this name already exists.' }]);
    }
    const plan = tx.create(PromoPlan, {
      workspace: ctx.workspace.id, priceList: list.id, study: input.studyId, name: input.name,
      settings: settings as unknown as Record<string, unknown>, fitVersion: fit.dataVersion,
      exclusionRules: fit.exclusionRules as unknown as Record<string, unknown>, fit: stored as unknown as Record<string, unknown>,
      poorFit: fit.poorFit, createdBy: ctx.user.id,
    });
    await tx.flush();
    await recordAudit(tx, { workspace: ctx.workspace.id, actor: ctx.user.id, action: 'promo_plan.created', target: input.name, detail: { planId: plan.id, studyId: input.studyId, pooledStudyIds: pooledIds.length > 1 ? pooledIds : undefined, priceListId: list.id, fitVersion: fit.dataVersion } });
    return plan.id;
  });
  return { status: 'created', plan: await getPromoPlan(ctx, id) };
}

/** The studies behind the fit and the price list's categories they did not measure. */
async function sourceOf(db: EntityManager, ctx: WorkspaceContext, studyIds: string[], listId: string): Promise<FitSource> {
  const studies = await db.find(Study, { id: { $in: studyIds }, workspace: ctx.workspace.id }, { fields: ['id', 'name', 'design'] });
  const cats = await sql<{ category: string }>(db, 'select distinct category from price_list_item where price_list_id = ? and category is not null', [listId]);
  const ordered = studyIds.map((id) => studies.find((s) => s.id === id)!).filter(Boolean);
  return fitSourceOf(ordered.map((s) => ({ id: s.id, name: s.name, category: String((s.design as { category?: string }).category ?? '') })), cats.map((c) => c.category));
}

async function findPlan(db: EntityManager, ctx: WorkspaceContext, id: string) {
  requireUuid(id, 'That promotion plan');
  const p = await db.findOne(PromoPlan, { id, workspace: ctx.workspace.id }, { populate: ['study', 'priceList', 'createdBy'] });
  if (!p) throw notFoundError('That promotion plan');
  return p;
}

export async function getPromoPlan(ctx: WorkspaceContext, id: string): Promise<PromoPlanDto> {
  return toDto(await findPlan(await em(), ctx, id));
}

export async function listPromoPlans(ctx: WorkspaceContext): Promise<PromoPlanDto[]> {
  const db = await em();
  const rows = await db.find(PromoPlan, { workspace: ctx.workspace.id }, { populate: ['study', 'priceList', 'createdBy'], orderBy: { createdAt: 'desc' } });
  return rows.map(toDto);
}

export async function deletePromoPlan(ctx: WorkspaceContext, id: string): Promise<void> {
  const db = await em();
  const p = await findPlan(db, ctx, id);
  await db.transactional(async (tx) => {
    await tx.nativeDelete(PromoPlan, { id: p.id, workspace: ctx.workspace.id });
    await recordAudit(tx, { workspace: ctx.workspace.id, actor: ctx.user.id, action: 'promo_plan.deleted', target: p.name, detail: { planId: p.id } });
  });
}
