import type { FieldworkDto } from '@/lib/server/studies/fieldwork';

/** Answers per cell: base prices down, rungs across; catch and off-ladder trials in their own columns. */
export function CellGrid({ data }: { data: FieldworkDto }) {
  const max = Math.max(1, ...data.cells.flat());
  const anyOff = data.offLadder.some((n) => n > 0);
  return (
    <div>
      <h3 className="mb-1 text-base">Answers per cell</h3>
      <div className="overflow-x-auto">
        <table className="table" data-testid="cell-grid">
          <caption className="hint mb-1 text-left">Test trials answered per base price × rung; shading grows with the count, the number is always shown.</caption>
          <thead>
            <tr>
              <th>Base price</th>
              {data.ladder.map((d) => <th key={d} className="n">{Math.round(d * 1000) / 10} %</th>)}
              {anyOff ? <th className="n">Off ladder</th> : null}
              <th className="n">Catch</th>
            </tr>
          </thead>
          <tbody>
            {data.basePrices.map((b, i) => (
              <tr key={b}>
                <th scope="row" className="num">{b}</th>
                {data.cells[i].map((n, j) => (
                  <td key={j} className="n" style={{ background: n ? `rgba(15,110,110,${0.08 + 0.3 * (n / max)})` : undefined }}>{n}</td>
                ))}
                {anyOff ? <td className="n">{data.offLadder[i]}</td> : null}
                <td className="n">{data.catchTrials[i]}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
