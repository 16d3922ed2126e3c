import Link from 'next/link';

export default async function NotAllowedPage({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace } = await params;
  return (
    <div className="card max-w-xl p-6">
      <h1 className="text-2xl">Not allowed</h1>
      <p className="mt-2 text-muted">Your role in this workspace does not open that page. An owner of the workspace can change your role.</p>
      <p className="mt-4"><Link href={`/w/${workspace}`}>Back to the studies</Link></p>
    </div>
  );
}
