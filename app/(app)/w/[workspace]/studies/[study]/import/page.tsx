import type { Metadata } from 'next';
import Link from 'next/link';
import { connection } from 'next/server';
import { PageTitle } from '@/components/ui/page-title';
import { requireRole } from '@/lib/server/http/page-guard';
import { orNotFound } from '@/lib/server/http/not-found';
import { getStudyInfo } from '@/lib/server/analysis/cells';
import { ImportForm } from './_components/import-form';

export const metadata: Metadata = { title: 'Import responses' };

export default async function ImportPage({ params }: { params: Promise<{ workspace: string; study: string }> }) {
  await connection();
  const { workspace, study: studyId } = await params;
  const ctx = await requireRole(workspace, 'analyst');
  const study = await orNotFound(getStudyInfo(ctx, studyId));
  const open = study.state === 'closed' || study.state === 'imported';
  return (
    <>
      <p className="mb-1 text-sm"><Link href={`/w/${ctx.workspace.slug}/studies/${study.id}`}>← {study.name}</Link></p>
      <PageTitle title={`Import responses: ${study.name}`} />
      {open ? (
        <ImportForm action={`/api/w/${ctx.workspace.slug}/studies/${study.id}/import`} resultsHref={`/w/${ctx.workspace.slug}/studies/${study.id}/results`} basePrices={study.state === 'closed' ? study.basePrices : null} />
      ) : (
        <p className="card p-4 text-sm">Responses can be imported into a closed study or into a new study made for the import. <Link href={`/w/${ctx.workspace.slug}/studies/import`}>Import into a new study</Link>.</p>
      )}
    </>
  );
}
