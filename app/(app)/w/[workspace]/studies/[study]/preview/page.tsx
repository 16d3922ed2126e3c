import type { Metadata } from 'next';
import Link from 'next/link';
import { requireRole } from '@/lib/server/http/page-guard';
import { orNotFound } from '@/lib/server/http/not-found';
import { getStudy } from '@/lib/server/studies/studies';
import { getWorkspaceSettings } from '@/lib/server/team/workspaces';
import { PageTitle } from '@/components/ui/page-title';
import { RespondentPreview } from '@/respondent/client/respondent-preview';
import { messagesFor } from '@/respondent/messages/all';

export const metadata: Metadata = { title: 'Preview' };

/** The respondent's screens, driven locally: nothing is recorded and no seat is used. */
export default async function PreviewPage({ params }: { params: Promise<{ workspace: string; study: string }> }) {
  const { workspace, study: id } = await params;
  const ctx = await requireRole(workspace, 'viewer');
  const study = await orNotFound(getStudy(ctx, id));
  const settings = await getWorkspaceSettings(ctx);
  return (
    <>
      <PageTitle title={`Preview: ${study.name}`} />
      <p className="mb-4 text-sm">
        <Link href={`/w/${ctx.workspace.slug}/studies/${study.id}`}>← Back to the study</Link>
        <span className="ml-3 text-muted">Exactly what a respondent sees, on a phone-sized screen. Answers here are not recorded.</span>
      </p>
      <RespondentPreview design={study.design} messages={messagesFor(study.design.language)} workspaceRetentionDays={settings.retentionDays} pictureUrl={study.design.itemPictureId ? `/api/assets/${study.design.itemPictureId}` : null} />
    </>
  );
}
