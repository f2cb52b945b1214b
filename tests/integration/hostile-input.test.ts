import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { getDb } from '@/db';
import type { ActionState } from '@/lib/errors';
import { resetRateLimits } from '@/lib/rate-limit';
import { actionStatus } from './authz/shared';
import { signInAs } from './caller';
import { HOSTILE_TARGETS } from './hostile';
import { makeSessionWorld } from './authz/sessions';
import { makeWorld } from './world';
import { identicalRunsPlan } from '@/lib/cli/identical-runs-plan';
import { FINDING_LIMITS, toPlanJson, type Plan } from '@/lib/planning';

const ROOT = path.resolve(__dirname, '../..');

/** A checksum of every row of every table: equal before and after means nothing changed. */
function databaseChecksum(): string {
  const sqlite = getDb().$client;
  const tables = sqlite
    .prepare("select name from sqlite_master where type = 'table' and name not like 'sqlite_%' and name not like '__drizzle%' order by name")
    .all() as { name: string }[];
  const hash = crypto.createHash('sha256');
  for (const { name } of tables) {
    hash.update(name);
    for (const row of sqlite.prepare(`select * from "${name}" order by rowid`).all()) hash.update(JSON.stringify(row));
  }
  return hash.digest('hex');
}

// Strings that break naive code: huge, control characters, lone surrogates, RTL marks, zero-width,
// NUL, SQL and HTML fragments, path traversal, numbers at the edge of IEEE 754.
const nastyString = fc.oneof(
  fc.string({ maxLength: 40 }),
  fc.string({ unit: 'binary', maxLength: 40 }),
  fc.constantFrom(
    '',
    ' ',
    '\u0000',
    '\ud800',
    '\u202e\u202d',
    '\u200b',
    "'; drop table users; --",
    '<script>alert(1)</script>',
    '../../etc/passwd',
    'NaN',
    'Infinity',
    '-0',
    '1e308',
    '9'.repeat(400),
    'x'.repeat(100_000),
    'host',
    'operator@',
    '@@',
    'a@b',
  ),
);
const nastyJson = fc.oneof(
  fc.json({ depthSize: 'large', maxDepth: 6 }),
  fc.constantFrom(
    '',
    'null',
    '[]',
    '{',
    '{"version": NaN}',
    '{"version": 1e308}',
    '{"__proto__": {"admin": true}}',
    JSON.stringify({ version: 1, extra: 'x'.repeat(2_000_000) }),
    '['.repeat(5_000) + ']'.repeat(5_000),
    JSON.stringify({ runs: Array.from({ length: 10_000 }, () => ({})) }),
  ),
  fc.anything({ maxDepth: 5 }).map((v) => {
    try {
      return JSON.stringify(v) ?? 'null';
    } catch {
      return '{}';
    }
  }),
);

function discoverMutatingTargets(): string[] {
  const found: string[] = [];
  const walk = (dir: string): string[] =>
    fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? walk(path.join(dir, e.name)) : [path.join(dir, e.name)]));
  for (const file of walk(path.join(ROOT, 'app'))) {
    const rel = path.relative(ROOT, file).split(path.sep).join('/');
    const source = fs.readFileSync(file, 'utf8');
    if (rel.endsWith('/route.ts')) {
      for (const m of source.matchAll(/export\s+(?:async\s+)?function\s+(POST|PUT|PATCH|DELETE)\b/g)) found.push(`${rel}#${m[1]}`);
      for (const m of source.matchAll(/export\s*\{([^}]*)\}/g)) {
        for (const part of m[1]!.split(',')) {
          const name = part.trim().split(/\s+as\s+/).pop()?.trim();
          if (name && /^(POST|PUT|PATCH|DELETE)$/.test(name)) found.push(`${rel}#${name}`);
        }
      }
    }
    if (/^['"]use server['"]/.test(source.trimStart())) {
      for (const m of source.matchAll(/export\s+(?:async\s+function|const)\s+(\w+)/g)) found.push(`${rel}#${m[1]}`);
    }
  }
  return found.sort();
}

