// Builds the respondent pages' own client bundle, outside the Next.js App Router runtime: one
// script (React and the screens in respondent/client) and one stylesheet with the fonts it
// uses, content-hashed, into RESPONDENT_DIST with a manifest the server document reads.
// `npm run build:respondent`, `npm start` and the test build run `vite build -c` on this file;
// `npm run dev` runs it with `--watch` beside `next dev` (scripts/dev.mjs).
import path from 'node:path';
import { defineConfig } from 'vite';
import { RESPONDENT_ASSET_BASE, RESPONDENT_DIST, RESPONDENT_ENTRY } from './bundle';

const ROOT = path.resolve(import.meta.dirname, '..');

export default defineConfig({
  root: ROOT,
  base: RESPONDENT_ASSET_BASE,
  mode: 'production',
  publicDir: false,
  // PostCSS (and with it Tailwind) comes from the project's own postcss.config.mjs.
  resolve: { alias: { '@': ROOT } },
  // Vite transforms JSX itself (oxc); the screens use React's automatic runtime like Next does.
  oxc: { jsx: { runtime: 'automatic', importSource: 'react' } },
  define: { 'process.env.NODE_ENV': JSON.stringify('production') },
  build: {
    outDir: path.join(ROOT, RESPONDENT_DIST),
    // Hashed names never collide, so an older build's files stay valid for a server still running it.
    emptyOutDir: false,
    assetsDir: '',
    manifest: true,
    target: 'es2020',
    cssCodeSplit: false,
    modulePreload: false,
    rolldownOptions: {
      input: path.join(ROOT, RESPONDENT_ENTRY),
      // 'use client' marks the screens for Next's preview page; it means nothing to this bundle.
      onwarn(warning, warn) {
        if (warning.code === 'MODULE_LEVEL_DIRECTIVE') return;
        warn(warning);
      },
    },
  },
});
