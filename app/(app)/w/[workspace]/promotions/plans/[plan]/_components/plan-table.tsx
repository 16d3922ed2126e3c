'use client';
import { useMemo, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { flexRender, getCoreRowModel, useReactTable, type SortingState } from '@tanstack/react-table';
import { planRowsQuery } from '@/lib/queries/promo-plans';
import { FLAG_FILTERS, FLAG_FILTER_LABELS, type FlagFilter } from '@/lib/promo/flags';
import type { SortKey } from '@/lib/promo/query-rows';
import { planColumns } from './plan-columns';
import { ScrollFrame } from '@/components/ui/scroll-frame';

const PAGE_SIZE = 100;

/** Server-paged: sorting, the flag filter and the search run on the server over every row. */
export function PlanTable({ slug, planId, currency, locale, total }: { slug: string; planId: string; currency: string; locale: string; total: number }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: 'sku', desc: false }]);
  const [flag, setFlag] = useState<FlagFilter>('all');
  const [search, setSearch] = useState('');
  const [page, setPage] = useState(0);
  const sort = (sorting[0]?.id ?? 'sku') as SortKey;
  const query = { page, pageSize: PAGE_SIZE, sort, dir: sorting[0]?.desc ? 'desc' : 'asc', flag, q: search.trim() } as const;
  const { data, isFetching, error } = useQuery(planRowsQuery(slug, planId, query));
  const columns = useMemo(() => planColumns(currency, locale), [currency, locale]);
  // TanStack Table returns fresh functions each render; the React Compiler skips this component.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: data?.rows ?? [],
    columns,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    manualFiltering: true,
    state: { sorting },
    onSortingChange: (u) => { setSorting(u); setPage(0); },
    enableSortingRemoval: false,
  });
  const matched = data?.total ?? 0;
  const pages = Math.max(1, Math.ceil(matched / PAGE_SIZE));

  return (
    <section aria-labelledby="items-h" className="space-y-3">
      <div className="flex flex-wrap items-end gap-3">
        <h2 id="items-h" className="mr-auto text-xl">Items</h2>
        <div className="field">
          <label htmlFor="plan-search">Search SKU or name</label>
          <input id="plan-search" className="input !w-56" value={search} onChange={(e) => { setSearch(e.target.value); setPage(0); }} placeholder="e.g. HL-10042 or kettle" />
        </div>
        <div className="field">
          <label htmlFor="plan-flag">Show</label>
          <select id="plan-flag" className="input" value={flag} onChange={(e) => { setFlag(e.target.value as FlagFilter); setPage(0); }}>
            {FLAG_FILTERS.map((f) => <option key={f} value={f}>{FLAG_FILTER_LABELS[f]}</option>)}
          </select>
        </div>
      </div>
      {error ? <p role="alert" className="field-error">{error.message}</p> : null}
      <ScrollFrame label="Items of the plan" className="card" innerClassName="max-h-[36rem] overflow-y-auto" testId="plan-table-frame">
        <table className="table" data-testid="plan-table" aria-busy={isFetching}>
          <thead>
            {table.getHeaderGroups().map((g) => (
              <tr key={g.id}>
                {g.headers.map((h) => {
                  const sorted = h.column.getIsSorted();
                  const numeric = (h.column.columnDef.meta as { numeric?: boolean } | undefined)?.numeric;
                  return (
                    <th key={h.id} className={`sticky top-0 z-10 bg-card align-bottom !whitespace-normal ${numeric ? 'n' : ''}`} aria-sort={sorted ? (sorted === 'asc' ? 'ascending' : 'descending') : undefined}>
                      {h.column.getCanSort() ? (
                        <button type="button" className="inline-flex items-center gap-1 font-semibold" onClick={h.column.getToggleSortingHandler()}>
                          {flexRender(h.column.columnDef.header, h.getContext())}
                          <span aria-hidden className="text-xs">{sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}</span>
                        </button>
                      ) : flexRender(h.column.columnDef.header, h.getContext())}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((r) => (
              <tr key={r.original.sku}>
                {r.getVisibleCells().map((c) => (
                  <td key={c.id} className={(c.column.columnDef.meta as { numeric?: boolean } | undefined)?.numeric ? 'n whitespace-nowrap' : undefined}>{flexRender(c.column.columnDef.cell, c.getContext())}</td>
                ))}
              </tr>
            ))}
            {data && data.rows.length === 0 ? <tr><td colSpan={columns.length} className="p-6 text-center text-muted">No item matches.</td></tr> : null}
          </tbody>
        </table>
      </ScrollFrame>
      <nav aria-label="Pages" className="flex flex-wrap items-center gap-3 text-sm">
        <button type="button" className="btn !min-h-0 !py-1" onClick={() => setPage((p) => Math.max(0, p - 1))} disabled={page === 0}>← Previous</button>
        <span className="num" role="status">Page {page + 1} of {pages} · {matched.toLocaleString('en-GB')} matching of {total.toLocaleString('en-GB')} items{isFetching ? ' · loading…' : ''}</span>
        <button type="button" className="btn !min-h-0 !py-1" onClick={() => setPage((p) => Math.min(pages - 1, p + 1))} disabled={page >= pages - 1}>Next →</button>
      </nav>
    </section>
  );
}
