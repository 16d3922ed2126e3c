import type { Metadata } from 'next';
import { PageTitle } from '@/components/ui/page-title';
import { requireRole } from '@/lib/server/http/page-guard';
import { ImportForm } from '../[study]/import/_components/import-form';

export const metadata: Metadata = { title: 'Import responses into a new study' };

/** A study of state "imported" made from a minimal design and the uploaded responses. */
export default async function NewImportPage({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace } = await params;
  const ctx = await requireRole(workspace, 'analyst');
  return (
    <>
      <PageTitle title="Import responses into a new study" />
      <ImportForm action={`/api/w/${ctx.workspace.slug}/imports`} resultsHref={`/w/${ctx.workspace.slug}/studies/STUDY/results`} basePrices={null} newStudy />
    </>
  );
}
