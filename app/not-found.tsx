import Link from 'next/link';

export default function NotFound() {
  return (
    <main className="mx-auto max-w-xl px-6 py-16">
      <h1 className="text-3xl">Nothing at this address</h1>
      <p className="mt-3 text-muted">The page does not exist, or you are not a member of the workspace it belongs to.</p>
      <p className="mt-6"><Link href="/">Go to the start page</Link></p>
    </main>
  );
}
