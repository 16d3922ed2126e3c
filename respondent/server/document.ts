import 'server-only';
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { BOOT_ID, ROOT_ID, bootJson, type RespondentBoot } from '@/respondent/shared/boot';
import { escapeHtml } from '@/respondent/server/consent-html';

/** Where scripts/build-respondent.mjs writes the respondent bundle (git-ignored). */
export const RESPONDENT_DIST = path.join(/* turbopackIgnore: true */ process.cwd(), '.respondent-dist');
const ENTRY = 'respondent/client/main.tsx';

interface Assets { script: string | null; styles: string[] }
let cached: Assets | null = null;

/** The hashed script and stylesheet names from vite's manifest, read once per process. */
export async function respondentAssets(): Promise<Assets> {
  if (cached) return cached;
  try {
    const manifest = JSON.parse(await readFile(path.join(RESPONDENT_DIST, '.vite', 'manifest.json'), 'utf8')) as Record<string, { file: string; css?: string[] }>;
    const entry = manifest[ENTRY];
    const styles = [...(entry?.css ?? []), ...Object.values(manifest).filter((m) => m.file.endsWith('.css')).map((m) => m.file)];
    cached = { script: entry?.file ?? null, styles: [...new Set(styles)] };
    return cached;
  } catch {
    // Not built (e.g. `next dev` before `npm run build:respondent`): the page still works as a plain form.
    console.error('[respondent] .respondent-dist is missing: run `npm run build:respondent`.');
    return { script: null, styles: [] };
  }
}

/**
 * A complete HTML document for the respondent pages, outside the App Router runtime: the
 * server-rendered first screen, one stylesheet and (when the flow continues in the browser)
 * one module script with its boot data in a JSON data block. No inline script.
 */
export async function respondentDocument({ title, body, boot = null, status = 200 }: { title: string; body: string; boot?: RespondentBoot | null; status?: number }): Promise<Response> {
  const a = await respondentAssets();
  const css = a.styles.map((f) => `<link rel="stylesheet" href="/r-assets/${escapeHtml(f)}">`).join('');
  const script = boot && a.script
    ? `<script type="application/json" id="${BOOT_ID}">${bootJson(boot)}</script><script type="module" src="/r-assets/${escapeHtml(a.script)}"></script>`
    : '';
  const html = `<!doctype html><html lang="en"><head><meta charset="utf-8">`
    + `<meta name="viewport" content="width=device-width, initial-scale=1"><meta name="theme-color" content="#FAF7F2"><meta name="robots" content="noindex, nofollow">`
    + `<title>${escapeHtml(title)} · Notchwise</title>${css}${script}</head>`
    + `<body class="min-h-screen bg-paper text-ink antialiased"><main id="${ROOT_ID}" class="mx-auto min-h-screen w-full max-w-md px-5 pb-10 pt-6 text-lg">${body}</main></body></html>`;
  return new Response(html, { status, headers: { 'content-type': 'text/html; charset=utf-8', 'cache-control': 'no-store' } });
}

/** A stop screen in the flow's own look (unknown, closed, paused or full), with the status it deserves. */
export function noticeHtml(title: string, message: string, code: string): string {
  return `<div class="flex flex-col gap-4 py-10 text-center" data-testid="stopped" data-code="${escapeHtml(code)}">`
    + `<h1 class="text-3xl">${escapeHtml(title)}</h1><p class="text-lg">${escapeHtml(message)}</p></div>`;
}

/** Shown while the script loads on a resumed visit; the flow replaces it. */
export const WAITING_HTML = `<p class="py-16 text-center text-lg text-muted" data-testid="waiting">One moment…</p>`
  + `<noscript><p class="text-center text-lg">The questions need JavaScript. Please turn it on in your browser and reload this page.</p></noscript>`;
