import Link from 'next/link';
import { requireRole } from '@/lib/server/http/page-guard';
import { ROLE_LABELS } from '@/lib/roles';
import { WorkspaceSwitcher } from '@/components/shell/workspace-switcher';
import { SectionNav } from '@/components/shell/section-nav';
import { signOutAction } from '@/app/(auth)/actions';
import { ConfirmNotice } from '@/app/(auth)/confirm/confirm-notice';
import { confirmationPending } from '@/lib/server/team/email-confirmation';

export default async function WorkspaceLayout({ children, params }: { children: React.ReactNode; params: Promise<{ workspace: string }> }) {
  const { workspace } = await params;
  // Convenience only: every page and handler below checks again for itself.
  const ctx = await requireRole(workspace, 'viewer');
  return (
    <div className="min-h-screen">
      <header className="border-b border-rule bg-card">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-4 px-6 pt-3">
          <Link href={`/w/${ctx.workspace.slug}`} className="font-serif text-lg font-semibold text-ink no-underline">Notchwise</Link>
          <WorkspaceSwitcher current={ctx.workspace.slug} />
          <div className="ml-auto flex items-center gap-3 text-sm text-muted">
            <span data-testid="signed-in-as">{ctx.user.name} · {ROLE_LABELS[ctx.role]}</span>
            <form action={signOutAction}>
              <button type="submit" className="btn !min-h-0 !py-1">Sign out</button>
            </form>
          </div>
        </div>
        <div className="mx-auto max-w-6xl px-4">
          <SectionNav slug={ctx.workspace.slug} role={ctx.role} />
        </div>
      </header>
      {(await confirmationPending(ctx.user.id)) ? <ConfirmNotice email={ctx.user.email} /> : null}
      <main className="mx-auto max-w-6xl px-6 py-8">{children}</main>
    </div>
  );
}
