import type { Metadata } from 'next';
import { redirect } from 'next/navigation';
import { requireRole } from '@/lib/server/http/page-guard';
import { orNotFound } from '@/lib/server/http/not-found';
import { getStudy } from '@/lib/server/studies/studies';
import { isEditable } from '@/lib/study-states';
import { PageTitle } from '@/components/ui/page-title';
import { StudyBuilder } from '../../_components/study-builder';

export const metadata: Metadata = { title: 'Edit study' };

export default async function EditStudyPage({ params }: { params: Promise<{ workspace: string; study: string }> }) {
  const { workspace, study: id } = await params;
  const ctx = await requireRole(workspace, 'analyst');
  const study = await orNotFound(getStudy(ctx, id));
  // A launched design is frozen: back to the overview, which offers Duplicate.
  if (!isEditable(study.state)) redirect(`/w/${ctx.workspace.slug}/studies/${study.id}?frozen=1`);
  return (
    <>
      <PageTitle title={`Edit: ${study.name}`} />
      <StudyBuilder slug={ctx.workspace.slug} studyId={study.id} initial={study.design} />
    </>
  );
}
