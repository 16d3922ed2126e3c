// Simulated respondents for the demo study and for tests: every number here is invented and
// every answer drawn from a model observer; no real shopper answered any of it.
import type { EntityManager } from '@mikro-orm/postgresql';
import { createRng, type Rng } from '@/lib/psychometrics/random';
import type { PriceEnding } from '@/lib/psychometrics/promo-floor';
import { minorDigits, shownDiscount, shownPrice } from '@/respondent/shared/price';
import { insertFinishedRespondents, type FinishedRespondent } from '@/lib/server/studies/finished-respondents';

export interface SimParams {
  basePrices: number[];
  ladder: number[];
  repetitions: number;
  catchPerRespondent: number;
  respondents: number;
  /** Mid-point threshold fraction at `refPrice`. */
  refFraction: number;
  refPrice: number;
  /** Slope of ln(threshold money) on ln(base price). */
  weberSlope: number;
  /** Psychometric slope β on the ln-discount axis. */
  beta: number;
  lapse: number;
  /** Mean false-alarm rate on catch trials. */
  guess: number;
  /** Between-respondent spread of ln threshold (overdispersion, as real panels show). */
  alphaSd: number;
  segment?: { questionId: string; answers: { answer: string; share: number; alphaShift: number }[] };
  /** Respondents who fail the attention check, speed through at random, or press one key. */
  careless?: { inattentive: number; speeders: number; straightLiners: number };
  seed: string;
  /**
   * The study's price ending and currency: each test trial is shown at the price a real
   * respondent would see (respondent/shared/price.ts), the model observer reacts to the discount
   * that price shows, and that discount is what the trial records (with the rung beside it),
   * as the live answer path does. Default: exact cents in a two-decimal currency.
   */
  priceEnding?: PriceEnding;
  currency?: string;
}

export interface SimTrial {
  idx: number; kind: 'test' | 'catch' | 'attention'; basePrice: number;
  /** The discount actually shown (0 on catch trials). */
  discount: number;
  answer: 0 | 1; responseMs: number;
  /** Test trials: the rung drawn and the price shown, as Trial.shown holds them for live answers. */
  shown?: { rung: number; price: number };
}
export interface SimRespondent { segmentAnswers: Record<string, string>; attentionPassed: boolean | null; trials: SimTrial[] }

const logistic = (x: number) => 1 / (1 + Math.exp(-x));

function pickSegment(p: SimParams, rng: Rng) {
  if (!p.segment) return { answers: {}, shift: 0 };
  let u = rng.next();
  for (const a of p.segment.answers) {
    u -= a.share;
    if (u <= 0) return { answers: { [p.segment.questionId]: a.answer }, shift: a.alphaShift };
  }
  const last = p.segment.answers[p.segment.answers.length - 1];
  return { answers: { [p.segment.questionId]: last.answer }, shift: last.alphaShift };
}

export function simulateRespondents(p: SimParams): SimRespondent[] {
  const rng = createRng(p.seed);
  const care = p.careless ?? { inattentive: 0, speeders: 0, straightLiners: 0 };
  const out: SimRespondent[] = [];
  const digits = minorDigits(p.currency);
  const priced = new Map<string, { price: number; discount: number }>();
  const shownAt = (base: number, rung: number) => {
    const key = `${base}|${rung}`;
    let v = priced.get(key);
    if (!v) {
      const price = shownPrice(base, rung, p.priceEnding ?? 'exact', digits);
      priced.set(key, (v = { price, discount: shownDiscount(base, price) }));
    }
    return v;
  };
  for (let r = 0; r < p.respondents; r++) {
    const kind = r < care.inattentive ? 'inattentive' : r < care.inattentive + care.speeders ? 'speeder'
      : r < care.inattentive + care.speeders + care.straightLiners ? 'straight' : 'careful';
    const seg = pickSegment(p, rng);
    const offset = p.alphaSd * rng.normal() + seg.shift;
    // A forced choice (pick the lower price: guess 0.5) has no guessing habit to vary; a yes/no
    // task's false-alarm rate differs a little from shopper to shopper.
    const guess = p.guess >= 0.5 ? p.guess : Math.min(0.4, Math.max(0, p.guess + 0.04 * rng.normal()));
    const screens: { kind: 'test' | 'catch'; basePrice: number; discount: number }[] = [];
    for (const basePrice of p.basePrices) for (const discount of p.ladder) for (let k = 0; k < p.repetitions; k++) screens.push({ kind: 'test', basePrice, discount });
    for (let c = 0; c < p.catchPerRespondent; c++) screens.push({ kind: 'catch', basePrice: p.basePrices[c % p.basePrices.length], discount: 0 });
    rng.shuffle(screens);
    const trials: SimTrial[] = screens.map((s, idx) => {
      const seen = s.kind === 'test' ? shownAt(s.basePrice, s.discount) : null;
      const alpha = Math.log(p.refFraction) + (p.weberSlope - 1) * Math.log(s.basePrice / p.refPrice) + offset;
      const pYes = !seen ? guess : guess + (1 - guess - p.lapse) * logistic(p.beta * (Math.log(seen.discount) - alpha));
      let answer: 0 | 1 = rng.next() < pYes ? 1 : 0;
      // Inattentive respondents answer the price screens plausibly but miss the attention check;
      // speeders tap at random.
      if (kind === 'speeder') answer = rng.next() < 0.5 ? 1 : 0;
      if (kind === 'straight') answer = 1;
      const ms = kind === 'speeder' ? 180 + rng.int(150) : Math.round(Math.exp(Math.log(1500) + 0.35 * rng.normal()));
      const t: SimTrial = { idx: idx + 1, kind: s.kind, basePrice: s.basePrice, discount: seen ? seen.discount : 0, answer, responseMs: ms };
      if (seen) t.shown = { rung: s.discount, price: seen.price };
      return t;
    });
    const attentionPassed = kind !== 'inattentive';
    trials.splice(Math.floor(trials.length / 2), 0, { idx: 0, kind: 'attention', basePrice: p.basePrices[0], discount: 0, answer: attentionPassed ? 1 : 0, responseMs: 2400 });
    trials.forEach((t, i) => { t.idx = i + 1; });
    out.push({ segmentAnswers: seg.answers, attentionPassed, trials });
  }
  return out;
}

/**
 * Writes simulated finished respondents and their trials in the caller's transaction (bulk
 * rows, lib/server/studies/finished-respondents.ts). `linkIds` spreads respondents over
 * respondent links (their "source"); each one starts 7 minutes after the previous and takes 9.
 */
export async function insertRespondents(
  tx: EntityManager,
  { workspaceId, studyId, respondents, linkIds = [], state = 'completed', startedAt = new Date() }:
  { workspaceId: string; studyId: string; respondents: SimRespondent[]; linkIds?: string[]; state?: 'completed' | 'imported'; startedAt?: Date },
) {
  return insertFinishedRespondents(tx, {
    workspaceId, studyId, state,
    respondents: respondents.map((r, i): FinishedRespondent => {
      const begin = new Date(startedAt.getTime() + i * 7 * 60_000);
      return {
        externalRef: state === 'imported' ? `R${i + 1}` : null, linkId: linkIds.length ? linkIds[i % linkIds.length] : null, seed: i + 1,
        segmentAnswers: r.segmentAnswers, attentionPassed: r.attentionPassed, startedAt: begin, completedAt: new Date(begin.getTime() + 9 * 60_000),
        trials: r.trials,
      };
    }),
  });
}
