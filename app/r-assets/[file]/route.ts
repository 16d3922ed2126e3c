import { readFile } from 'node:fs/promises';
import { route } from '@/lib/server/http/route';
import { AppError } from '@/lib/server/http/errors';
import { bundleFile } from '@/respondent/server/assets';

const TYPES: Record<string, string> = {
  js: 'text/javascript; charset=utf-8',
  css: 'text/css; charset=utf-8',
  woff2: 'font/woff2',
};

/**
 * The respondent bundle's files (script, stylesheet, fonts). Names carry a content hash, so they
 * are cached for a year; only plain hashed names are accepted. Served outside /r on purpose: the
 * resume cookie (scoped to /r) is not sent with them, and no path here can shadow a link token.
 */
export const GET = route(
  { auth: 'public', reason: "the respondent bundle's static files (hashed names only), no data" },
  async ({ params }) => {
    const m = /^[A-Za-z0-9_-]+\.(js|css|woff2)$/.exec(String(params.file));
    const bytes = m ? await readFile(bundleFile(m[0])).catch(() => null) : null;
    if (!m || !bytes) throw new AppError(404, 'not_found', 'No such file.');
    return new Response(new Uint8Array(bytes), {
      headers: { 'content-type': TYPES[m[1]], 'cache-control': 'public, max-age=31536000, immutable' },
    });
  },
);
