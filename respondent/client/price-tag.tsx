import { formatPrice } from '@/respondent/shared/price';
import type { FlowStudy } from '@/respondent/shared/types';

/** The hero of every trial: a shelf-edge price tag, large enough to read at arm's length. */
export function PriceTag({ study, price, caption, hidden, size = 'lg' }: { study: FlowStudy; price: number; caption?: string; hidden?: boolean; size?: 'lg' | 'md' }) {
  return (
    <div className="flex flex-col items-center gap-1" data-testid="price-tag">
      <div
        className={`flex items-center justify-center rounded-sm border-2 border-ink bg-card px-4 ${size === 'lg' ? 'min-h-28 min-w-44' : 'min-h-20 min-w-32'}`}
        aria-hidden={hidden}
      >
        <span className={`num font-semibold ${size === 'lg' ? 'text-5xl' : 'text-3xl'} ${hidden ? 'invisible' : ''}`}>{formatPrice(price, study.currency, study.locale)}</span>
      </div>
      {caption ? <span className="text-base text-muted">{caption}</span> : null}
    </div>
  );
}

export const bigButton =
  'flex min-h-14 w-full items-center justify-center rounded border-2 border-teal bg-card px-4 py-3 text-lg font-semibold text-teal active:bg-teal-light disabled:opacity-50';
export const primaryButton =
  'flex min-h-14 w-full items-center justify-center rounded border-2 border-teal bg-teal px-4 py-3 text-lg font-semibold text-white active:bg-teal-dark disabled:opacity-50';
