'use client';
import Link from 'next/link';
import { useQuery } from '@tanstack/react-query';
import { checkoutStatusQuery } from '@/lib/queries/billing';
import { findBundle } from '@/lib/billing-bundles';
import { formatCents } from '@/lib/money';

/** Polls the purchase until the verified webhook has credited the seats. */
export function PaymentWait({ slug, sessionId }: { slug: string; sessionId: string }) {
  const { data, error } = useQuery(checkoutStatusQuery(slug, sessionId));
  if (error) return <p className="card p-5 text-brick" role="alert">⚠ {error.message}</p>;
  if (!data) return <p className="card p-5 text-muted">Loading…</p>;
  const name = findBundle(data.bundle)?.name ?? data.bundle;
  return (
    <div className="card max-w-xl p-6" aria-live="polite">
      {data.status === 'paid' ? (
        <>
          <h2 className="text-xl"><span aria-hidden="true" className="text-moss">✓ </span>Payment confirmed</h2>
          <p className="mt-2">{data.seats} seats from the {name} bundle ({formatCents(data.amountCents, data.currency)}) were added. A receipt is on its way by e-mail.</p>
          <p className="mt-4 text-sm text-muted">Seat balance</p>
          <p className="num text-3xl" data-testid="seat-balance">{data.balance?.toLocaleString('en')}</p>
        </>
      ) : (
        <>
          <h2 className="text-xl">Waiting for payment confirmation…</h2>
          <p className="mt-2 text-muted">Stripe confirms the payment to Notchwise directly; the {data.seats} seats appear here as soon as it does. You can leave this page; nothing is lost.</p>
        </>
      )}
      <p className="mt-6"><Link href={`/w/${slug}/billing`}>Back to billing</Link></p>
    </div>
  );
}
