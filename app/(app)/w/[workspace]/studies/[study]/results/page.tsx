import type { Metadata } from 'next';
import Link from 'next/link';
import { connection } from 'next/server';
import { PageTitle } from '@/components/ui/page-title';
import { requireRole } from '@/lib/server/http/page-guard';
import { orNotFound } from '@/lib/server/http/not-found';
import { getStudyInfo } from '@/lib/server/analysis/cells';
import { hasRole } from '@/lib/roles';
import { ResultsView } from './_components/results-view';

export const metadata: Metadata = { title: 'Results' };

export default async function ResultsPage({ params }: { params: Promise<{ workspace: string; study: string }> }) {
  await connection();
  const { workspace, study: studyId } = await params;
  const ctx = await requireRole(workspace, 'viewer');
  const study = await orNotFound(getStudyInfo(ctx, studyId));
  const canEdit = hasRole(ctx.role, 'analyst');
  const href = `/w/${ctx.workspace.slug}/studies/${study.id}`;
  return (
    <>
      <p className="mb-1 text-sm"><Link href={href}>← {study.name}</Link></p>
      <PageTitle title={`Results: ${study.name}`}>
        {canEdit && (study.state === 'closed' || study.state === 'imported') ? <Link className="btn" href={`${href}/import`}>Import responses</Link> : null}
      </PageTitle>
      <ResultsView slug={ctx.workspace.slug} studyId={study.id} canEdit={canEdit} segmentQuestions={study.segmentQuestions} />
    </>
  );
}
