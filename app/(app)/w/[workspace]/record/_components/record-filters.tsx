import type { RecordQuery } from '@/lib/schemas/record.schema';

/** The record's filters and the price to read thresholds at: a GET form, so each view has a URL. */
export function RecordFilters({ query, categories, currencies, currency, price }: { query: RecordQuery; categories: string[]; currencies: string[]; currency: string; price: number }) {
  const err = query.errors;
  return (
    <form method="get" className="card mb-6 flex flex-wrap items-end gap-3 p-3" aria-label="Filters" data-testid="record-filters">
      <label className="field min-w-[10rem] flex-1">
        <span className="text-sm font-semibold">Category</span>
        <select name="category" className="input" defaultValue={query.category ?? ''}>
          <option value="">All categories</option>
          {categories.map((c) => <option key={c} value={c}>{c}</option>)}
        </select>
      </label>
      {currencies.length > 1 ? (
        <label className="field w-28">
          <span className="text-sm font-semibold">Currency</span>
          <select name="currency" className="input" defaultValue={currency}>
            {currencies.map((c) => <option key={c} value={c}>{c}</option>)}
          </select>
        </label>
      ) : null}
      <label className="field w-40">
        <span className="text-sm font-semibold">Closed from</span>
        <input type="date" name="from" className="input" defaultValue={query.from ?? ''} aria-invalid={err.from ? true : undefined} />
        {err.from ? <span className="field-error">{err.from}</span> : null}
      </label>
      <label className="field w-40">
        <span className="text-sm font-semibold">Closed until</span>
        <input type="date" name="to" className="input" defaultValue={query.to ?? ''} aria-invalid={err.to ? true : undefined} />
        {err.to ? <span className="field-error">{err.to}</span> : null}
      </label>
      <label className="field w-36">
        <span className="text-sm font-semibold">Read thresholds at ({currency})</span>
        <input name="price" inputMode="decimal" className="input num" defaultValue={err.price ? String(query.price ?? '') : String(price)} aria-invalid={err.price ? true : undefined} />
        {err.price ? <span className="field-error">{err.price}</span> : null}
      </label>
      {query.a ? <input type="hidden" name="a" value={query.a} /> : null}
      {query.b ? <input type="hidden" name="b" value={query.b} /> : null}
      <button type="submit" className="btn btn-primary">Apply</button>
    </form>
  );
}
