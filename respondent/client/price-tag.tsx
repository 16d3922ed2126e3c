import { formatPrice } from '@/respondent/shared/price';
import type { FlowStudy } from '@/respondent/shared/types';

/**
 * The hero of every trial: a shelf-edge price tag, readable at arm's length but sized for a
 * phone (about a tenth of its height, never a third), so the item, the question and both
 * answers fit on one screen without scrolling.
 */
export function PriceTag({ study, price, caption, hidden, size = 'lg' }: { study: FlowStudy; price: number; caption?: string; hidden?: boolean; size?: 'lg' | 'md' }) {
  return (
    <div className="flex flex-col items-center gap-1" data-testid="price-tag">
      <div
        className={`flex items-center justify-center rounded-sm border-2 border-ink border-t-[6px] bg-card ${size === 'lg' ? 'min-w-40 px-5 py-2' : 'min-w-28 px-3 py-2'}`}
        aria-hidden={hidden}
      >
        <span className={`num font-semibold ${size === 'lg' ? 'text-4xl' : 'text-2xl'} ${hidden ? 'invisible' : ''}`}>{formatPrice(price, study.currency, study.locale)}</span>
      </div>
      {caption ? <span className="text-base text-muted">{caption}</span> : null}
    </div>
  );
}

// Answer buttons look like buttons (a raised lower edge), at least 56 px high, full width for a
// thumb; `active:` pushes them down. Both answers of a question share one look, so neither is
// suggested.
export const bigButton =
  'flex min-h-14 w-full items-center justify-center gap-3 rounded border-2 border-b-4 border-teal bg-card px-4 py-3 text-lg font-semibold text-teal hover:bg-teal-light active:translate-y-px active:border-b-2 active:bg-teal-light disabled:opacity-50';
export const primaryButton =
  'flex min-h-14 w-full items-center justify-center gap-3 rounded border-2 border-b-4 border-teal-dark bg-teal px-4 py-3 text-lg font-semibold text-white hover:bg-teal-dark active:translate-y-px active:border-b-2 active:bg-teal-dark disabled:opacity-50';

/** A key's name in a button (hidden from touch screens and from the button's accessible name). */
export function KeyHint({ k }: { k: string }) {
  return <kbd aria-hidden="true" className="num hidden rounded-sm border border-current px-1.5 text-sm font-normal opacity-80 pointer-fine:inline">{k}</kbd>;
}

/** The keys line under a screen's answers, for desktop respondents (not shown on touch screens). */
export function KeysNote({ children }: { children: React.ReactNode }) {
  return <p className="hidden text-center text-base text-muted pointer-fine:block" data-testid="keys-note">{children}</p>;
}
