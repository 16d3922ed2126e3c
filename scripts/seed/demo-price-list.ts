// The demo workspace's price list: about 200 INVENTED items for the fictional Harbourline
// chain (kitchen & home goods and groceries). SKUs, names, prices and unit costs are made up
// for the demo; they describe no real retailer or product. The e2e upload test uses the same
// rows as CSV (tests/fixtures/demo-price-list.csv, checked against this module by a unit test).
import type { EntityManager } from '@mikro-orm/postgresql';
import { PriceList } from '@/entities/price-list';
import { insertPriceListItems } from '@/lib/server/promotions/price-list-items';
import { toCsv } from '@/lib/csv';
import { createRng } from '@/lib/psychometrics/random';

export const DEMO_PRICE_LIST_NAME = 'Harbourline spring range (demo)';
export const DEMO_PRICE_LIST_CURRENCY = 'EUR';

interface Family { category: string; name: string; variants: [string, number][]; costShare: number }

// [variant label, regular price]; cost shares are invented rough grocery / home-goods margins.
const FAMILIES: Family[] = [
  { category: 'Groceries — pantry', name: 'Sea salt', variants: [['250 g', 0.89], ['500 g', 1.39], ['1 kg', 2.29], ['coarse 750 g', 2.69]], costShare: 0.55 },
  { category: 'Groceries — pantry', name: 'Harbour oats', variants: [['500 g', 1.19], ['1 kg', 1.99], ['jumbo 1 kg', 2.49], ['organic 750 g', 3.29]], costShare: 0.6 },
  { category: 'Groceries — pantry', name: 'Basmati rice', variants: [['500 g', 1.79], ['1 kg', 2.99], ['2 kg', 5.49], ['5 kg', 11.99]], costShare: 0.62 },
  { category: 'Groceries — pantry', name: 'Olive oil, extra virgin', variants: [['250 ml', 3.49], ['500 ml', 5.99], ['750 ml', 8.49], ['3 l tin', 27.9]], costShare: 0.66 },
  { category: 'Groceries — pantry', name: 'Pasta, bronze cut', variants: [['spaghetti 500 g', 1.49], ['penne 500 g', 1.49], ['fusilli 500 g', 1.49], ['lasagne 500 g', 1.89]], costShare: 0.5 },
  { category: 'Groceries — pantry', name: 'Tinned tomatoes', variants: [['400 g', 0.99], ['4 × 400 g', 3.49], ['passata 700 g', 1.69], ['cherry 400 g', 1.59]], costShare: 0.58 },
  { category: 'Groceries — drinks', name: 'Quayside coffee beans', variants: [['250 g', 5.49], ['500 g', 9.99], ['1 kg', 17.99], ['decaf 250 g', 5.99]], costShare: 0.52 },
  { category: 'Groceries — drinks', name: 'Black tea', variants: [['40 bags', 2.29], ['80 bags', 3.99], ['loose 250 g', 4.49], ['earl grey 80 bags', 4.29]], costShare: 0.48 },
  { category: 'Groceries — drinks', name: 'Sparkling water', variants: [['1.5 l', 0.95], ['6 × 1.5 l', 4.99], ['lemon 1.5 l', 1.09], ['glass 12 × 0.33 l', 7.99]], costShare: 0.45 },
  { category: 'Groceries — drinks', name: 'Apple juice, cloudy', variants: [['1 l', 1.99], ['3 l box', 5.49], ['6 × 0.2 l', 2.79], ['organic 1 l', 2.69]], costShare: 0.6 },
  { category: 'Groceries — dairy', name: 'Farmhouse butter', variants: [['250 g', 2.59], ['salted 250 g', 2.59], ['500 g', 4.79], ['spreadable 400 g', 3.69]], costShare: 0.7 },
  { category: 'Groceries — dairy', name: 'Mature cheddar', variants: [['200 g', 2.99], ['400 g', 5.29], ['grated 200 g', 2.79], ['extra mature 350 g', 4.99]], costShare: 0.64 },
  { category: 'Groceries — dairy', name: 'Greek-style yoghurt', variants: [['500 g', 1.89], ['1 kg', 3.29], ['honey 4 × 125 g', 2.49], ['0 % fat 500 g', 1.99]], costShare: 0.57 },
  { category: 'Groceries — bakery', name: 'Sourdough loaf', variants: [['white 800 g', 3.49], ['rye 800 g', 3.79], ['seeded 800 g', 3.99], ['mini 400 g', 1.99]], costShare: 0.42 },
  { category: 'Groceries — bakery', name: 'Butter croissants', variants: [['4 pack', 2.49], ['8 pack', 4.29], ['almond 2 pack', 2.99], ['mini 12 pack', 3.49]], costShare: 0.4 },
  { category: 'Groceries — snacks', name: 'Dark chocolate 70 %', variants: [['100 g', 1.99], ['sea salt 100 g', 2.19], ['orange 100 g', 2.19], ['gift box 400 g', 12.99]], costShare: 0.5 },
  { category: 'Groceries — snacks', name: 'Salted almonds', variants: [['150 g', 2.79], ['300 g', 4.99], ['smoked 150 g', 2.99], ['unsalted 500 g', 7.49]], costShare: 0.6 },
  { category: 'Household', name: 'Dish soap', variants: [['500 ml', 1.49], ['1 l', 2.49], ['refill 5 l', 9.99], ['sensitive 500 ml', 1.79]], costShare: 0.45 },
  { category: 'Household', name: 'Laundry liquid', variants: [['25 washes', 5.99], ['50 washes', 10.49], ['colour 25 washes', 5.99], ['eco 40 washes', 9.49]], costShare: 0.55 },
  { category: 'Household', name: 'Kitchen roll', variants: [['2 rolls', 2.19], ['4 rolls', 3.99], ['8 rolls', 6.99], ['recycled 4 rolls', 4.29]], costShare: 0.6 },
  { category: 'Household', name: 'Beeswax wraps', variants: [['set of 3', 12.99], ['large', 7.99], ['bread wrap', 9.99], ['family set of 7', 24.99]], costShare: 0.35 },
  { category: 'Kitchen — tools', name: 'Wooden spoon', variants: [['beech 30 cm', 3.49], ['olive wood 30 cm', 8.99], ['set of 3', 9.99], ['slotted', 4.49]], costShare: 0.38 },
  { category: 'Kitchen — tools', name: 'Silicone spatula', variants: [['small', 4.99], ['large', 6.99], ['set of 3', 13.99], ['heat-proof pro', 9.99]], costShare: 0.33 },
  { category: 'Kitchen — tools', name: 'Chef’s knife', variants: [['15 cm', 24.99], ['20 cm', 39], ['Damascus 20 cm', 129], ['santoku 18 cm', 44.99]], costShare: 0.42 },
  { category: 'Kitchen — tools', name: 'Knife block set', variants: [['5 pieces', 79], ['7 pieces', 129], ['magnetic 6 pieces', 149], ['professional 8 pieces', 299]], costShare: 0.45 },
  { category: 'Kitchen — tools', name: 'Chopping board', variants: [['bamboo small', 9.99], ['bamboo large', 19.99], ['end-grain oak', 69], ['set of 3 plastic', 14.99]], costShare: 0.4 },
  { category: 'Kitchen — tools', name: 'Digital kitchen scale', variants: [['5 kg', 17.99], ['10 kg', 24.99], ['glass top', 29.99], ['pocket 500 g', 12.99]], costShare: 0.47 },
  { category: 'Kitchen — cookware', name: 'Non-stick frying pan', variants: [['20 cm', 19.99], ['24 cm', 27.99], ['28 cm', 34.99], ['induction 28 cm', 44.99]], costShare: 0.44 },
  { category: 'Kitchen — cookware', name: 'Cast iron casserole', variants: [['20 cm', 69], ['24 cm', 99], ['28 cm', 139], ['oval 31 cm', 179]], costShare: 0.48 },
  { category: 'Kitchen — cookware', name: 'Stainless saucepan set', variants: [['3 pieces', 59], ['5 pieces', 99], ['copper base 5 pieces', 249], ['starter 2 pieces', 39]], costShare: 0.46 },
  { category: 'Kitchen — cookware', name: 'Baking tray', variants: [['small', 7.99], ['large', 11.99], ['perforated', 14.99], ['set of 3', 24.99]], costShare: 0.4 },
  { category: 'Kitchen — cookware', name: 'Ceramic baking dish', variants: [['20 cm', 14.99], ['26 cm', 21.99], ['32 cm', 29.99], ['set of 3', 49]], costShare: 0.43 },
  { category: 'Kitchen — appliances', name: 'Electric kettle', variants: [['1.7 l', 29.99], ['glass 1.7 l', 39], ['variable temperature', 69], ['travel 0.5 l', 19.99]], costShare: 0.55 },
  { category: 'Kitchen — appliances', name: 'Toaster', variants: [['2 slice', 29.99], ['4 slice', 49], ['long slot', 54.99], ['retro 2 slice', 69]], costShare: 0.55 },
  { category: 'Kitchen — appliances', name: 'Hand blender', variants: [['basic', 24.99], ['with whisk', 39], ['cordless', 79], ['pro set', 99]], costShare: 0.56 },
  { category: 'Kitchen — appliances', name: 'Stand mixer', variants: [['4 l', 149], ['5 l', 249], ['5 l with glass bowl', 329], ['professional 6.9 l', 549]], costShare: 0.6 },
  { category: 'Kitchen — appliances', name: 'Espresso machine', variants: [['pump 15 bar', 129], ['bean to cup', 449], ['dual boiler', 899], ['capsule', 79]], costShare: 0.62 },
  { category: 'Kitchen — appliances', name: 'Air fryer', variants: [['3.5 l', 69], ['5.5 l', 99], ['dual basket 8 l', 159], ['oven style 12 l', 189]], costShare: 0.58 },
  { category: 'Kitchen — appliances', name: 'Food processor', variants: [['compact', 59], ['family 3 l', 119], ['with spiraliser', 169], ['chef 4.5 l', 299]], costShare: 0.57 },
  { category: 'Tableware', name: 'Stoneware dinner plate', variants: [['single', 6.99], ['set of 4', 24.99], ['set of 6', 34.99], ['side plate set of 4', 17.99]], costShare: 0.36 },
  { category: 'Tableware', name: 'Drinking glasses', variants: [['set of 4', 9.99], ['set of 6', 13.99], ['wine set of 4', 19.99], ['crystal set of 6', 59]], costShare: 0.38 },
  { category: 'Tableware', name: 'Cutlery set', variants: [['16 pieces', 29.99], ['24 pieces', 44.99], ['matte black 24 pieces', 69], ['gift 48 pieces', 139]], costShare: 0.4 },
  { category: 'Tableware', name: 'Linen tablecloth', variants: [['140 × 180 cm', 34.99], ['140 × 240 cm', 44.99], ['round 180 cm', 39], ['napkins set of 4', 19.99]], costShare: 0.37 },
  { category: 'Home — storage', name: 'Glass storage jar', variants: [['0.5 l', 4.99], ['1 l', 6.99], ['2 l', 9.99], ['set of 3', 17.99]], costShare: 0.39 },
  { category: 'Home — storage', name: 'Food container set', variants: [['5 pieces', 12.99], ['10 pieces', 21.99], ['glass 8 pieces', 34.99], ['lunch box', 8.99]], costShare: 0.41 },
  { category: 'Home — textiles', name: 'Cotton tea towels', variants: [['set of 2', 6.99], ['set of 4', 11.99], ['waffle set of 3', 12.99], ['linen single', 8.99]], costShare: 0.35 },
  { category: 'Home — textiles', name: 'Oven gloves', variants: [['single', 7.99], ['double', 12.99], ['silicone pair', 16.99], ['apron and glove set', 24.99]], costShare: 0.36 },
  { category: 'Home — furniture', name: 'Oak bar stool', variants: [['65 cm', 119], ['75 cm', 129], ['upholstered', 179], ['set of 2', 229]], costShare: 0.5 },
  { category: 'Home — furniture', name: 'Kitchen trolley', variants: [['compact', 89], ['with drawers', 159], ['oak top', 249], ['butcher block', 389]], costShare: 0.52 },
  { category: 'Home — furniture', name: 'Dining table', variants: [['4 seats', 399], ['6 seats', 649], ['extendable 8 seats', 849], ['round 4 seats', 449]], costShare: 0.55 },
];

