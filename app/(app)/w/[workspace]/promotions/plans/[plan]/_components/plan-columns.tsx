import { createColumnHelper } from '@tanstack/react-table';
import type { FloorRow } from '@/lib/promo/floor-table';
import { FLAGS, rowFlags } from '@/lib/promo/flags';
import { formatMoney } from '@/lib/money';
import { formatPct } from '@/lib/promo/format';

const col = createColumnHelper<FloorRow>();
const numeric = { numeric: true };

/** Headers carry their units; flags are a shape plus a word, never colour alone. */
export function planColumns(currency: string, locale: string) {
  const money = (v: number | null) => formatMoney(v, currency, locale);
  return [
    col.accessor('sku', { header: 'SKU', cell: (c) => <span className="num whitespace-nowrap">{c.getValue()}</span> }),
    col.accessor('name', { header: 'Name', cell: (c) => <span className="inline-block min-w-36">{c.getValue()}</span> }),
    col.accessor('category', { header: 'Category', cell: (c) => c.getValue() ?? '—' }),
    col.accessor('regularPrice', { header: `Regular price (${currency})`, cell: (c) => money(c.getValue()), meta: numeric }),
    col.accessor('floorFraction', {
      header: `Promo floor (% off · ${currency} off)`,
      cell: (c) => {
        const r = c.row.original;
        if (r.bound) return <span className="text-xs">{r.bound.kind === 'above' ? `above the deepest rung (> ${formatPct(r.bound.fraction)})` : `below the shallowest rung (< ${formatPct(r.bound.fraction)})`}</span>;
        return <><span className="block">{formatPct(r.floorFraction)}</span><span className="block text-xs text-muted">{money(r.floorAmount)}</span></>;
      },
      meta: numeric,
    }),
    col.accessor('promoPrice', { header: `Promo price (${currency})`, cell: (c) => <span className="font-semibold">{money(c.getValue())}</span>, meta: numeric }),
    col.accessor('discountAfterEnding', { header: 'Discount given (% off)', cell: (c) => formatPct(c.getValue()), meta: numeric }),
    col.accessor('marginBefore', { header: `Margin before (${currency}/unit)`, cell: (c) => money(c.getValue()), meta: numeric }),
    col.accessor('marginAfter', {
      header: `Margin after (${currency}/unit)`,
      cell: (c) => { const v = c.getValue(); return <span className={v !== null && v < 0 ? 'text-brick' : undefined}>{money(v)}</span>; },
      meta: numeric,
    }),
    col.display({
      id: 'flags',
      header: 'Flags',
      cell: (c) => (
        <span className="flex min-w-32 flex-wrap gap-1">
          {rowFlags(c.row.original).map((k) => (
            <span key={k} className={`pill whitespace-nowrap ${k === 'outsideRange' ? 'text-amber' : 'text-brick'}`} title={FLAGS[k].explain}>
              <span aria-hidden>{FLAGS[k].mark}</span>{FLAGS[k].label}
            </span>
          ))}
        </span>
      ),
    }),
  ];
}
