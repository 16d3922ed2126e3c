// Builds the respondent pages' own client bundle with vite, outside the Next.js App Router
// runtime: one script (React + the screens in respondent/client) and one stylesheet with
// the fonts it uses, content-hashed, into .respondent-dist/ (git-ignored). The route handler
// /r/[token]/take-part reads .respondent-dist/.vite/manifest.json to link them, and
// /r-assets/[file] serves them. Run by `npm start`, the test build and `npm run build:respondent`.
import path from 'node:path';
import { build } from 'vite';
import { ROOT } from './lib/project.mjs';

export const RESPONDENT_DIST = path.join(ROOT, '.respondent-dist');

export async function buildRespondent({ quiet = false } = {}) {
  await build({
    configFile: false,
    root: ROOT,
    base: '/r-assets/',
    logLevel: quiet ? 'error' : 'info',
    mode: 'production',
    publicDir: false,
    resolve: { alias: { '@': ROOT } },
    // Vite transforms JSX itself (oxc); the screens use React's automatic runtime like Next does.
    oxc: { jsx: { runtime: 'automatic', importSource: 'react' } },
    define: { 'process.env.NODE_ENV': JSON.stringify('production') },
    build: {
      outDir: RESPONDENT_DIST,
      // Hashed names never collide, so an older build's files stay valid for a server still running it.
      emptyOutDir: false,
      assetsDir: '',
      manifest: true,
      target: 'es2020',
      cssCodeSplit: false,
      modulePreload: false,
      rolldownOptions: {
        input: path.join(ROOT, 'respondent/client/main.tsx'),
        // 'use client' marks the screens for Next's preview page; it means nothing to this bundle.
        onwarn(warning, warn) {
          if (warning.code === 'MODULE_LEVEL_DIRECTIVE') return;
          warn(warning);
        },
      },
    },
  });
}

if (import.meta.url === `file://${process.argv[1]}`) {
  buildRespondent().catch((err) => {
    process.stderr.write(`build:respondent failed: ${err instanceof Error ? err.stack : String(err)}\n`);
    process.exit(1);
  });
}