export interface DemoPriceListRow { sku: string; name: string; regularPrice: number; unitCost: number | null; category: string }

/** The items, in a fixed order with fixed invented costs (seeded), so every run agrees. */
export function demoPriceListRows(): DemoPriceListRow[] {
  const rng = createRng('harbourline-demo-price-list');
  const out: DemoPriceListRow[] = [];
  let sku = 10001;
  for (const f of FAMILIES) {
    for (const [variant, price] of f.variants) {
      const jitter = 0.85 + rng.next() * 0.3;
      // About one item in ten has no cost on file, as on real lists that mix own and vendor data.
      const hasCost = rng.next() > 0.1;
      out.push({
        sku: `HL-${sku++}`, name: `${f.name}, ${variant}`, regularPrice: price,
        unitCost: hasCost ? Math.round(price * f.costShare * jitter * 100) / 100 : null, category: f.category,
      });
    }
  }
  return out;
}

export function demoPriceListCsv(): string {
  return toCsv(['sku', 'name', 'regular_price', 'unit_cost', 'category'], demoPriceListRows().map((r) => [r.sku, r.name, r.regularPrice, r.unitCost, r.category]));
}

/** Idempotent: a list with this name in the workspace is kept as it is. */
export async function seedDemoPriceList(db: EntityManager, workspaceId: string): Promise<void> {
  if (await db.count(PriceList, { workspace: workspaceId, name: DEMO_PRICE_LIST_NAME })) return;
  const rows = demoPriceListRows();
  await db.transactional(async (tx) => {
    const list = tx.create(PriceList, { workspace: workspaceId, name: DEMO_PRICE_LIST_NAME, currency: DEMO_PRICE_LIST_CURRENCY, itemCount: rows.length, createdBy: null });
    await tx.flush();
    await insertPriceListItems(tx, list.id, rows.map((r, i) => ({ ...r, row: i + 2 })));
  });
}