describe('hostile input', () => {
  it('covers every mutating route handler and server action', () => {
    expect(discoverMutatingTargets()).toEqual(HOSTILE_TARGETS.map((t) => t.target).sort());
  });

  // Reliability fault: server actions called with wrong arity, nulls or wrong shapes answered an
  // action state with status 500 (a TypeError). Anyone can post any arguments to an action, so every
  // one of them is called here with argument lists that cannot be right: no FormData anywhere (every
  // action takes one), FormData where an id belongs, objects that merely look like FormData.
  it('server actions called with wrong shapes (wrong arity, nulls, objects) answer 4xx, never 500', async () => {
    const world = makeWorld();
    signInAs(world.host);
    const actionFiles = [...new Set(discoverMutatingTargets().filter((t) => !t.includes('/route.ts#')).map((t) => t.split('#')[0]!))];
    const looksLikeForm = { get: () => 'x', getAll: () => ['x'], keys: () => ['name'][Symbol.iterator]() };
    const element = fc.oneof(
      fc.constantFrom<unknown>(null, undefined, 0, -1, NaN, true, '', world.railway.id, 'x'.repeat(10_000), {}, [], looksLikeForm, { ok: true }),
      fc.anything({ maxDepth: 2 }),
    );
    const argumentLists = fc.oneof(
      fc.array(element, { maxLength: 6 }),
      fc.constantFrom<unknown[]>([new FormData()], Array.from({ length: 5 }, () => new FormData())),
    );
    for (const file of actionFiles) {
      const actions = (await import(path.join(ROOT, file))) as Record<string, (...args: unknown[]) => Promise<ActionState>>;
      for (const [name, run] of Object.entries(actions)) {
        await fc.assert(
          fc.asyncProperty(argumentLists, async (args) => {
            resetRateLimits();
            const before = databaseChecksum();
            const status = await actionStatus(() => run(...args));
            expect(status, `${file}#${name}(${args.length} arguments)`).toBeGreaterThanOrEqual(400);
            expect(status, `${file}#${name}(${args.length} arguments)`).toBeLessThan(500);
            expect(databaseChecksum()).toBe(before);
          }),
          { numRuns: 25 },
        );
      }
    }
  }, 120_000);

  for (const target of HOSTILE_TARGETS) {
    if (target.kind === 'exempt') continue;
    it(`${target.target}: malformed input answers 4xx and changes nothing`, async () => {
      const world = makeWorld();
      signInAs(world.host);
      await target.setup?.(world);
      const arbitrary =
        target.kind === 'action'
          ? fc.record(Object.fromEntries(target.fields.map((f) => [f, nastyString])) as Record<string, fc.Arbitrary<string>>)
          : nastyJson;
      await fc.assert(
        fc.asyncProperty(arbitrary, async (input) => {
          resetRateLimits();
          const before = databaseChecksum();
          const status =
            target.kind === 'action'
              ? await target.send(world, input as Record<string, string>)
              : await target.send(world, input as string);
          expect(status).toBeGreaterThanOrEqual(400);
          expect(status).toBeLessThan(500);
          expect(databaseChecksum()).toBe(before);
        }),
        { numRuns: 40 },
      );
    }, 120_000);
  }
});

const jsonPost = (url: string, body: unknown) =>
  new Request(`http://127.0.0.1:3999${url}`, { method: 'POST', body: JSON.stringify(body), headers: { 'content-type': 'application/json' } });

describe('hostile plans (issue 10)', () => {
  it('finding 3, quadratic stall: 1,000 identical runs to POST /api/plans/check answer with capped findings and exact counts', async () => {
    const world = makeWorld();
    signInAs(world.planner);
    resetRateLimits();
    const { POST } = await import('@/app/api/plans/check/route');
    const plan = toPlanJson(identicalRunsPlan(1000));
    const body = JSON.stringify(plan);
    // The report's plan was 148 KiB; this one is of the same kind and size.
    expect(body.length).toBeGreaterThan(100_000);
    const response = await POST(jsonPost('/api/plans/check', plan), { params: Promise.resolve({}) });
    expect(response.status).toBe(200);
    const answer = (await response.json()) as { errors: number; counts: Record<string, number>; truncated: boolean; findings: unknown[] };
    const pairs = (1000 * 999) / 2;
    expect(answer.truncated).toBe(true);
    expect(answer.findings.length).toBe(FINDING_LIMITS.total);
    expect(answer.counts['block-overlap']).toBe(3 * pairs);
    expect(answer.counts['cab-double-booked']).toBe(pairs);
    expect(answer.counts['operator-double-booked']).toBe(pairs);
    expect(answer.counts['locomotive-in-two-trains']).toBe(pairs);
    expect(answer.errors).toBeGreaterThanOrEqual(6 * pairs);
  }, 120_000);

  it('finding 6, calendar injection through ids: a posted plan with a CRLF run id is refused, and new run ids are minted by the server', async () => {
    const world = makeWorld();
    signInAs(world.planner);
    const { session } = makeSessionWorld(world, { status: 'draft' });
    const route = await import('@/app/api/sessions/[sessionId]/plan/route');
    const ctx = { params: Promise.resolve({ sessionId: session.id }) };
    const plan = (await (await route.GET(new Request(`http://127.0.0.1:3999/api/sessions/${session.id}/plan`), ctx)).json()) as Plan;
    const keptId = plan.runs[0]!.id;

    const before = databaseChecksum();
    const injected = structuredClone(plan);
    injected.runs[1]!.id = 'x\r\nBEGIN:VALARM\r\nTRIGGER:-PT5M\r\nEND:VALARM';
    const refused = await route.POST(jsonPost(`/api/sessions/${session.id}/plan`, injected), ctx);
    expect(refused.status).toBe(400);
    expect(databaseChecksum()).toBe(before);

    const foreign = structuredClone(plan);
    foreign.runs[1]!.id = 'chosen-by-the-caller';
    const accepted = await route.POST(jsonPost(`/api/sessions/${session.id}/plan`, foreign), ctx);
    expect(accepted.status).toBe(200);
    const ids = ((await accepted.json()) as { runs: { id: string }[] }).runs.map((r) => r.id);
    expect(ids).toContain(keptId);
    expect(ids).not.toContain('chosen-by-the-caller');
    expect(ids).toHaveLength(2);
  });
});
