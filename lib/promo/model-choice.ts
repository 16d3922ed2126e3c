import type { AnalysisReport } from '@/lib/psychometrics/report-types';
import type { FloorModel } from '@/lib/psychometrics/promo-floor';

export const FLOOR_MODELS = ['free', 'weber', 'power'] as const satisfies readonly FloorModel[];

export const FLOOR_MODEL_LABELS: Record<FloorModel, string> = {
  free: 'Free — each tested price its own threshold, interpolated between them',
  weber: 'Weber — one percentage threshold for every price',
  power: 'Power — the threshold follows the fitted Weber slope',
};

export const FLOOR_MODEL_SHORT: Record<FloorModel, string> = { free: 'Free (interpolated)', weber: 'Weber', power: 'Power' };

/**
 * The plan's default model: the one the study's model comparison prefers. A constant money
 * amount is the power model with a Weber slope of 0, so a study preferring it plans with power.
 * With a single tested base price only free and weber exist.
 */
export function defaultFloorModel(report: AnalysisReport): FloorModel {
  const m = report.preferredModel === 'constantAmount' ? 'power' : report.preferredModel;
  return m === 'power' && report.models.power.weberSlope === null ? 'free' : m;
}
