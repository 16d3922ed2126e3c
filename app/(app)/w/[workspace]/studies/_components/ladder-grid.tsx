'use client';
import { useWatch } from 'react-hook-form';
import type { PriceEnding } from '@/lib/psychometrics/promo-floor';
import { PRICE_ENDINGS, PRICE_ENDING_LABELS } from '@/lib/schemas/study.schema';
import { checkLadder, describeFix, describeIssue, type LadderFix } from '@/lib/promo/ladder-check';
import { errorAt, Field, fieldId, pct, type BuilderForm } from './form-bits';
import { ScrollFrame } from '@/components/ui/scroll-frame';

// The ladder as shoppers will see it: base price × rung, with the promo price on screen and the
// discount it actually shows, and each problem (lib/promo/ladder-check.ts) with its one-click fixes.

const positives = (xs: unknown) => (Array.isArray(xs) ? xs.map(Number).filter((x) => Number.isFinite(x) && x > 0) : []);
const shownPct = (f: number) => `${(Math.round(f * 10_000) / 100).toFixed(2)} %`;

export function LadderGrid({ form }: { form: BuilderForm }) {
  const [basesRaw, ladderRaw, endingRaw, currency, locale] = useWatch({ control: form.control, name: ['basePrices', 'ladder', 'priceEnding', 'currency', 'locale'] });
  const ending = (PRICE_ENDINGS as readonly string[]).includes(String(endingRaw)) ? (endingRaw as PriceEnding) : 'exact';
  const bases = positives(basesRaw);
  const ladder = positives(ladderRaw).filter((d) => d < 1);
  let money = (v: number) => v.toFixed(2);
  try { const f = new Intl.NumberFormat(String(locale || 'en-GB'), { style: 'currency', currency: String(currency || 'EUR') }); money = (v) => f.format(v); } catch { /* half-typed currency: plain numbers */ }
  const { grid, issues } = checkLadder(bases, ladder, ending, String(currency || 'EUR'));
  const flagged = new Set(issues.map((i) => `${i.base}|${i.rung}`));

  const apply = (fix: LadderFix) => {
    const opts = { shouldDirty: true, shouldValidate: form.formState.isSubmitted };
    if (fix.kind === 'exact') form.setValue('priceEnding', 'exact', opts);
    else if (fix.kind === 'drop-rung') form.setValue('ladder', ladder.filter((r) => r !== fix.rung), opts);
    else form.setValue('basePrices', ((basesRaw as unknown[]) ?? []).filter((b) => Number(b) !== fix.base).map(String), opts);
  };

  return (
    <div className="space-y-3">
      <Field label="Displayed-price ending" name="priceEnding" error={errorAt(form.formState.errors, 'priceEnding')}
        hint="Exact cents show each rung as closely as the currency allows. An ending is used only where it moves a rung by at most a tenth of its depth; elsewhere the exact price is shown.">
        <select id={fieldId('priceEnding')} className="input !w-64" {...form.register('priceEnding')}>
          {PRICE_ENDINGS.map((p) => <option key={p} value={p}>{PRICE_ENDING_LABELS[p]}</option>)}
        </select>
      </Field>
      {grid.length && ladder.length ? (
        <ScrollFrame label="Prices shoppers will see" className="rounded-sm border border-rule p-2" note="Prices shoppers will see: the promo price on screen and the discount it shows, per base price and rung.">
          <table className="table text-sm" data-testid="ladder-grid">
            <caption className="sr-only">Prices shoppers will see: the promo price on screen and the discount it shows, per base price and rung.</caption>
            <thead>
              <tr>
                <th scope="col">Shelf price</th>
                {ladder.map((r) => <th key={r} scope="col" className="n">{pct(r)} %</th>)}
              </tr>
            </thead>
            <tbody>
              {grid.map((row) => (
                <tr key={row[0].base}>
                  <th scope="row" className="num whitespace-nowrap">{money(row[0].base)}</th>
                  {row.map((c) => {
                    const bad = flagged.has(`${c.base}|${c.rung}`);
                    return (
                      <td key={c.rung} className={`n whitespace-nowrap ${bad ? 'bg-amber-light text-brick' : ''}`} data-flagged={bad ? 'true' : undefined}>
                        <span className="block">{money(c.price)}</span>
                        <span className={`block text-xs ${bad ? '' : 'text-muted'}`}>{bad ? <span aria-label="check this rung">▲ </span> : null}{shownPct(c.shown)}</span>
                      </td>
                    );
                  })}
                </tr>
              ))}
            </tbody>
          </table>
        </ScrollFrame>
      ) : null}
      {issues.length ? (
        <div className="rounded-sm border border-brick/40 bg-card p-3" data-testid="ladder-issues">
          <p className="font-semibold text-brick">▲ {issues.length === 1 ? 'One rung is' : `${issues.length} rungs are`} not shown as the ladder says</p>
          <ul className="mt-2 space-y-2 text-sm">
            {issues.map((i) => (
              <li key={`${i.kind}|${i.base}|${i.rung}`} className="flex flex-wrap items-center gap-2">
                <span className="min-w-0 flex-1 basis-64">{describeIssue(i, money)}</span>
                {i.fixes.map((f) => (
                  <button key={f.kind} type="button" className="btn" onClick={() => apply(f)}>{describeFix(f, money)}</button>
                ))}
              </li>
            ))}
          </ul>
        </div>
      ) : grid.length && ladder.length ? <p className="hint" data-testid="ladder-ok">✓ Every rung is shown within a tenth of its depth at every base price.</p> : null}
    </div>
  );
}
