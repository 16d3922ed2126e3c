'use client';
import { useQuery } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { meQuery } from '@/lib/queries/me';
import { ROLE_LABELS } from '@/lib/roles';

/** Switches between the user's workspaces; the list comes from GET /api/me. */
export function WorkspaceSwitcher({ current }: { current: string }) {
  const router = useRouter();
  const { data, isPending } = useQuery(meQuery());
  const items = data?.workspaces ?? [];
  return (
    <label className="flex items-center gap-2 text-sm">
      <span className="sr-only">Workspace</span>
      <select
        aria-label="Workspace"
        className="input !w-auto !py-1 font-semibold"
        value={current}
        disabled={isPending}
        onChange={(e) => router.push(`/w/${e.target.value}`)}
      >
        {items.length === 0 ? <option value={current}>{current}</option> : null}
        {items.map((w) => (
          <option key={w.slug} value={w.slug}>
            {w.name} ({ROLE_LABELS[w.role]})
          </option>
        ))}
      </select>
    </label>
  );
}
