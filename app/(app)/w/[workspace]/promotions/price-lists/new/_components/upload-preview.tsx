import type { PriceListPreview } from '@/lib/server/promotions/price-lists';
import { ScrollFrame } from '@/components/ui/scroll-frame';

export function UploadPreview({ preview }: { preview: PriceListPreview }) {
  return (
    <section aria-labelledby="preview-h" className="space-y-4">
      <h2 id="preview-h" className="text-xl">Preview</h2>
      {preview.valid ? (
        <p role="status" className="card border-moss bg-moss-light p-3 text-sm"><strong>✓ Ready to store:</strong> {preview.rowCount.toLocaleString('en-GB')} items, no errors.</p>
      ) : (
        <div role="alert" className="card border-brick bg-brick-light p-3 text-sm">
          <p className="mb-2"><strong>⚠ {preview.errorCount.toLocaleString('en-GB')} {preview.errorCount === 1 ? 'error' : 'errors'}</strong> — nothing will be stored until the file is fixed. Row numbers count the header as row 1.
            {preview.errorCount > preview.errors.length ? ` The first ${preview.errors.length.toLocaleString('en-GB')} are listed.` : ''}</p>
          <ul className="max-h-72 space-y-1 overflow-auto" data-testid="upload-errors">
            {preview.errors.map((e, i) => (
              <li key={i}><span className="num font-semibold">{e.row === null ? 'File' : `Row ${e.row}`}</span>{e.column ? <span className="num text-muted"> · {e.column}</span> : null}: {e.message}</li>
            ))}
          </ul>
        </div>
      )}
      {preview.preview.length ? (
        <ScrollFrame label="First rows of the price list" className="card">
          <table className="table">
            <caption className="p-2 text-left text-sm text-muted">First {preview.preview.length} valid rows of {preview.rowCount.toLocaleString('en-GB')}</caption>
            <thead><tr><th className="n">Row</th><th>SKU</th><th>Name</th><th className="n">Regular price</th><th className="n">Unit cost</th><th>Category</th></tr></thead>
            <tbody>
              {preview.preview.map((r) => (
                <tr key={r.row}>
                  <td className="n">{r.row}</td><td className="num">{r.sku}</td><td>{r.name}</td>
                  <td className="n">{r.regular_price.toFixed(2)}</td><td className="n">{r.unit_cost === null ? '—' : r.unit_cost.toFixed(2)}</td><td>{r.category ?? '—'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </ScrollFrame>
      ) : null}
    </section>
  );
}
