import type { Config } from 'tailwindcss';

// The one theme of every Notchwise page: the analyst app (app/globals.css) and the respondent
// pages (respondent/client/styles.css) load it through `@config`. Which files Tailwind scans is
// said by each stylesheet's `@source` lines, not here, so the respondent stylesheet stays small.
// Palette roles from DESIGN.md → Look and feel. Never colour alone: pair with a label or shape.
export default {
  theme: {
    extend: {
      colors: {
        paper: '#FAF7F2',
        card: '#FFFFFF',
        ink: '#1F2430',
        muted: '#5B6170',
        rule: '#E4DED4',
        teal: { DEFAULT: '#0F6E6E', dark: '#0B5555', light: '#E3F0EF' },
        amber: { DEFAULT: '#C77C02', light: '#FBF0DC' },
        brick: { DEFAULT: '#A4402A', light: '#F7E6E1' },
        moss: { DEFAULT: '#4F7A3A', light: '#E8F0E2' },
      },
      fontFamily: {
        serif: ['var(--font-serif)', 'Georgia', 'serif'],
        sans: ['var(--font-sans)', 'system-ui', 'sans-serif'],
        mono: ['var(--font-mono)', 'ui-monospace', 'monospace'],
      },
      borderRadius: { DEFAULT: '3px', sm: '2px', md: '4px' },
    },
  },
} satisfies Config;
