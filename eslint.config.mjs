import nextVitals from 'eslint-config-next/core-web-vitals';
import nextTs from 'eslint-config-next/typescript';

const config = [
  ...nextVitals,
  ...nextTs,
  {
    ignores: ['node_modules/**', '.next/**', '.next-*/**', '.next-test*/**', '.data/**', '.test-output/**', 'next-env.d.ts', 'migrations/**', '.respondent-dist/**'],
  },
];

export default config;
