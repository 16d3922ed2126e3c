import type { Config } from 'tailwindcss';
import base from '../../tailwind.config';

// The app's theme, scanning only what the respondent pages render, so their stylesheet stays small.
export default {
  ...base,
  content: ['./*.tsx', '../server/document.ts', '../server/consent-html.ts'],
} satisfies Config;
