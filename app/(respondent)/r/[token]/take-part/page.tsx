import { cookies } from 'next/headers';
import { notFound } from 'next/navigation';
import { connection } from 'next/server';
import { em } from '@/lib/server/db';
import { linkRefusal, loadLink, resumeCookieName } from '@/lib/server/respondent-links';
import { findByResume, stateOf } from '@/lib/server/respondents';
import { openForNewRespondents } from '@/lib/server/seat-use';
import { flowStudy } from '@/lib/respondent/screens';
import { LiveFlow } from './_components/live-flow';

export const metadata = { title: 'Price survey' };

function Notice({ title, message, code }: { title: string; message: string; code: string }) {
  return (
    <div className="flex flex-col gap-4 py-10 text-center" data-testid="stopped" data-code={code}>
      <h1 className="text-3xl">{title}</h1>
      <p className="text-lg">{message}</p>
    </div>
  );
}

export default async function TakePartPage({ params, searchParams }: { params: Promise<{ token: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  await connection();
  const { token } = await params;
  const sp = await searchParams;
  const one = (v: string | string[] | undefined) => (typeof v === 'string' && v ? v : null);
  const db = await em();
  const link = await loadLink(db, token);
  const refusal = linkRefusal(link);
  if (refusal?.status === 404 || !link) notFound();
  if (refusal) return <Notice title="This study is not open" message={refusal.message} code="gone" />;

  const resume = one(sp.resume) ?? (await cookies()).get(resumeCookieName(link.studyId))?.value ?? null;
  const r = await findByResume(db, link.studyId, resume);
  if (!r && !(await openForNewRespondents(db, link.workspaceId, link.linkId, link.quota))) {
    return <Notice title="This study is full" message="Thank you for your interest. No more answers are needed." code="study_full" />;
  }
  const design = link.design;
  const pictureUrl = design.itemPictureId ? `/api/r/${token}/picture` : null;
  return (
    <LiveFlow
      token={token}
      resumeToken={r?.resumeToken ?? null}
      pid={link.acceptsPid ? one(sp.pid) : null}
      initial={r ? await stateOf(db, link, r) : null}
      study={flowStudy(design, pictureUrl)}
      consentText={design.consentText}
      retentionDays={link.retentionDays}
      questions={design.segmentQuestions}
    />
  );
}
