'use client';

export default function ErrorPage({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <main className="mx-auto max-w-xl px-6 py-16">
      <h1 className="text-3xl">Something went wrong</h1>
      <p className="mt-3 text-muted">The page could not be shown. Nothing you entered was lost on our side; try again.</p>
      <button className="btn btn-primary mt-6" onClick={() => reset()}>Try again</button>
    </main>
  );
}
