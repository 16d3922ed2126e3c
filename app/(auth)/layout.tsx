import Link from 'next/link';

export default function AuthLayout({ children }: { children: React.ReactNode }) {
  return (
    <main className="mx-auto flex min-h-screen max-w-md flex-col justify-center px-6 py-12">
      <Link href="/" className="num mb-6 text-sm text-muted no-underline">Notchwise</Link>
      {/* Links inside sentences are underlined: told apart from the text by more than colour (WCAG 1.4.1). */}
      <div className="card p-6 [&_p_a]:underline">{children}</div>
    </main>
  );
}
