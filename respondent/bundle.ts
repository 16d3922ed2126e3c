// The respondent bundle's build facts, defined once: respondent/vite.config.ts writes the bundle
// by them, and respondent/server/document.ts reads its manifest and links its files by them.
// No imports, so vite's config loader can bundle this file without the app's path aliases.

/** The folder the bundle is written to, relative to the project root (git-ignored). */
export const RESPONDENT_DIST = '.respondent-dist';

/** The URL prefix the bundle's files are served under (app/r-assets/[file]/route.ts). */
export const RESPONDENT_ASSET_BASE = '/r-assets/';

/** The bundle's entry module, relative to the project root; also its key in vite's manifest. */
export const RESPONDENT_ENTRY = 'respondent/client/main.tsx';
