import Link from 'next/link';
import { formatMoney } from '@/lib/money';
import { sameCategory, thresholdAt, type CategoryShape, type RecordEntry } from '@/lib/record/record';
import { CategoryMark } from '@/components/charts/category-mark';

const day = (iso: string) => new Date(iso).toLocaleDateString('en-GB', { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' });
const num = (v: number, d = 2) => v.toFixed(d);

/** One row per study: what it measured, its Weber slope and its threshold at the picked price. */
export function RecordTable({ entries, price, slug, styles }: { entries: RecordEntry[]; price: number; slug: string; styles: { category: string; colour: string; shape: CategoryShape }[] }) {
  return (
    <div className="card overflow-x-auto">
      <table className="table" data-testid="record-table">
        <thead>
          <tr>
            <th>Category</th><th>Study</th><th>Closed</th><th className="n">Base prices</th><th className="n">Respondents</th>
            <th className="n">Weber slope</th><th className="n">Threshold at {formatMoney(price, entries[0]?.currency ?? 'EUR', entries[0]?.locale)}</th>
          </tr>
        </thead>
        <tbody>
          {entries.map((e) => {
            const st = styles.find((s) => sameCategory(s.category, e.category));
            const at = thresholdAt(e, price);
            const m = (v: number) => formatMoney(v, e.currency, e.locale);
            return (
              <tr key={e.studyId}>
                <td className="whitespace-nowrap">
                  {st ? <svg width={12} height={12} aria-hidden="true" className="mr-1.5 inline-block align-[-1px]"><CategoryMark shape={st.shape} colour={st.colour} x={6} y={6} size={5} /></svg> : null}
                  {e.category}
                </td>
                <td className="min-w-[12rem]">
                  <Link href={`/w/${slug}/studies/${e.studyId}/results`}>{e.name}</Link>
                  {e.state === 'imported' ? <span className="hint"> · imported</span> : null}
                  {e.poorFit ? <span className="pill ml-2 text-brick">⚠ poor fit</span> : null}
                </td>
                <td className="whitespace-nowrap">{day(e.date)}</td>
                <td className="n whitespace-nowrap">{m(e.basePrices[0])} – {m(e.basePrices[e.basePrices.length - 1])}</td>
                <td className="n">{e.respondents ?? '—'}{e.unit === 'trial' ? <span className="hint"> (no shopper ids)</span> : null}</td>
                {e.status !== 'ready' ? <td colSpan={2} className="hint">{e.message}</td> : (
                  <>
                    <td className="n whitespace-nowrap">{e.weberSlope === null ? <span className="hint">one base price: no slope</span> : <>{num(e.weberSlope)}{e.weberSlopeCi ? <span className="hint block">{num(e.weberSlopeCi[0])} to {num(e.weberSlopeCi[1])}</span> : null}</>}</td>
                    <td className="n whitespace-nowrap">
                      {at ? <>{at.extrapolated ? <span className="pill mr-2" title="Outside the base prices this study tested: read off its Weber line">extrapolated</span> : null}{m(at.amount)}{at.amountCi ? <span className="hint block">{m(at.amountCi[0])} to {m(at.amountCi[1])}</span> : null}</> : <span className="hint">no Weber line with intervals</span>}
                    </td>
                  </>
                )}
              </tr>
            );
          })}
        </tbody>
      </table>
      <p className="hint px-3 py-2">Under each number: its 95 % interval. The threshold at the picked price is read off each study&apos;s Weber line (power model).</p>
    </div>
  );
}
