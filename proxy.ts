// Runs before every analyst-app page (not API routes, the respondent pages or static files — see
// `config.matcher`): gives the page its Content-Security-Policy with a fresh nonce (lib/csp.ts).
// The policy goes on the request too, which is how Next.js learns the nonce and puts it on the
// scripts it renders; app/layout.tsx reads the request headers, so every page renders per
// request (a prerendered page would carry scripts without the nonce). Authorisation is not
// done here: route(), action() and requireRole() are the guards.
import { NextResponse, type NextRequest } from 'next/server';
import { newNonce, pagePolicy } from '@/lib/csp';

const checkoutOrigin = process.env.STRIPE_FAKE_URL ? new URL(process.env.STRIPE_FAKE_URL).origin : 'https://checkout.stripe.com';

export function proxy(request: NextRequest) {
  const nonce = newNonce();
  const policy = pagePolicy({ nonce, dev: process.env.NODE_ENV !== 'production', checkoutOrigin });
  const headers = new Headers(request.headers);
  headers.set('x-nonce', nonce);
  headers.set('content-security-policy', policy);
  const response = NextResponse.next({ request: { headers } });
  response.headers.set('content-security-policy', policy);
  return response;
}

export const config = {
  matcher: [
    {
      // Pages only: API routes answer with their own policy, /r and /r-assets are the respondent
      // runtime (next.config.mjs), /_next/static and /_next/image are files. Bodies of the
      // excluded routes are therefore never buffered for the proxy either.
      source: '/((?!api/|r/|r-assets/|_next/static|_next/image|favicon.ico).*)',
      missing: [
        { type: 'header', key: 'next-router-prefetch' },
        { type: 'header', key: 'purpose', value: 'prefetch' },
      ],
    },
  ],
};
