// Borrowed and pooled fits are labelled (lib/promo/fit-source.ts): which price-list categories a
// plan's fit did not measure, the per-item "Fit basis" text and the caution lines.
import { describe, expect, it } from 'vitest';
import { describeFitSource, fitBasisFor, fitSourceCautions, fitSourceOf, isBorrowed } from '@/lib/promo/fit-source';

const kitchen = { id: 'k', name: 'Kitchen study', category: 'Kitchen & home' };
const drinks = { id: 'd', name: 'Drinks study', category: 'Groceries — drinks' };

describe('fit source', () => {
  it('a study measuring the list’s only category is not borrowed (case and spaces ignored)', () => {
    const s = fitSourceOf([kitchen], ['kitchen & HOME ', 'Kitchen & home']);
    expect(s.borrowedFor).toEqual([]);
    expect(isBorrowed(s)).toBe(false);
    expect(describeFitSource(s)).toBe('Measured: “Kitchen study” (Kitchen & home)');
    expect(fitSourceCautions(s)).toEqual([]);
    expect(fitBasisFor(s, 'Kitchen & home')).toBe('measured: “Kitchen study” (Kitchen & home)');
  });

  it('names the categories a fit is borrowed for, per item and in the cautions', () => {
    const s = fitSourceOf([kitchen], ['Kitchen & home', 'Garden', 'Garden']);
    expect(s.borrowedFor).toEqual(['Garden']);
    expect(isBorrowed(s)).toBe(true);
    expect(describeFitSource(s)).toBe('Borrowed from “Kitchen study” (Kitchen & home) for Garden');
    expect(fitBasisFor(s, 'Garden')).toBe('borrowed from “Kitchen study” (Kitchen & home)');
    expect(fitBasisFor(s, null)).toContain('item has no category');
    expect(fitSourceCautions(s)[0]).toMatch(/^Borrowed fit: the floors for Garden come from shoppers asked about Kitchen & home/);
  });

  it('a pooled fit is always labelled, and says which studies it pools', () => {
    const s = fitSourceOf([kitchen, drinks], ['Household']);
    expect(s.kind).toBe('pooled');
    expect(describeFitSource(s)).toBe('Borrowed from pooled fit of “Kitchen study” (Kitchen & home), “Drinks study” (Groceries — drinks) for Household');
    expect(fitBasisFor(s, 'Household')).toBe('borrowed from pooled fit of 2 studies (Kitchen & home + Groceries — drinks)');
    expect(fitSourceCautions(s)).toHaveLength(2);
    const measured = fitSourceOf([kitchen, drinks], ['Kitchen & home']);
    expect(isBorrowed(measured)).toBe(true);
    expect(fitSourceCautions(measured)).toHaveLength(1);
    expect(fitSourceCautions(measured)[0]).toMatch(/^Pooled fit/);
  });

  it('a list without categories cannot be checked, and says so', () => {
    const s = fitSourceOf([kitchen], []);
    expect(s.listUncategorised).toBe(true);
    expect(describeFitSource(s)).toContain('no categories to check against');
  });
});
