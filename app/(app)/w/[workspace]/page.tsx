import type { Metadata } from 'next';
import Link from 'next/link';
import { requireRole } from '@/lib/server/http/page-guard';
import { listStudies } from '@/lib/server/studies/studies';
import { hasRole } from '@/lib/roles';
import { PageTitle } from '@/components/ui/page-title';
import { EmptyState } from '@/components/ui/empty-state';
import { StudyTable } from './_components/study-table';

export const metadata: Metadata = { title: 'Studies' };

export default async function StudiesPage({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace } = await params;
  const ctx = await requireRole(workspace, 'viewer');
  const studies = await listStudies(ctx);
  const canBuild = hasRole(ctx.role, 'analyst');
  return (
    <>
      <PageTitle title="Studies">
        {canBuild ? (
          <>
            <Link href={`/w/${ctx.workspace.slug}/studies/import`} className="btn">Import responses</Link>
            <Link href={`/w/${ctx.workspace.slug}/studies/new`} className="btn btn-primary">New study</Link>
          </>
        ) : null}
      </PageTitle>
      {studies.length === 0 ? (
        <EmptyState title="No studies yet">
          A study measures, at several regular prices, how deep a discount must be before shoppers notice it.
          {canBuild ? ' Start one with “New study”.' : ' An analyst in this workspace can start one.'}
        </EmptyState>
      ) : (
        <StudyTable slug={ctx.workspace.slug} studies={studies} />
      )}
    </>
  );
}
