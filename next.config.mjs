// Where the buyer is sent to pay: the local Stripe stand-in, or Stripe's own checkout.
const checkoutOrigin = process.env.STRIPE_FAKE_URL ? new URL(process.env.STRIPE_FAKE_URL).origin : 'https://checkout.stripe.com';
const dev = process.env.NODE_ENV !== 'production';

// Only what the app needs: its own scripts (Next's bootstrap is inline), styles (next/font and
// chart attributes are inline), images incl. data: QR codes, and the checkout page for forms.
const contentSecurityPolicy = [
  "default-src 'self'",
  `script-src 'self' 'unsafe-inline'${dev ? " 'unsafe-eval'" : ''}`,
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' data: blob:",
  "font-src 'self'",
  `connect-src 'self'${dev ? ' ws:' : ''}`,
  `form-action 'self' ${checkoutOrigin}`,
  "frame-ancestors 'none'",
  "base-uri 'self'",
  "object-src 'none'",
].join('; ');

// The respondent pages (app/r/[token]/…) load no Next.js runtime: one hashed module script, one
// stylesheet and fonts from /r-assets, boot data in a JSON data block that is never executed.
// So no inline script or style at all, and forms post only to this origin.
const respondentPolicy = [
  "default-src 'self'",
  "script-src 'self'",
  "style-src 'self'",
  "img-src 'self'",
  "font-src 'self'",
  "connect-src 'self'",
  "form-action 'self'",
  "frame-ancestors 'none'",
  "base-uri 'none'",
  "object-src 'none'",
].join('; ');

const securityHeaders = [
  { key: 'Content-Security-Policy', value: contentSecurityPolicy },
  { key: 'X-Frame-Options', value: 'DENY' },
  { key: 'Referrer-Policy', value: 'strict-origin-when-cross-origin' },
  { key: 'X-Content-Type-Options', value: 'nosniff' },
  { key: 'Permissions-Policy', value: 'camera=(), microphone=(), geolocation=()' },
];

/** @type {import('next').NextConfig} */
const nextConfig = {
  async headers() {
    // When two entries set the same header on a path, the later one wins (one value, never two);
    // a header set here also wins over the same header set by a route handler.
    return [
      { source: '/:path*', headers: securityHeaders },
      { source: '/r/:path*', headers: [{ key: 'Content-Security-Policy', value: respondentPolicy }] },
      // Respondent answers are per person and change with every answer: never cached. The item
      // picture is the exception (its handler caches it for a day).
      { source: '/r/:path((?!.*/picture$).*)', headers: [{ key: 'Cache-Control', value: 'no-store' }] },
    ];
  },
  // The test run builds into its own folder so it never disturbs a running `npm start`.
  distDir: process.env.NEXT_DIST_DIR || '.next',
  serverExternalPackages: [
    '@mikro-orm/core',
    '@mikro-orm/postgresql',
    '@mikro-orm/knex',
    '@mikro-orm/migrations',
    'knex',
    'pg',
    'pg-boss',
    'bcryptjs',
    'nodemailer',
    'stripe',
    'jstat',
  ],
  // Otherwise `next dev` prints server-action arguments, passwords included.
  logging: { serverFunctions: false },
  poweredByHeader: false,
  typescript: { ignoreBuildErrors: true }, // the test command runs tsc itself
};

export default nextConfig;
