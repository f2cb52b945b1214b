import type { Config } from 'tailwindcss';

/**
 * Fishplate's palette: a verdigris green for actions, brass for highlights, warm paper and iron ink.
 * Colours are CSS variables (set in app/globals.css) so light and dark share one set of names.
 */
const config: Config = {
  content: ['./app/**/*.{ts,tsx}', './components/**/*.{ts,tsx}'],
  darkMode: 'media',
  theme: {
    extend: {
      colors: {
        paper: 'var(--paper)',
        surface: 'var(--surface)',
        sunken: 'var(--sunken)',
        ink: 'var(--ink)',
        muted: 'var(--muted)',
        line: 'var(--line)',
        verdigris: { DEFAULT: 'var(--verdigris)', strong: 'var(--verdigris-strong)', soft: 'var(--verdigris-soft)' },
        brass: { DEFAULT: 'var(--brass)', soft: 'var(--brass-soft)' },
        signal: { DEFAULT: 'var(--signal)', soft: 'var(--signal-soft)' },
        amber: { DEFAULT: 'var(--amber)', soft: 'var(--amber-soft)' },
      },
      fontFamily: {
        sans: ['var(--font-body)', 'system-ui', 'sans-serif'],
        display: ['var(--font-display)', 'var(--font-body)', 'system-ui', 'sans-serif'],
      },
      borderRadius: { plate: '0.625rem' },
    },
  },
};

export default config;
