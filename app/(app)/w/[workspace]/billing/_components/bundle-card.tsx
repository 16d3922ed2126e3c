'use client';
import { useState } from 'react';
import { fetchJson } from '@/lib/fetch-json';
import { BUNDLE_CURRENCY, type Bundle } from '@/lib/billing-bundles';
import { formatCents } from '@/lib/money';

/** One bundle; the owner's "Buy" opens a Checkout Session and goes to its page. */
export function BundleCard({ slug, bundle, canBuy }: { slug: string; bundle: Bundle; canBuy: boolean }) {
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const buy = async () => {
    setBusy(true);
    setError(null);
    try {
      const { url } = await fetchJson<{ url: string }>(`/api/w/${slug}/billing/checkout`, { method: 'POST', body: JSON.stringify({ bundle: bundle.id }) });
      window.location.assign(url);
    } catch (err) {
      setError(err instanceof Error ? err.message : 'Could not start the payment.');
      setBusy(false);
    }
  };
  return (
    <div className="card flex flex-col p-5" data-testid={`bundle-${bundle.id}`}>
      <h3 className="text-lg">{bundle.name}</h3>
      <p className="num mt-1 text-2xl">{bundle.seats.toLocaleString('en')} <span className="font-sans text-sm text-muted">seats</span></p>
      <p className="num text-muted">{formatCents(bundle.amountCents, BUNDLE_CURRENCY)} · {formatCents(Math.round(bundle.amountCents / bundle.seats), BUNDLE_CURRENCY)} a seat</p>
      <p className="mt-2 flex-1 text-sm text-muted">{bundle.blurb}</p>
      {canBuy ? (
        <button type="button" className="btn btn-primary mt-4" onClick={buy} disabled={busy} aria-label={`Buy ${bundle.name} bundle`}>
          {busy ? 'Opening checkout…' : 'Buy'}
        </button>
      ) : null}
      {error ? <p className="field-error mt-2" role="alert">{error}</p> : null}
    </div>
  );
}
