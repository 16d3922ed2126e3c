// The Content-Security-Policy of the analyst app's pages, built per request by proxy.ts with a
// fresh nonce. Scripts run only when they carry that nonce (Next.js puts it on its own bootstrap
// and chunk scripts when it finds the policy in the request) or when a nonced script loads them
// ('strict-dynamic'); no 'unsafe-inline' for scripts, so injected markup cannot run. Styles stay
// 'unsafe-inline' (next/font and chart attributes set inline styles; a style cannot run code).
// Other responses set their own policy and nothing overrides it: the respondent pages a strict
// one without any inline script (next.config.mjs, for /r/*), route handlers' JSON
// `default-src 'none'` (lib/server/http/route.ts), files and pictures theirs (download.ts).

export interface PagePolicyOptions {
  nonce: string;
  /** `next dev` needs eval for its fast refresh and a websocket. */
  dev: boolean;
  /** Where checkout forms go (Stripe's page, or the local stand-in). */
  checkoutOrigin: string;
}

export function pagePolicy({ nonce, dev, checkoutOrigin }: PagePolicyOptions): string {
  return [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${dev ? " 'unsafe-eval'" : ''}`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self'",
    `connect-src 'self'${dev ? ' ws:' : ''}`,
    `form-action 'self' ${checkoutOrigin}`,
    "frame-ancestors 'none'",
    "base-uri 'self'",
    "object-src 'none'",
  ].join('; ');
}

/** A nonce: 128 random bits, base64 (Web Crypto, so it runs wherever the proxy runs). */
export function newNonce(): string {
  const bytes = crypto.getRandomValues(new Uint8Array(16));
  return btoa(String.fromCharCode(...bytes));
}
