import { readdirSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { checkLadder, describeIssue } from '@/lib/promo/ladder-check';
import { studyDesignSchema, type StudyDesign } from '@/lib/schemas/study.schema';
import { minorDigits, shownDiscount, shownPrice } from '@/respondent/shared/price';
import { simulateRespondents } from '@/scripts/seed/simulate-responses';
import { DEMO_DESIGN, DEMO_SIM } from '@/scripts/seed/demo-study';

// Protects the demo: every study design the seed files export (scripts/seed/*.ts, whoever adds
// one) passes the builder's own ladder check (lib/promo/ladder-check.ts) — no rung moved by its
// price ending more than a tenth of its depth, none rounding onto another or to no saving — so
// the demo never shows a ladder the builder would warn about. And the demo's simulated answers
// record what a real respondent's would: the discount actually shown, with the rung it was
// drawn from beside it.

const SEED_DIR = path.resolve(__dirname, '../../scripts/seed');

async function seedDesigns(): Promise<{ where: string; design: StudyDesign }[]> {
  const out: { where: string; design: StudyDesign }[] = [];
  for (const file of readdirSync(SEED_DIR).filter((f) => f.endsWith('.ts')).sort()) {
    const mod = (await import(path.join(SEED_DIR, file))) as Record<string, unknown>;
    for (const [name, value] of Object.entries(mod)) {
      if (!value || typeof value !== 'object' || !('ladder' in value) || !('basePrices' in value) || !('task' in value)) continue;
      out.push({ where: `${file} → ${name}`, design: studyDesignSchema.parse(value) });
    }
  }
  return out;
}

const money = (v: number) => v.toFixed(2);

describe('the demo studies’ ladders', () => {
  it('every design exported from scripts/seed/*.ts passes the builder’s ladder check', async () => {
    const designs = await seedDesigns();
    expect(designs.map((d) => d.where)).toContain('demo-study.ts → DEMO_DESIGN');
    for (const { where, design } of designs) {
      const { issues } = checkLadder(design.basePrices, design.ladder, design.priceEnding, design.currency);
      expect(issues.map((i) => `${where}: ${describeIssue(i, money)}`)).toEqual([]);
    }
  });

  it('the check would catch the demo’s old ladder (1 % of €3.49 ending in .99)', () => {
    const { issues } = checkLadder([3.49], [0.01, 0.02, 0.03], 'ends-99', 'EUR');
    expect(issues.map((i) => i.rung)).toContain(0.01);
  });
});

describe('the demo’s simulated answers', () => {
  const respondents = simulateRespondents({ ...DEMO_SIM, respondents: 6 });
  const digits = minorDigits(DEMO_DESIGN.currency);

  it('record the discount actually shown and the rung it was drawn from', () => {
    let tests = 0;
    for (const r of respondents) {
      for (const t of r.trials.filter((x) => x.kind === 'test')) {
        tests++;
        const rung = t.shown?.rung as number;
        expect(DEMO_DESIGN.ladder).toContain(rung);
        const price = shownPrice(t.basePrice, rung, DEMO_DESIGN.priceEnding, digits);
        expect(t.shown?.price).toBe(price);
        expect(t.discount).toBe(shownDiscount(t.basePrice, price));
      }
    }
    expect(tests).toBe(6 * DEMO_DESIGN.basePrices.length * DEMO_DESIGN.ladder.length * DEMO_DESIGN.repetitions);
  });

  it('somewhere the shown discount differs from the nominal rung (cents are coarse), so recording it matters', () => {
    const differs = respondents[0].trials.some((t) => t.kind === 'test' && t.discount !== t.shown?.rung);
    expect(differs).toBe(true);
  });
});
