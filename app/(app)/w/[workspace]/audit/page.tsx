import type { Metadata } from 'next';
import Link from 'next/link';
import { connection } from 'next/server';
import { requireRole } from '@/lib/server/http/page-guard';
import { listAuditEvents } from '@/lib/server/team/audit';
import { PageTitle } from '@/components/ui/page-title';
import { EmptyState } from '@/components/ui/empty-state';
import { describeAction } from './describe-action';
import { ScrollFrame } from '@/components/ui/scroll-frame';

export const metadata: Metadata = { title: 'Audit trail' };

const day = (iso: string) => new Date(iso).toLocaleDateString('en-GB', { dateStyle: 'medium', timeZone: 'UTC' });
const time = (iso: string) => new Date(iso).toLocaleTimeString('en-GB', { timeStyle: 'medium', timeZone: 'UTC' });

export default async function AuditPage({ params, searchParams }: { params: Promise<{ workspace: string }>; searchParams: Promise<{ page?: string }> }) {
  await connection();
  const { workspace } = await params;
  const ctx = await requireRole(workspace, 'owner');
  const data = await listAuditEvents(ctx, Number((await searchParams).page ?? 1));
  const href = (p: number) => `/w/${ctx.workspace.slug}/audit?page=${p}`;
  return (
    <>
      <PageTitle title="Audit trail" />
      <p className="mb-4 text-sm text-muted">Who did what in this workspace, newest first, including its members’ sign-ins. Times in UTC.</p>
      {data.events.length === 0 ? (
        <EmptyState title="Nothing recorded yet" />
      ) : (
        <ScrollFrame label="Audit trail" className="card">
          <table className="table" data-testid="audit">
            {/* What happened comes second, so a phone shows it without scrolling the frame. */}
            <thead><tr><th>When (UTC)</th><th>What</th><th>Who</th><th>On</th></tr></thead>
            <tbody>
              {data.events.map((e) => (
                <tr key={e.id}>
                  <td className="num whitespace-nowrap text-xs"><span className="block">{day(e.createdAt)}</span><span className="block text-muted">{time(e.createdAt)}</span></td>
                  <td className="min-w-40">{describeAction(e.action, e.detail)}</td>
                  <td>{e.actor ? <><span className="block">{e.actor.name}</span><span className="block text-xs text-muted">{e.actor.email}</span></> : <span className="text-muted">system</span>}</td>
                  <td className="max-w-[20rem] truncate" title={e.target ?? undefined}>{e.target ?? '—'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </ScrollFrame>
      )}
      {data.pageCount > 1 ? (
        <nav aria-label="Pages" className="mt-4 flex items-center gap-4 text-sm">
          {data.page > 1 ? <Link href={href(data.page - 1)}>← Newer</Link> : <span className="text-muted">← Newer</span>}
          <span className="num">Page {data.page} of {data.pageCount} · {data.total} events</span>
          {data.page < data.pageCount ? <Link href={href(data.page + 1)}>Older →</Link> : <span className="text-muted">Older →</span>}
        </nav>
      ) : null}
    </>
  );
}
