import type { Rng } from '@/lib/psychometrics/random';
import type { StudyDesign } from '@/lib/schemas/study.schema';
import { messagesFor } from '@/respondent/messages/all';
import type { ShelfItem } from './types';

// Variant names give each base price its own believable item on the remembered shelf
// (ordered small to large, so a dearer price reads as a bigger pack); invented filler items
// fill the shelf so that remembering it takes some effort. Both in the study's language, from
// its catalogue (respondent/messages): every language lists them in the same order, so a seed
// draws the same shelf whatever the language. The phone gets the labels in its plan; this
// module is not in the respondent bundle (only the server and the analyst's preview plan).

function pickVariants(variants: string[], n: number): string[] {
  if (n === 1) return [variants[2]];
  return Array.from({ length: n }, (_, i) => variants[Math.round((i * (variants.length - 1)) / (n - 1))]);
}

/** Spot the saving: the study's base prices as item variants plus filler items, in a shuffled order. */
export function buildShelf(design: StudyDesign, rng: Rng): ShelfItem[] {
  if (design.task !== 'spot') return [];
  const bases = design.basePrices;
  const words = messagesFor(design.language).shelfItems;
  const names = pickVariants(words.variants, bases.length);
  const items: ShelfItem[] = bases.map((b, i) => ({ label: `${design.itemName} — ${names[i]}`, price: b, base: b }));
  const lo = bases[0], hi = bases[bases.length - 1];
  const fillers = rng.shuffle([...words.fillers]).slice(0, Math.max(0, design.shelfSize - bases.length));
  for (const name of fillers) {
    // Invented prices in the same range as the study's, ending in 9 like shelf prices do.
    const raw = lo * 0.6 + rng.next() * (hi * 1.3 - lo * 0.6);
    const price = Math.max(0.09, Math.floor(raw * 10) / 10 + 0.09);
    items.push({ label: name, price: Math.round(price * 100) / 100, base: null });
  }
  return rng.shuffle(items);
}

export function shelfIndexOf(shelf: ShelfItem[], base: number): number | undefined {
  const i = shelf.findIndex((s) => s.base === base);
  return i < 0 ? undefined : i;
}
