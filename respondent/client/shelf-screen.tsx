import { formatPrice } from '@/respondent/shared/price';
import type { FlowStudy } from '@/respondent/shared/types';
import type { Messages } from '@/respondent/messages/format';
import { primaryButton } from './price-tag';

/** Spot the saving: the remembered shelf of regular prices, shown first and again between blocks. */
export function ShelfScreen({ m, study, shelf, again, onDone }: { m: Messages; study: FlowStudy; shelf: { label: string; price: number }[]; again: boolean; onDone: () => void }) {
  return (
    <div className="flex flex-col gap-5" data-testid="shelf">
      <h1 className="text-2xl">{again ? m.shelf.titleAgain : m.shelf.title}</h1>
      <p className="text-lg">{m.shelf.text}</p>
      <ul className="flex flex-col divide-y divide-rule border-y border-rule">
        {shelf.map((s) => (
          <li key={s.label} className="flex items-baseline justify-between gap-3 py-3 text-lg">
            <span>{s.label}</span>
            <span className="num font-semibold">{formatPrice(s.price, study.currency, study.locale)}</span>
          </li>
        ))}
      </ul>
      <button type="button" className={primaryButton} onClick={onDone}>{m.shelf.done}</button>
    </div>
  );
}
