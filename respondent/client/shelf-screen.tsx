import { formatPrice } from '@/respondent/shared/price';
import type { FlowStudy } from '@/respondent/shared/types';
import { primaryButton } from './price-tag';

/** Spot the saving: the remembered shelf of regular prices, shown first and again between blocks. */
export function ShelfScreen({ study, shelf, again, onDone }: { study: FlowStudy; shelf: { label: string; price: number }[]; again: boolean; onDone: () => void }) {
  return (
    <div className="flex flex-col gap-5" data-testid="shelf">
      <h1 className="text-2xl">{again ? 'A quick look at the shelf again' : 'Remember these prices'}</h1>
      <p className="text-lg">These are the usual prices at this store. Take a moment to remember them; they will not be shown next to the questions.</p>
      <ul className="flex flex-col divide-y divide-rule border-y border-rule">
        {shelf.map((s) => (
          <li key={s.label} className="flex items-baseline justify-between gap-3 py-3 text-lg">
            <span>{s.label}</span>
            <span className="num font-semibold">{formatPrice(s.price, study.currency, study.locale)}</span>
          </li>
        ))}
      </ul>
      <button type="button" className={primaryButton} onClick={onDone}>I have looked at them</button>
    </div>
  );
}
