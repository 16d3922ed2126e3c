// The demo record's two extra studies (scripts/seed/demo-record-studies.ts): invented designs
// that the builder would accept as they are — exact-cent ladders with no ladder-check issue,
// categories other than the kitchen study's and each other's, closed at other dates.
import { describe, expect, it } from 'vitest';
import { checkLadder } from '@/lib/promo/ladder-check';
import { studyDesignSchema } from '@/lib/schemas/study.schema';
import { DEMO_DESIGN } from '@/scripts/seed/demo-study';
import { DEMO_RECORD_STUDIES } from '@/scripts/seed/demo-record-studies';

describe('demo record studies', () => {
  it('pass the ladder check with exact cents and the design schema', () => {
    for (const s of DEMO_RECORD_STUDIES) {
      expect(s.design.priceEnding).toBe('exact');
      expect(checkLadder(s.design.basePrices, s.design.ladder, 'exact', s.design.currency).issues, s.design.name).toEqual([]);
      expect(studyDesignSchema.safeParse(s.design).success).toBe(true);
    }
  });

  it('measure other categories at other dates than the kitchen study', () => {
    const cats = DEMO_RECORD_STUDIES.map((s) => s.design.category);
    expect(new Set([...cats, DEMO_DESIGN.category]).size).toBe(3);
    const days = DEMO_RECORD_STUDIES.map((s) => s.closedAt.toISOString().slice(0, 10));
    expect(new Set([...days, '2026-03-20']).size).toBe(3);
  });
});
