import js from '@eslint/js';
import nextPlugin from '@next/eslint-plugin-next';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import tseslint from 'typescript-eslint';

export default tseslint.config(
  { ignores: ['node_modules/', '.next/', '.next-*/', 'data/', 'drizzle/', 'test-results/', 'playwright-report/', 'next-env.d.ts', '.stryker-tmp/', 'reports/', 'stryker-setup-*.js'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ['**/*.{ts,tsx,mts,mjs}'],
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    plugins: { 'react-hooks': reactHooks, '@next/next': nextPlugin },
    rules: {
      ...reactHooks.configs.recommended.rules,
      ...nextPlugin.configs.recommended.rules,
      ...nextPlugin.configs['core-web-vitals'].rules,
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      // The React Compiler's rules: we do not compile with it, so they advise rather than block.
      'react-hooks/refs': 'warn',
      'react-hooks/set-state-in-effect': 'warn',
      'react-hooks/incompatible-library': 'warn',
    },
  },
  {
    // Server Components render once per request: reading the clock there is intended.
    files: ['app/**/page.tsx', 'app/**/layout.tsx'],
    rules: { 'react-hooks/purity': 'off' },
  },
  {
    // Playwright fixtures call their own `use`, which is not React's.
    files: ['tests/e2e/**/*.ts'],
    rules: { 'react-hooks/rules-of-hooks': 'off' },
  },
  {
    // The planning engine and the control schedule stay pure: no React, no database, no Next.js, no Node built-ins.
    files: ['lib/planning/**/*.ts', 'lib/control/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        { patterns: ['react', 'react/*', 'next', 'next/*', 'drizzle-orm', 'drizzle-orm/*', 'better-sqlite3', 'node:*', '@/db', '@/db/*', '@/components/*', '@/app/*'] },
      ],
    },
  },
  {
    // db/ is the ground floor: it imports nothing from lib/, components/ or app/.
    files: ['db/**/*.ts'],
    rules: { 'no-restricted-imports': ['error', { patterns: ['@/lib/*', '@/components/*', '@/app/*'] }] },
  },
  {
    // lib/ holds services, schemas and plumbing; it never reaches up into screens or routes. Server actions
    // live beside the page that uses them in app/ and call lib/'s services (lib/planning has its own, stricter rule above).
    files: ['lib/**/*.{ts,tsx}'],
    ignores: ['lib/planning/**'],
    rules: { 'no-restricted-imports': ['error', { patterns: ['@/components', '@/components/*', '@/app', '@/app/*'] }] },
  },
  {
    // Components never touch the database.
    files: ['components/**/*.{ts,tsx}'],
    rules: { 'no-restricted-imports': ['error', { patterns: ['@/db', '@/db/*', '@/app/**/page', '@/app/**/layout'] }] },
  },
  {
    // The builder, My runs, the crew card and the live pages run in the browser: zod and the plan schemas
    // (over 100 KiB) stay on the server. Types are fine; values come from the zod-free modules
    // (lib/planning/{clock,route,finding,session-clock}, lib/runs/fields, lib/validations/session-constants).
    files: ['components/timetable/**/*.{ts,tsx}', 'components/crew/**/*.{ts,tsx}', 'components/live/**/*.{ts,tsx}', 'components/sessions/**/*.{ts,tsx}'],
    rules: {
      '@typescript-eslint/no-restricted-imports': [
        'error',
        {
          paths: ['zod', '@/lib/planning', '@/lib/runs/schema', '@/lib/validations/session'].map((name) => ({
            name,
            allowTypeImports: true,
            message: 'Browser code here imports values from zod-free modules (see eslint.config.mjs).',
          })),
        },
      ],
    },
  },
);
