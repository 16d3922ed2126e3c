import type { Metadata } from 'next';
import Link from 'next/link';
import { requireRole } from '@/lib/server/http/page-guard';
import { orNotFound } from '@/lib/server/http/not-found';
import { getStudy } from '@/lib/server/studies/studies';
import { hasRole } from '@/lib/roles';
import { isEditable } from '@/lib/study-states';
import { PageTitle } from '@/components/ui/page-title';
import { StudyStatePill } from '@/components/studies/study-state-pill';
import { StudyActions } from './_components/study-actions';
import { DesignSummary } from './_components/design-summary';
import { FieldworkMonitor } from './_components/fieldwork-monitor';
import { DeleteRespondentForm } from './_components/delete-respondent-form';

export const metadata: Metadata = { title: 'Study' };

export default async function StudyPage({ params, searchParams }: { params: Promise<{ workspace: string; study: string }>; searchParams: Promise<{ frozen?: string }> }) {
  const { workspace, study: id } = await params;
  const ctx = await requireRole(workspace, 'viewer');
  const study = await orNotFound(getStudy(ctx, id));
  const { frozen } = await searchParams;
  const base = `/w/${ctx.workspace.slug}/studies/${study.id}`;
  const analyst = hasRole(ctx.role, 'analyst');
  return (
    <>
      <PageTitle title={study.name}>
        <StudyStatePill state={study.state} />
      </PageTitle>
      {frozen && !isEditable(study.state) ? (
        <p className="card mb-4 border-amber p-3 text-sm" role="status">This study has been launched, so its design is frozen. Duplicate it to make a changed copy.</p>
      ) : null}
      <nav aria-label="Study" className="mb-6 flex flex-wrap items-center gap-2">
        {analyst && isEditable(study.state) ? <Link className="btn" href={`${base}/edit`}>Edit</Link> : null}
        <Link className="btn" href={`${base}/preview`}>Preview</Link>
        <Link className="btn" href={`${base}/links`}>Links</Link>
        {study.state !== 'draft' ? <Link className="btn" href={`${base}/results`}>Results</Link> : null}
        {analyst && (study.state === 'closed' || study.state === 'imported') ? <Link className="btn" href={`${base}/import`}>Import responses</Link> : null}
        {analyst ? <StudyActions slug={ctx.workspace.slug} studyId={study.id} state={study.state} /> : null}
      </nav>
      <div className="grid gap-6 *:min-w-0 lg:grid-cols-[1fr_20rem]">
        <FieldworkMonitor slug={ctx.workspace.slug} studyId={study.id} />
        <DesignSummary study={study} />
      </div>
      {/* A respondent's deletion request by the reference code on their thank-you screen (lib/server/studies/retention.ts). */}
      {analyst && study.state !== 'draft' ? <div className="mt-6 max-w-xl"><DeleteRespondentForm slug={ctx.workspace.slug} studyId={study.id} /></div> : null}
    </>
  );
}
