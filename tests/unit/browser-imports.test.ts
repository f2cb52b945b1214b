// The timetable, crew, live and session screens' client components run in the browser, where every
// module they import is JavaScript a phone downloads. zod and the plan schemas (over 100 KiB) must stay on the server: ESLint
// forbids importing them there directly; this test follows every value import from those folders, through
// lib/ and components/, and fails when zod is reached by any path (it crept back once through the
// fast-clock parser). Type-only imports are erased by the compiler and are not followed; nor are server
// actions ('use server' modules: the browser gets only a reference to call them).
import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const ROOT = path.resolve(__dirname, '../..');
const BROWSER_FOLDERS = ['components/timetable', 'components/crew', 'components/live', 'components/sessions'];
const FORBIDDEN = ['zod'];
const MAX_FILES = 2_000;

/** The value imports of one module: static ones that are not `import type`, re-exports, dynamic ones. */
export function valueImports(source: string): string[] {
  const found: string[] = [];
  const statement = /^\s*(import|export)\s+(type\s+)?([^;]*?)\s+from\s+['"]([^'"]+)['"]/gms;
  for (const match of source.matchAll(statement)) {
    const typeOnly = match[2] !== undefined;
    const names = match[3] ?? '';
    // `import { type A, type B } from` is type-only too.
    const allTyped = /^\{[^}]*\}$/.test(names.trim()) && names.replace(/[{}\s]/g, '').split(',').filter(Boolean).every((n) => n.startsWith('type'));
    if (!typeOnly && !allTyped) found.push(match[4]!);
  }
  for (const match of source.matchAll(/^\s*import\s+['"]([^'"]+)['"]/gm)) found.push(match[1]!);
  for (const match of source.matchAll(/\bimport\(\s*['"]([^'"]+)['"]\s*\)/g)) found.push(match[1]!);
  return found;
}

function resolveModule(from: string, specifier: string): string | null {
  let base: string;
  if (specifier.startsWith('@/')) base = path.join(ROOT, specifier.slice(2));
  else if (specifier.startsWith('.')) base = path.resolve(path.dirname(from), specifier);
  else return null; // a package
  for (const candidate of [base, `${base}.ts`, `${base}.tsx`, path.join(base, 'index.ts'), path.join(base, 'index.tsx')]) {
    if (fs.existsSync(candidate) && fs.statSync(candidate).isFile()) return candidate;
  }
  return null;
}

const directive = (file: string) => /^\s*(?:\/\/[^\n]*\n\s*)*['"](use client|use server)['"]/.exec(fs.readFileSync(file, 'utf8'))?.[1];

/** The client components (a 'use client' module is where the browser's bundle starts) under a folder. */
function clientEntriesUnder(folder: string): string[] {
  return fs
    .readdirSync(path.join(ROOT, folder), { recursive: true, encoding: 'utf8' })
    .filter((name) => /\.(ts|tsx)$/.test(name))
    .map((name) => path.join(ROOT, folder, name))
    .filter((file) => directive(file) === 'use client');
}

/** Each forbidden package reached from the start files, with the chain of modules that reaches it. */
function forbiddenReached(start: string[]): string[] {
  const parent = new Map<string, string | null>(start.map((file) => [file, null]));
  const queue = [...start];
  const reached: string[] = [];
  while (queue.length > 0 && parent.size <= MAX_FILES) {
    const file = queue.shift()!;
    for (const specifier of valueImports(fs.readFileSync(file, 'utf8'))) {
      if (FORBIDDEN.includes(specifier)) {
        const chain: string[] = [];
        for (let at: string | null | undefined = file; at; at = parent.get(at)) chain.unshift(path.relative(ROOT, at));
        reached.push(`${specifier} ← ${chain.join(' → ')}`);
        continue;
      }
      const next = resolveModule(file, specifier);
      if (next && !parent.has(next) && directive(next) !== 'use server') {
        parent.set(next, file);
        queue.push(next);
      }
    }
  }
  expect(parent.size, 'import walk stopped at its cap').toBeLessThanOrEqual(MAX_FILES);
  return reached;
}

describe('browser code stays free of zod', () => {
  it('reads value imports and skips type-only ones', () => {
    const source = [
      "import type { Plan } from '@/lib/planning';",
      "import { type A, type B } from './types';",
      "import { formatFast, type FastClock } from '@/lib/planning/clock';",
      "export { x } from './x';",
      "const View = dynamic(() => import('./view'));",
    ].join('\n');
    expect(valueImports(source)).toEqual(['@/lib/planning/clock', './x', './view']);
  });

  it('no value import from the timetable, crew, live or session components reaches zod', () => {
    const start = BROWSER_FOLDERS.flatMap(clientEntriesUnder);
    expect(start.length).toBeGreaterThan(10);
    expect(forbiddenReached(start)).toEqual([]);
  });

  it('the walk finds zod where it is imported (the plan schema, a module it must not reach)', () => {
    expect(forbiddenReached([path.join(ROOT, 'lib/planning/schema.ts')])).toEqual(['zod ← lib/planning/schema.ts']);
  });
});
