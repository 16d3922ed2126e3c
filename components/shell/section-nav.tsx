'use client';
import Link from 'next/link';
import { usePathname } from 'next/navigation';
import clsx from 'clsx';
import type { Role } from '@/lib/roles';

const SECTIONS = [
  { href: '', label: 'Studies' },
  { href: '/record', label: 'Threshold record' },
  { href: '/promotions', label: 'Promotions' },
  { href: '/team', label: 'Team' },
  { href: '/billing', label: 'Billing' },
  { href: '/settings', label: 'Settings' },
  { href: '/audit', label: 'Audit', ownerOnly: true },
];

export function SectionNav({ slug, role }: { slug: string; role?: Role }) {
  const path = usePathname();
  const base = `/w/${slug}`;
  return (
    <nav aria-label="Sections" className="flex flex-wrap gap-x-1 text-sm">
      {SECTIONS.filter((s) => !('ownerOnly' in s) || role === 'owner').map((s) => {
        const href = base + s.href;
        const active = s.href === '' ? path === base || path.startsWith(`${base}/studies`) : path.startsWith(href);
        return (
          <Link
            key={s.label}
            href={href}
            aria-current={active ? 'page' : undefined}
            className={clsx('border-b-2 px-3 py-2 font-semibold no-underline', active ? 'border-teal text-ink' : 'border-transparent text-muted hover:text-ink')}
          >
            {s.label}
          </Link>
        );
      })}
    </nav>
  );
}
