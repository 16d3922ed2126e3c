import type { Metadata } from 'next';
import { requireRole } from '@/lib/server/http/page-guard';
import { listRecord, uncoveredCategories } from '@/lib/server/record/record';
import { categoriesOf, categoryStyle, categoryTrends, compareEntries, currenciesOf, defaultPrice, filterEntries, sameCategory } from '@/lib/record/record';
import { parseRecordQuery } from '@/lib/schemas/record.schema';
import { formatMoney } from '@/lib/money';
import { PageTitle } from '@/components/ui/page-title';
import { EmptyState } from '@/components/ui/empty-state';
import { RecordChart } from '@/components/charts/record-chart';
import { RecordTrendChart } from '@/components/charts/record-trend-chart';
import { RecordFilters } from './_components/record-filters';
import { RecordTable } from './_components/record-table';
import { StudyComparison } from './_components/study-comparison';
import { UncoveredList } from './_components/uncovered-list';
import { RefreshWhilePending } from './_components/refresh-while-pending';

export const metadata: Metadata = { title: 'Threshold record' };

// The workspace's research memory (issue 15): every closed or imported study's thresholds, from
// the cached fits (lib/server/record/record.ts), filtered by category, date and currency, read at
// one price the analyst picks, with a line per category over time and a shopper-level test
// between two studies of one category. A plain GET form drives it, so every view has a URL.

export default async function RecordPage({ params, searchParams }: { params: Promise<{ workspace: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const { workspace } = await params;
  const ctx = await requireRole(workspace, 'viewer');
  const q = parseRecordQuery(await searchParams);
  const all = await listRecord(ctx, { queueMissing: true });
  const uncovered = await uncoveredCategories(ctx, all);
  const slug = ctx.workspace.slug;
  const exportBase = `/api/w/${slug}/record`;
  const title = (
    <PageTitle title="Threshold record">
      <a className="btn" href={`${exportBase}?format=csv`} download>Record as CSV</a>
      <a className="btn" href={`${exportBase}?format=json`} download>Record as JSON</a>
    </PageTitle>
  );
  if (!all.length) {
    return (
      <>
        {title}
        <EmptyState title="Nothing in the record yet">
          When a study closes (or responses are imported), its notice thresholds join the record here, next to every other study the workspace has run.
        </EmptyState>
        <UncoveredList categories={uncovered} />
      </>
    );
  }
  const currencies = currenciesOf(all);
  const currency = q.currency && currencies.includes(q.currency) ? q.currency : currencies[0];
  const inCurrency = all.filter((e) => e.currency === currency);
  const shown = filterEntries(inCurrency, { category: q.category, from: q.from, to: q.to, currency });
  const price = q.price ?? defaultPrice(shown.length ? shown : inCurrency);
  const locale = inCurrency[0]?.locale ?? 'en-GB';
  const priceText = formatMoney(price, currency, locale);
  const categories = categoriesOf(all);
  const styles = categories.map((c) => ({ category: c, ...categoryStyle(categories, c) }));
  const ready = shown.filter((e) => e.status === 'ready');
  const points = ready.flatMap((e) => e.thresholds.filter((t) => t.amount !== null && t.amount > 0).map((t) => ({ studyId: e.studyId, basePrice: t.basePrice, amount: t.amount!, ci: t.amountCi, category: categories.find((c) => sameCategory(c, e.category))! })));
  const lines = ready.filter((e) => e.line).map((e) => ({ studyId: e.studyId, category: categories.find((c) => sameCategory(c, e.category))!, from: e.basePrices[0], to: e.basePrices[e.basePrices.length - 1], a: e.line!.a, b: e.line!.b }));
  const trends = categoryTrends(shown, price);
  const comparison = q.a && q.b ? compareEntries(inCurrency, q.a, q.b, price) : null;
  return (
    <>
      {title}
      <p className="mb-4 max-w-prose text-sm text-muted">
        What the workspace has learned: the notice thresholds of every closed or imported study, each from its own fit and its own shoppers. Thresholds are the mid-point of each study&apos;s notice curve, in money; intervals are 95 %.
      </p>
      <RefreshWhilePending pending={all.filter((e) => e.status === 'pending').length} />
      <RecordFilters query={q} categories={categoriesOf(inCurrency)} currencies={currencies} currency={currency} price={price} />
      {currencies.length > 1 ? <p className="hint mb-3">Showing studies priced in {currency}; {all.length - inCurrency.length} more in {currencies.filter((c) => c !== currency).join(', ')} (pick the currency above — money thresholds are never mixed across currencies).</p> : null}
      {shown.length === 0 ? <EmptyState title="No study matches these filters">Widen the dates or choose another category.</EmptyState> : (
        <div className="space-y-8">
          <section aria-labelledby="chart-h" className="card p-4">
            <h2 id="chart-h" className="mb-2 text-xl">Thresholds across studies</h2>
            <RecordChart points={points} lines={lines} categories={styles.filter((s) => shown.some((e) => sameCategory(e.category, s.category)))} currency={currency} />
          </section>
          <section aria-labelledby="table-h">
            <h2 id="table-h" className="mb-3 text-xl">Studies <span className="text-base font-normal text-muted">· threshold read at {priceText}</span></h2>
            <RecordTable entries={shown} price={price} slug={slug} styles={styles} />
          </section>
          <section aria-labelledby="trend-h">
            <h2 id="trend-h" className="mb-3 text-xl">Over time</h2>
            {trends.length ? (
              <div className="card p-4">
                <RecordTrendChart series={trends.map((t) => ({ category: t.category, points: t.points.map((p) => ({ studyId: p.studyId, date: p.date, amount: p.at.amount, ci: p.at.amountCi })) }))} categories={styles} currency={currency} price={priceText} />
              </div>
            ) : <p className="hint">No category in this selection was measured more than once yet; a second study of a category draws its line here.</p>}
          </section>
          <StudyComparison entries={inCurrency} categories={categoriesOf(inCurrency)} query={q} price={price} priceText={priceText} outcome={comparison} />
        </div>
      )}
      <UncoveredList categories={uncovered} />
    </>
  );
}
