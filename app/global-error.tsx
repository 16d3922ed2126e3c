'use client';

export default function GlobalError({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <html lang="en">
      <body style={{ fontFamily: 'system-ui, sans-serif', background: '#FAF7F2', color: '#1F2430', padding: '4rem 1.5rem' }}>
        <h1>Notchwise could not load</h1>
        <p>Try again in a moment.</p>
        <button onClick={() => reset()}>Try again</button>
      </body>
    </html>
  );
}
