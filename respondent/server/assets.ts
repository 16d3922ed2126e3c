import 'server-only';
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { RESPONDENT_DIST, RESPONDENT_ENTRY } from '@/respondent/bundle';

// The built respondent bundle on disk (respondent/vite.config.ts writes it): the manifest the
// document reads to link the hashed script and stylesheet, and the files app/r-assets serves.

const DIST = path.join(/* turbopackIgnore: true */ process.cwd(), RESPONDENT_DIST);

/** A file of the built bundle, by its name. */
export const bundleFile = (name: string) => path.join(DIST, name);

export interface BundleAssets { script: string | null; styles: string[] }
let cached: BundleAssets | null = null;

/** The hashed script and stylesheet names from vite's manifest: read once per process, on every request under `next dev`. */
export async function bundleAssets(): Promise<BundleAssets> {
  if (cached) return cached;
  try {
    const manifest = JSON.parse(await readFile(bundleFile('.vite/manifest.json'), 'utf8')) as Record<string, { file: string; css?: string[] }>;
    const entry = manifest[RESPONDENT_ENTRY];
    const styles = [...(entry?.css ?? []), ...Object.values(manifest).filter((m) => m.file.endsWith('.css')).map((m) => m.file)];
    const assets = { script: entry?.file ?? null, styles: [...new Set(styles)] };
    if (process.env.NODE_ENV === 'production') cached = assets;
    return assets;
  } catch {
    // Not built yet: the pages still work as plain forms, unstyled.
    console.error(`[respondent] ${RESPONDENT_DIST} is missing: run \`npm run build:respondent\` (\`npm run dev\` rebuilds it on change).`);
    return { script: null, styles: [] };
  }
}
