import type { Rng } from '@/lib/psychometrics/random';
import type { StudyDesign } from '@/lib/schemas/study.schema';
import type { ShelfItem } from './types';

// Variant names give each base price its own believable item on the remembered shelf
// (ordered small to large, so a dearer price reads as a bigger pack).
const VARIANTS = ['mini', 'small', 'regular', 'medium', 'large', 'extra large', 'twin pack', 'family pack', 'multipack', 'value box', 'bulk box', 'crate'];
// Invented filler items: they fill the shelf so that remembering it takes some effort.
const FILLERS = ['Oat biscuits', 'Dish brush', 'Tea towels', 'Basmati rice', 'Tealight candles', 'Olive oil', 'Storage jars', 'Peppermint tea', 'Oven gloves', 'Rye crackers', 'Laundry pegs', 'Honey'];

function pickVariants(n: number): string[] {
  if (n === 1) return ['regular'];
  return Array.from({ length: n }, (_, i) => VARIANTS[Math.round((i * (VARIANTS.length - 1)) / (n - 1))]);
}

/** Spot the saving: the study's base prices as item variants plus filler items, in a shuffled order. */
export function buildShelf(design: StudyDesign, rng: Rng): ShelfItem[] {
  if (design.task !== 'spot') return [];
  const bases = design.basePrices;
  const names = pickVariants(bases.length);
  const items: ShelfItem[] = bases.map((b, i) => ({ label: `${design.itemName} — ${names[i]}`, price: b, base: b }));
  const lo = bases[0], hi = bases[bases.length - 1];
  const fillers = rng.shuffle([...FILLERS]).slice(0, Math.max(0, design.shelfSize - bases.length));
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
