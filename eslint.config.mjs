import nextVitals from 'eslint-config-next/core-web-vitals';
import nextTs from 'eslint-config-next/typescript';

// Routes, pages and client code reach data only through lib/server's data-access functions,
// which scope every query by workspace and return DTOs; importing the database module, the
// ORM or an entity from here would skip both. tests/unit/lint-boundary.test.ts shows it fires.
const DATA_LAYER_MESSAGE = 'Call a data-access function in lib/server/<domain> instead: it authorises, scopes by workspace and returns a DTO.';
const dataLayerPatterns = [
  { group: ['@/lib/server/db', '@/lib/server/db/*', '**/lib/server/db', '**/lib/server/db/*'], message: `The database module is for lib/server only. ${DATA_LAYER_MESSAGE}` },
  { group: ['@mikro-orm/*'], message: `The ORM is for lib/server only. ${DATA_LAYER_MESSAGE}` },
  { group: ['@/entities', '@/entities/*', '**/entities', '**/entities/*'], message: `Entities never leave lib/server. ${DATA_LAYER_MESSAGE}` },
];
const dataLayerBoundary = {
  files: ['app/**/*.{ts,tsx}', 'components/**/*.{ts,tsx}', 'respondent/client/**/*.{ts,tsx}'],
  rules: { 'no-restricted-imports': ['error', { patterns: dataLayerPatterns }] },
};

// A phone loads only its study's catalogue, from the boot data (respondent/messages/format.ts):
// the respondent bundle imports no catalogue, so importing one from respondent/client is refused
// (the screens take `m` as a prop; types come from respondent/messages/format). `npm run
// size:respondent` checks the built bundle too.
const catalogueBoundary = {
  files: ['respondent/client/**/*.{ts,tsx}'],
  rules: {
    'no-restricted-imports': ['error', {
      patterns: [
        ...dataLayerPatterns,
        { group: ['@/respondent/messages/*', '!@/respondent/messages/format', ...['all', 'en', 'de', 'fr', 'es', 'nl'].map((f) => `**/messages/${f}`)], message: 'The respondent bundle holds no catalogue: take the messages as a prop (`m`), typed from @/respondent/messages/format.' },
      ],
    }],
  },
};

const config = [
  ...nextVitals,
  ...nextTs,
  dataLayerBoundary,
  catalogueBoundary,
  {
    ignores: ['node_modules/**', '.next/**', '.next-*/**', '.next-test*/**', '.data/**', '.test-output/**', 'next-env.d.ts', 'migrations/**', '.respondent-dist/**'],
  },
];

export default config;
