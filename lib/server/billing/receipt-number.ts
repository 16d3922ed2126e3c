import 'server-only';

/**
 * A purchase's receipt number: stable for the purchase (a resend names the same receipt),
 * readable over the phone. The receipt e-mail (./webhook.ts) and the Billing ledger
 * (./ledger-details.ts) both name a purchase by it.
 */
export function receiptNumber(purchaseId: string, paidAt: Date): string {
  const hex = purchaseId.replace(/-/g, '').slice(0, 12).toUpperCase();
  return `NW-${paidAt.getUTCFullYear()}-${hex.slice(0, 4)}-${hex.slice(4, 8)}-${hex.slice(8, 12)}`;
}
