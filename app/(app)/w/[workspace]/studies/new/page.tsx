import type { Metadata } from 'next';
import { requireRole } from '@/lib/server/http/page-guard';
import { newStudyDefaults, randomSeed } from '@/lib/study-defaults';
import { PageTitle } from '@/components/ui/page-title';
import { StudyBuilder } from '../_components/study-builder';

export const metadata: Metadata = { title: 'New study' };

export default async function NewStudyPage({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace } = await params;
  const ctx = await requireRole(workspace, 'analyst');
  return (
    <>
      <PageTitle title="New study" />
      <StudyBuilder slug={ctx.workspace.slug} initial={newStudyDefaults(randomSeed())} />
    </>
  );
}
