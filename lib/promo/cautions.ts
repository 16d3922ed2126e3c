// The cautions shown next to every promotion plan and carried in every plan export
// (DESIGN.md → Cautions the product shows). Other exports may reuse this wording.

import { fitSourceCautions, type FitSource } from './fit-source';

export const CAUTIONS_TITLE = 'Before a price claim goes out';

export const PRICE_CLAIM_CAUTIONS: readonly string[] = [
  'A “was / now” or “save x %” claim must use a genuine former price: the price the item was really offered at before the promotion, not one set up to make the saving look larger.',
  'Reference-price rules differ by jurisdiction. In the United States the Federal Trade Commission’s Guides Against Deceptive Pricing (16 CFR Part 233) apply; under § 233.1 a former price is a fair basis for a comparison only when it is the actual, bona fide price at which the item was offered to the public on a regular basis for a reasonably substantial period of time.',
  'In the European Union, an announced price reduction must state the prior price, which is the lowest price the trader applied during at least the 30 days before the reduction (Directive 98/6/EC, Art. 6a, inserted by Directive (EU) 2019/2161).',
  'Local law and your counsel decide what may be claimed in each market. This plan is a research result, not legal advice.',
];

export const STATISTICS_CAUTION =
  'Promo floors come from a fitted model of the study’s answers: they are estimates with uncertainty (see the study’s results for intervals). Items priced outside the range of base prices the study tested are extrapolations and are flagged.';

export const POOR_FIT_WARNING =
  'The fit behind this plan was flagged as poor (the model does not describe the study’s answers well at one or more base prices, or the data are overdispersed). Treat these promo floors as rough guidance and check the study’s results before using them.';

/** All caution lines of one plan, in the order exports print them (a borrowed or pooled fit's lines after the poor-fit warning). */
export function planCautions(poorFit: boolean, source?: FitSource | null): string[] {
  return [...(poorFit ? [POOR_FIT_WARNING] : []), ...fitSourceCautions(source), ...PRICE_CLAIM_CAUTIONS, STATISTICS_CAUTION];
}
