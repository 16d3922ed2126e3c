import { describe, expect, it } from 'vitest';
import { ledgerWords, type LedgerLine } from '@/lib/ledger-words';

// Protects Billing's ledger wording: every kind of line reads as words (a receipt number, a
// study name, the rule that excluded a complete), and no raw reference ever reaches the text.

const line = (l: Partial<LedgerLine> & { reason: string }): LedgerLine => ({ note: null, complete: null, purchase: null, ...l });
const text = (w: ReturnType<typeof ledgerWords>) => [w.title, w.about, w.excluded].filter(Boolean).join(' · ');

describe('ledger lines in words', () => {
  it('a confirmed purchase is named by its receipt number and bundle', () => {
    const w = ledgerWords(line({ reason: 'purchase', purchase: { receipt: 'NW-2026-1A2B-3C4D-5E6F', bundle: 'Pilot', seats: 100 } }));
    expect(text(w)).toBe('Pilot bundle bought · Receipt NW-2026-1A2B-3C4D-5E6F');
  });
  it('a complete says whose study it served, and an excluded one says why it is left out', () => {
    expect(text(ledgerWords(line({ reason: 'complete', complete: { studyName: 'Pantry', excludedBy: [] } })))).toBe('Complete by a respondent · Pantry');
    const ex = ledgerWords(line({ reason: 'complete', complete: { studyName: 'Pantry', excludedBy: ['Failed the attention check'] } }));
    expect(ex.title).toBe('Excluded complete');
    expect(ex.excluded).toBe('Left out of the analysis (Failed the attention check); the seat was used');
  });
  it('welcome seats and corrections by name; nothing looks like an id', () => {
    const all = [
      ledgerWords(line({ reason: 'welcome', note: 'Free seats for a new workspace' })),
      ledgerWords(line({ reason: 'adjustment', note: 'Load check' })),
      ledgerWords(line({ reason: 'purchase' })),
      ledgerWords(line({ reason: 'complete' })),
    ];
    expect(all.map((w) => w.title)).toEqual(['Welcome seats', 'Correction', 'Bundle bought', 'Complete by a respondent']);
    for (const w of all) expect(text(w)).not.toMatch(/[0-9a-f]{8}-[0-9a-f]{4}|cs_test_|cs_live_/);
  });
});
