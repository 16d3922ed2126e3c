'use client';
import { useMemo, useState } from 'react';
import Link from 'next/link';
import { createColumnHelper, flexRender, getCoreRowModel, getFilteredRowModel, getSortedRowModel, useReactTable, type SortingState } from '@tanstack/react-table';
import type { StudySummary } from '@/lib/server/studies/studies';
import { TASK_LABELS } from '@/lib/schemas/study.schema';
import { STUDY_STATE_LABELS, type StudyStateName } from '@/lib/study-states';
import { StudyStatePill } from '@/components/studies/study-state-pill';
import { ScrollFrame } from '@/components/ui/scroll-frame';

const col = createColumnHelper<StudySummary>();
const dateFmt = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric' });

export function StudyTable({ slug, studies }: { slug: string; studies: StudySummary[] }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: 'updatedAt', desc: true }]);
  const [search, setSearch] = useState('');
  const [state, setState] = useState<StudyStateName | ''>('');
  const columns = useMemo(
    () => [
      col.accessor('name', { header: 'Name', cell: (c) => <Link href={`/w/${slug}/studies/${c.row.original.id}`}>{c.getValue()}</Link> }),
      col.accessor('category', { header: 'Category' }),
      col.accessor((s) => TASK_LABELS[s.task], { id: 'task', header: 'Task' }),
      col.accessor('state', { header: 'State', cell: (c) => <StudyStatePill state={c.getValue()} />, filterFn: 'equals' }),
      col.accessor((s) => s.completes / s.targetCompletes, {
        id: 'progress',
        header: 'Completes / target',
        cell: (c) => `${c.row.original.completes} / ${c.row.original.targetCompletes}`,
        meta: { numeric: true },
      }),
      col.accessor('updatedAt', { header: 'Updated', cell: (c) => dateFmt.format(new Date(c.getValue())), meta: { numeric: true } }),
    ],
    [slug],
  );
  // A stable filter array: a fresh one each render makes the table recompute and reset in a loop.
  const columnFilters = useMemo(() => (state ? [{ id: 'state', value: state }] : []), [state]);
  // The table instance is rebuilt on every render by design; nothing here relies on memoising it.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: studies,
    columns,
    state: { sorting, globalFilter: search, columnFilters },
    autoResetPageIndex: false,
    onSortingChange: setSorting,
    globalFilterFn: 'includesString',
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
  });
  const rows = table.getRowModel().rows;
  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-end gap-3">
        <div className="field w-64">
          <label htmlFor="study-search">Search</label>
          <input id="study-search" className="input" type="search" value={search} onChange={(e) => setSearch(e.target.value)} placeholder="Name, category or task" />
        </div>
        <div className="field w-44">
          <label htmlFor="study-state">State</label>
          <select id="study-state" className="input" value={state} onChange={(e) => setState(e.target.value as StudyStateName | '')}>
            <option value="">All states</option>
            {(['draft', 'live', 'paused', 'closed', 'imported'] as const).map((s) => <option key={s} value={s}>{STUDY_STATE_LABELS[s]}</option>)}
          </select>
        </div>
        <span className="hint pb-2" role="status">{rows.length} of {studies.length} studies</span>
      </div>
      <ScrollFrame label="Studies" className="card">
        <table className="table" data-testid="study-table">
          <thead>
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h) => {
                  const sorted = h.column.getIsSorted();
                  const numeric = (h.column.columnDef.meta as { numeric?: boolean } | undefined)?.numeric;
                  return (
                    <th key={h.id} className={numeric ? 'n' : undefined} aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none'}>
                      <button type="button" className="font-semibold" onClick={h.column.getToggleSortingHandler()}>
                        {flexRender(h.column.columnDef.header, h.getContext())}
                        <span aria-hidden="true"> {sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}</span>
                      </button>
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.id}>
                {r.getVisibleCells().map((c) => (
                  <td key={c.id} className={(c.column.columnDef.meta as { numeric?: boolean } | undefined)?.numeric ? 'n' : undefined}>
                    {flexRender(c.column.columnDef.cell, c.getContext())}
                  </td>
                ))}
              </tr>
            ))}
            {rows.length === 0 ? (
              <tr><td colSpan={columns.length} className="py-6 text-center text-muted">No study matches the search and state filter.</td></tr>
            ) : null}
          </tbody>
        </table>
      </ScrollFrame>
    </div>
  );
}
