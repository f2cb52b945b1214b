import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { AUTHZ_CASES, AUTHZ_EXEMPTIONS } from './authz';
import { signInAs } from './caller';
import { makeWorld, ROLE_KEYS } from './world';

const ROOT = path.resolve(__dirname, '../..');

function walk(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(dir, entry.name);
    return entry.isDirectory() ? walk(full) : [full];
  });
}

/** Every exported route handler method and server action in app/, as `file#export`. */
function discoverTargets(): string[] {
  const targets: string[] = [];
  for (const file of walk(path.join(ROOT, 'app'))) {
    const rel = path.relative(ROOT, file).split(path.sep).join('/');
    const source = fs.readFileSync(file, 'utf8');
    if (/\/route\.ts$/.test(rel)) {
      for (const m of source.matchAll(/export\s+(?:async\s+)?function\s+(GET|POST|PUT|PATCH|DELETE)\b/g)) targets.push(`${rel}#${m[1]}`);
      for (const m of source.matchAll(/export\s*\{([^}]*)\}/g)) {
        for (const part of m[1]!.split(',')) {
          const name = part.trim().split(/\s+as\s+/).pop()?.trim();
          if (name && /^(GET|POST|PUT|PATCH|DELETE)$/.test(name)) targets.push(`${rel}#${name}`);
        }
      }
    }
    if (/^['"]use server['"]/.test(source.trimStart())) {
      for (const m of source.matchAll(/export\s+(?:async\s+function|const)\s+(\w+)/g)) targets.push(`${rel}#${m[1]}`);
    }
  }
  return targets.sort();
}

describe('authorization matrix', () => {
  it('has a row for every route handler and server action (a new one fails here until it gets one)', () => {
    const listed = [...AUTHZ_CASES.map((c) => c.target), ...AUTHZ_EXEMPTIONS.map((e) => e.target)].sort();
    expect(discoverTargets()).toEqual(listed);
  });

  for (const testCase of AUTHZ_CASES) {
    for (const role of ROLE_KEYS) {
      it(`${testCase.target} as ${role} → ${testCase.expect[role]}`, async () => {
        const world = makeWorld();
        signInAs(world.users[role]);
        expect(await testCase.call(world)).toBe(testCase.expect[role]);
      });
    }
  }
});
