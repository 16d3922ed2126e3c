import type { Metadata } from 'next';
import Link from 'next/link';
import { requireRole } from '@/lib/server/http/page-guard';
import { PageTitle } from '@/components/ui/page-title';
import { PRICE_LIST_MAX_ROWS } from '@/lib/schemas/price-list.schema';
import { UploadForm } from './_components/upload-form';

export const metadata: Metadata = { title: 'Upload price list' };

export default async function NewPriceListPage({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace } = await params;
  const ctx = await requireRole(workspace, 'analyst');
  return (
    <>
      <PageTitle title="Upload a price list" />
      <div className="mb-6 max-w-prose space-y-2 text-sm text-muted">
        <p>
          A CSV file whose first row is the header <code className="num text-ink">sku,name,regular_price,unit_cost,category</code>.
          SKU, name and regular price are required; unit cost (for the margin columns) and category may be empty or left out.
          Prices are plain numbers such as <span className="num">12.99</span>. Up to {PRICE_LIST_MAX_ROWS.toLocaleString('en-GB')} items and 8 MB per file.
        </p>
        <p>Nothing is stored until every row is valid. <Link href={`/w/${ctx.workspace.slug}/promotions`}>Back to promotions</Link></p>
      </div>
      <UploadForm slug={ctx.workspace.slug} />
    </>
  );
}
