import type { FieldworkDto } from '@/lib/server/studies/fieldwork';
import { ScrollFrame } from '@/components/ui/scroll-frame';

const pct = (f: number) => `${Math.round(f * 10_000) / 100} %`;

/**
 * Answers per cell: base prices down, rungs across (grouped by the rung each answer was drawn
 * from), with the discount actually shown under each count; catch and off-ladder (adaptive)
 * trials in their own columns.
 */
const CAPTION = 'Test trials answered per base price × rung, and below each count the discount shoppers actually saw (after rounding to the price shown). Shading grows with the count; the number is always shown.';

export function CellGrid({ data }: { data: FieldworkDto }) {
  const max = Math.max(1, ...data.cells.flat());
  const anyOff = data.offLadder.some((n) => n > 0);
  const anyCatch = data.catchTrials.some((n) => n > 0);
  return (
    <div>
      <h3 className="mb-1 text-base">Answers per cell</h3>
      <ScrollFrame label="Answers per cell" note={CAPTION}>
        <table className="table" data-testid="cell-grid">
          <caption className="sr-only">{CAPTION}</caption>
          <thead>
            <tr>
              <th scope="col">Base price</th>
              {data.ladder.map((d) => <th key={d} scope="col" className="n">{pct(d)}</th>)}
              {anyOff ? <th scope="col" className="n">Staircase (off ladder)</th> : null}
              {anyCatch ? <th scope="col" className="n">Catch</th> : null}
            </tr>
          </thead>
          <tbody>
            {data.basePrices.map((b, i) => (
              <tr key={b}>
                <th scope="row" className="num">{b}</th>
                {data.cells[i].map((n, j) => {
                  const shown = data.shown?.[i]?.[j] ?? null;
                  return (
                    <td key={j} className="n" style={{ background: n ? `rgba(15,110,110,${0.08 + 0.3 * (n / max)})` : undefined }}>
                      <span className="block" data-testid="cell-count">{n}</span>
                      {shown !== null ? <span className="block text-xs" data-testid="cell-shown">shown {pct(shown)}</span> : null}
                    </td>
                  );
                })}
                {anyOff ? <td className="n">{data.offLadder[i]}</td> : null}
                {anyCatch ? <td className="n">{data.catchTrials[i]}</td> : null}
              </tr>
            ))}
          </tbody>
        </table>
      </ScrollFrame>
    </div>
  );
}
