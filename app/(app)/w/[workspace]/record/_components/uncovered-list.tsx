import type { UncoveredCategory } from '@/lib/record/record';

/** Categories on the uploaded price lists that no closed or imported study measured. */
export function UncoveredList({ categories }: { categories: UncoveredCategory[] }) {
  return (
    <section aria-labelledby="uncovered-h" className="mt-8">
      <h2 id="uncovered-h" className="mb-2 text-xl">Not measured yet</h2>
      {categories.length === 0 ? <p className="hint">Every category on the uploaded price lists has at least one study in the record (or the lists carry no category column).</p> : (
        <>
          <p className="mb-3 max-w-prose text-sm text-muted">Categories on your price lists that no study has measured. A promotion plan for them borrows another category&apos;s fit, and says so.</p>
          <ul className="card divide-y divide-rule" data-testid="uncovered-categories">
            {categories.map((c) => (
              <li key={c.category} className="flex flex-wrap items-baseline justify-between gap-2 px-3 py-2 text-sm">
                <span className="font-semibold">{c.category}</span>
                <span className="text-muted">{c.items} item{c.items === 1 ? '' : 's'} on {c.priceLists.join(', ')}{c.inProgress.length ? ` · being measured: ${c.inProgress.join(', ')}` : ''}</span>
              </li>
            ))}
          </ul>
        </>
      )}
    </section>
  );
}
