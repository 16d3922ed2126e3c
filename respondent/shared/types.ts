// respondent/shared: pure code both sides use, with no I/O and no framework: the server
// (respondent/server) and the phone flow (respondent/client, also the analyst's no-network
// preview) generate the same plan, show the same screens and send the shapes typed here and in
// the *.schema.ts files.
// This module: the trial plan stored on Respondent.plan (jsonb) and the screens the browser receives.

export type PlanKind = 'practice' | 'test' | 'catch' | 'attention';
export type Side = 'left' | 'right';

export interface ShelfItem {
  label: string;
  price: number;
  /** The study base price this item stands for; null for filler items with invented prices. */
  base: number | null;
}

/** One screen of the plan with everything the server records when it is answered. */
export interface PlannedTrial {
  kind: PlanKind;
  /** Design base price (0 for the attention check). */
  basePrice: number;
  /** Nominal ladder depth (null for catch and attention screens). */
  rung: number | null;
  /** Displayed price after the price-ending rule. */
  price: number;
  /** The discount actually shown: (base − price) / base. */
  discount: number;
  /** Pick the lower price: the side holding the lower tag (on catch trials the tags are equal). */
  lowerSide?: Side;
  /** Spot the saving: which shelf item is shown. */
  shelfItem?: number;
  /** Spot the saving: show the shelf again before this trial (memory refresh between blocks). */
  refresh?: boolean;
  /** Adaptive plans: position in the slot list (test slots are filled from the staircase). */
  slot?: number;
}

/** A test slot of an adaptive plan: base and discount come from the staircase when it is reached. */
export interface OpenSlot {
  kind: 'test';
  open: true;
  lowerSide?: Side;
  refresh?: boolean;
  slot?: number;
}

export interface FixedPlan {
  version: 1;
  mode: 'fixed';
  shelf: ShelfItem[];
  trials: PlannedTrial[];
}

export interface AdaptivePlan {
  version: 1;
  mode: 'adaptive';
  shelf: ShelfItem[];
  slots: (PlannedTrial | OpenSlot)[];
}

export type TrialPlan = FixedPlan | AdaptivePlan;

/** What the browser sees of one trial: no kind beyond practice/attention, no recorded discount. */
export interface PublicTrial {
  idx: number;
  kind: 'practice' | 'trial' | 'attention';
  label: string;
  base: number;
  price: number;
  side?: Side;
  shelfItem?: number;
  refresh?: boolean;
  attention?: { question: string; options: string[] };
}

export interface FlowStudy {
  task: 'spot' | 'pick' | 'trip';
  itemName: string;
  pictureUrl: string | null;
  currency: string;
  locale: string;
  viewMs: number;
  tripMinutes: number;
  /** Who runs the study and how to reach them (the design's contact line, shown with the consent text). */
  contact: string;
}

/** The next screen(s) for a respondent: returned by GET state, start and answer. */
export interface FlowState {
  phase: 'questions' | 'trials' | 'done' | 'completed';
  study: FlowStudy;
  shelf: { label: string; price: number }[];
  /** Known upcoming trials from the next unanswered one (adaptive plans: only the next). */
  upcoming: PublicTrial[];
  adaptive: boolean;
  answered: number;
  total: number;
  /** Practice screens at the start of the plan (counted in total; progress shows the rest). */
  practice: number;
  redirectUrl: string | null;
  /** The respondent's reference code for a deletion request (shown on the thank-you screen); null in a preview. */
  referenceCode: string | null;
}
