import { describeFitSource, type FitSource } from '@/lib/promo/fit-source';
import { CAUTIONS_TITLE, POOR_FIT_WARNING, PRICE_CLAIM_CAUTIONS, STATISTICS_CAUTION } from '@/lib/promo/cautions';

/** Shown next to every promotion plan (DESIGN.md → Cautions the product shows). */
export function CautionsPanel({ compact = false, extra = [] }: { compact?: boolean; extra?: string[] }) {
  return (
    <aside aria-labelledby="cautions-title" className="card border-l-4 border-l-amber p-4 text-sm leading-relaxed" data-testid="cautions">
      <h2 id="cautions-title" className="mb-2 text-base">{CAUTIONS_TITLE}</h2>
      <ul className="list-disc space-y-2 pl-5">
        {extra.map((c) => <li key={c} className="font-semibold">{c}</li>)}
        {(compact ? PRICE_CLAIM_CAUTIONS.slice(1, 3) : PRICE_CLAIM_CAUTIONS).map((c) => <li key={c}>{c}</li>)}
        {compact ? <li>{PRICE_CLAIM_CAUTIONS[3]}</li> : <li className="text-muted">{STATISTICS_CAUTION}</li>}
      </ul>
    </aside>
  );
}

export function PoorFitBanner() {
  return (
    <div role="alert" className="card mb-4 flex gap-3 border-brick bg-brick-light p-3 text-sm">
      <span aria-hidden className="font-semibold text-brick">⚠</span>
      <p><strong>Poor fit.</strong> {POOR_FIT_WARNING}</p>
    </div>
  );
}

/** A plan whose fit is borrowed from another category, or pooled across studies, says so at the top. */
export function BorrowedFitBanner({ source }: { source: FitSource }) {
  return (
    <div role="note" className="card mb-4 flex gap-3 border-amber p-3 text-sm" data-testid="borrowed-fit">
      <span aria-hidden className="font-semibold text-amber">⇄</span>
      <p><strong>{source.borrowedFor.length ? 'Borrowed fit.' : 'Pooled fit.'}</strong> {describeFitSource(source)}.</p>
    </div>
  );
}
