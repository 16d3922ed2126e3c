import { readFile } from 'node:fs/promises';
import path from 'node:path';
import type { NextRequest } from 'next/server';
import { RESPONDENT_DIST } from '@/respondent/server/document';

const TYPES: Record<string, string> = {
  js: 'text/javascript; charset=utf-8',
  css: 'text/css; charset=utf-8',
  woff2: 'font/woff2',
};

/**
 * The respondent bundle's files (script, stylesheet, fonts) from .respondent-dist. Names carry
 * a content hash, so they are cached for a year; only plain hashed names are accepted.
 */
export async function GET(_req: NextRequest, ctx: { params: Promise<{ file: string }> }) {
  const { file } = await ctx.params;
  const m = /^[A-Za-z0-9_-]+\.(js|css|woff2)$/.exec(file);
  const bytes = m ? await readFile(path.join(RESPONDENT_DIST, file)).catch(() => null) : null;
  if (!m || !bytes) return Response.json({ error: { code: 'not_found', message: 'No such file.' } }, { status: 404 });
  return new Response(new Uint8Array(bytes), {
    headers: { 'content-type': TYPES[m[1]], 'cache-control': 'public, max-age=31536000, immutable' },
  });
}
