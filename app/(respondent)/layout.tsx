import type { Metadata } from 'next';

export const metadata: Metadata = { robots: { index: false, follow: false } };

/** The respondent pages: no analyst shell, no client providers, one narrow column for phones. */
export default function RespondentLayout({ children }: { children: React.ReactNode }) {
  return <main className="mx-auto min-h-screen w-full max-w-md px-5 pb-10 pt-6 text-lg">{children}</main>;
}
