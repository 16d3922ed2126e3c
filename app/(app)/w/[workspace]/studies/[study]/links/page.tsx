import type { Metadata } from 'next';
import Link from 'next/link';
import { requireRole } from '@/lib/server/http/page-guard';
import { orNotFound } from '@/lib/server/http/not-found';
import { getStudy } from '@/lib/server/studies/studies';
import { listLinks } from '@/lib/server/studies/respondent-links';
import { hasRole } from '@/lib/roles';
import { PageTitle } from '@/components/ui/page-title';
import { StudyStatePill } from '@/components/studies/study-state-pill';
import { LinksManager } from './_components/links-manager';

export const metadata: Metadata = { title: 'Respondent links' };

export default async function LinksPage({ params }: { params: Promise<{ workspace: string; study: string }> }) {
  const { workspace, study: id } = await params;
  const ctx = await requireRole(workspace, 'viewer');
  const study = await orNotFound(getStudy(ctx, id));
  const links = await listLinks(ctx, study.id);
  return (
    <>
      <PageTitle title={`Links: ${study.name}`}>
        <StudyStatePill state={study.state} />
      </PageTitle>
      <p className="mb-4 text-sm">
        <Link href={`/w/${ctx.workspace.slug}/studies/${study.id}`}>← Back to the study</Link>
        {study.state === 'draft' ? <span className="ml-3 text-muted">Links work once the study is launched.</span> : null}
      </p>
      <LinksManager slug={ctx.workspace.slug} studyId={study.id} studyState={study.state} initial={links} canManage={hasRole(ctx.role, 'analyst') && study.state !== 'closed'} />
    </>
  );
}
