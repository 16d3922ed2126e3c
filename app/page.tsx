import Link from 'next/link';
import { connection } from 'next/server';
import { redirect } from 'next/navigation';
import { currentUser } from '@/lib/server/team/session';
import { listWorkspaces } from '@/lib/server/team/membership';

export default async function Home() {
  await connection();
  const user = await currentUser();
  if (user) {
    const [first] = await listWorkspaces(user.id);
    if (first) redirect(`/w/${first.slug}`);
  }
  return (
    <main className="mx-auto max-w-3xl px-6 py-16">
      <p className="num text-sm text-muted">Notchwise</p>
      <h1 className="mt-2 text-4xl leading-tight">How deep must a discount be before shoppers notice it?</h1>
      <div className="mt-6 space-y-4 text-lg leading-relaxed text-ink">
        <p>
          A discount below the point where shoppers notice it gives away margin nobody sees. Notchwise runs
          controlled price-perception studies with real shoppers on their phones, fits psychometric curves to
          their answers, and gives you the notice threshold at each regular price, with its interval.
        </p>
        <p>
          It tells you whether one percentage rule holds across your range (Weber&rsquo;s law) or whether cheap
          items need deeper percentages, and turns the answer into a promo floor for every item on your price list.
        </p>
      </div>
      <div className="mt-10 flex gap-3">
        <Link href="/sign-up" className="btn btn-primary">Open a workspace</Link>
        <Link href="/sign-in" className="btn">Sign in</Link>
      </div>
    </main>
  );
}
