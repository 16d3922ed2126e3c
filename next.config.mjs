// Content-Security-Policy is set per kind of response, never globally, so none overrides another:
// the analyst pages get a nonce-based policy from proxy.ts (lib/csp.ts), route handlers' JSON
// `default-src 'none'` from route() (and /api/assets its own), the respondent pages the policy below.
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
  { key: 'X-Frame-Options', value: 'DENY' },
  { key: 'Referrer-Policy', value: 'strict-origin-when-cross-origin' },
  { key: 'X-Content-Type-Options', value: 'nosniff' },
  { key: 'Permissions-Policy', value: 'camera=(), microphone=(), geolocation=()' },
];

/** @type {import('next').NextConfig} */
const nextConfig = {
  async headers() {
    // When two entries set the same header on a path, the later one wins (one value, never two);
    // a header set here also wins over the same header set by a route handler or proxy.ts — hence
    // no Content-Security-Policy on '/:path*' (it would replace /api/assets' and the pages' own).
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
