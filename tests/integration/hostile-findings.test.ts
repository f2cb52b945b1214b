import fs from 'node:fs';
import path from 'node:path';
import { createElement } from 'react';
import { renderToString } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { insertRuns } from '@/db/queries/runs';
import { makeLayout, makeSessionWorld } from './authz/sessions';
import { signInAs } from './caller';
import { makeWorld } from './world';

// The security review's findings (issue 10), each as the request that showed it, refused now.

const ROOT = path.resolve(__dirname, '../..');
const ctx = <P>(params: P) => ({ params: Promise.resolve(params) });
const url = (path: string) => `http://127.0.0.1:3999${path}`;
const json = (method: string, path: string, body: unknown) =>
  new Request(url(path), { method, headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });

describe('finding 2: one stored run or layout far outside physical ranges', () => {
  function attackWorld() {
    const world = makeWorld();
    signInAs(world.planner);
    const s = makeSessionWorld(world);
    // departS 0, arriveS 1e12 with matching steps: once stored, every view of the session crashed the server.
    const attack = {
      trainId: s.layout.trains.t1,
      cabId: s.layout.cabs.c1,
      operatorId: null,
      departS: 0,
      arriveS: 1e12,
      steps: [{ blockId: s.layout.blocks.A!, enterS: 0, exitS: 1e12 }],
    };
    return { world, ...s, attack };
  }

  it('POST runs with departS 0, arriveS 1e12 and matching steps answers 400 and stores nothing', async () => {
    const { session, attack, runIds } = attackWorld();
    const { POST, GET } = await import('@/app/api/sessions/[sessionId]/runs/route');
    const response = await POST(json('POST', `/api/sessions/${session.id}/runs`, attack), ctx({ sessionId: session.id }));
    expect(response.status).toBe(400);
    expect((await response.json()).issues.map((i: { path: string }) => i.path)).toContain('arriveS');
    const list = await (await GET(new Request(url(`/api/sessions/${session.id}/runs`)), ctx({ sessionId: session.id }))).json();
    expect(list.runs.map((r: { id: string }) => r.id).sort()).toEqual([...runIds].sort());
  });

  it('PATCH a run to the same times, or its departure past the session, answers 400', async () => {
    const { session, attack, runIds } = attackWorld();
    const { PATCH } = await import('@/app/api/sessions/[sessionId]/runs/[runId]/route');
    const patch = (body: unknown) => PATCH(json('PATCH', `/api/sessions/${session.id}/runs/${runIds[0]}`, body), ctx({ sessionId: session.id, runId: runIds[0] }));
    expect((await patch({ version: 1, steps: { departS: 0, arriveS: 1e12, steps: attack.steps } })).status).toBe(400);
    expect((await patch({ version: 1, departS: 1e12 })).status).toBe(400);
    expect((await patch({ version: 1, departS: -600 })).status).toBe(400);
    // An ordinary move inside the three-hour session still works.
    expect((await patch({ version: 1, departS: 600 })).status).toBe(200);
  });

  it('a series whose copies run past the session answers 400', async () => {
    const { session, runIds } = attackWorld();
    const { POST } = await import('@/app/api/sessions/[sessionId]/runs/[runId]/series/route');
    const series = (body: unknown) => POST(json('POST', `/api/sessions/${session.id}/runs/${runIds[0]}/series`, body), ctx({ sessionId: session.id, runId: runIds[0] }));
    // 50 copies a fast day apart at 4:1 reach 12.5 real days into a three-hour session.
    expect((await series({ everyFastMin: 1440, count: 50 })).status).toBe(400);
    expect((await series({ everyFastMin: 20, count: 2 })).status).toBe(201);
  });

  it('POST plan with a run at 1e12 s, and a retime a week late, answer 400', async () => {
    const { session, runIds } = attackWorld();
    const planRoute = await import('@/app/api/sessions/[sessionId]/plan/route');
    const plan = await (await planRoute.GET(new Request(url(`/api/sessions/${session.id}/plan`)), ctx({ sessionId: session.id }))).json();
    plan.runs[0] = { ...plan.runs[0], arriveS: 1e12, steps: plan.runs[0].steps.map((s: { exitS: number }, i: number, all: unknown[]) => (i === all.length - 1 ? { ...s, exitS: 1e12 } : s)) };
    expect((await planRoute.POST(json('POST', `/api/sessions/${session.id}/plan`, plan), ctx({ sessionId: session.id }))).status).toBe(400);
    const { POST } = await import('@/app/api/sessions/[sessionId]/retime/route');
    const late = await POST(json('POST', `/api/sessions/${session.id}/retime`, { moves: [{ runId: runIds[0], version: 1, delayS: 7 * 86_400 }] }), ctx({ sessionId: session.id }));
    expect(late.status).toBe(400);
  });

  it('importing a layout with scale.ratio 1e308 answers 400 and creates no layout', async () => {
    const world = makeWorld();
    signInAs(world.planner);
    const { layoutId } = makeLayout(world.railway.id);
    const { GET } = await import('@/app/api/layouts/[layoutId]/plan/route');
    const plan = await (await GET(new Request(url(`/api/layouts/${layoutId}/plan`)), ctx({ layoutId }))).json();
    const { POST } = await import('@/app/api/layouts/import/route');
    const send = (ratio: number) => POST(json('POST', '/api/layouts/import', { railwayId: world.railway.id, plan: { ...plan, scale: { ...plan.scale, ratio } } }), ctx({}));
    const refused = await send(1e308);
    expect(refused.status).toBe(400);
    expect((await refused.json()).issues.map((i: { path: string }) => i.path)).toContain('scale.ratio');
    // The same file at H0's 1:87 (NEM 010, Table 1) imports.
    expect((await send(87)).status).toBe(201);
  });

  it('a session that already stores such a run still renders: the timetable builder as the page renders it on the server', async () => {
    const { session, attack } = attackWorld();
    insertRuns(session.id, [{ ...attack, speedKmh: null, note: '' }]);
    const { GET } = await import('@/app/api/sessions/[sessionId]/check/route');
    expect((await GET(new Request(url(`/api/sessions/${session.id}/check`)), ctx({ sessionId: session.id }))).status).toBe(200);
    // What the session page does (app/(app)/railways/[railwayId]/sessions/[sessionId]/page.tsx).
    const { timetablePageProps, loadSessionPlan } = await import('@/lib/sessions/timetable');
    const { TimetableBuilder } = await import('@/components/timetable/timetable-builder');
    const loaded = loadSessionPlan(session.id);
    const props = { sessionId: session.id, ...timetablePageProps(session.id, loaded), canEdit: true, dateLabel: 'test evening' };
    const html = renderToString(createElement(TimetableBuilder, props));
    expect(html).toContain('data-testid="train-graph"');
    // Grid lines stay a handful, however far the run reaches (before: one per fast step up to 1e12 s).
    expect(html.match(/class="stroke-line"/g)?.length ?? 0).toBeLessThanOrEqual(60);
  });
});

/**
 * A chunked body of `totalBytes` (no Content-Length), made only as the server pulls it: `pulled`
 * says how much the server read, so "stopped at the limit" and "read nothing" can be checked
 * without the test itself holding the body in memory.
 */
function lazyBody(totalBytes: number, chunkBytes = 64 * 1024) {
  const chunk = new Uint8Array(chunkBytes).fill(0x20); // spaces: valid anywhere in JSON, CSV or a form
  const seen = { pulled: 0 };
  const stream = new ReadableStream<Uint8Array>({
    pull(controller) {
      if (seen.pulled >= totalBytes) return controller.close();
      seen.pulled += chunk.byteLength;
      controller.enqueue(chunk);
    },
  });
  return { stream, seen };
}

const chunked = (path: string, contentType: string, totalBytes: number) => {
  const body = lazyBody(totalBytes);
  const request = new Request(url(path), { method: 'POST', body: body.stream, headers: { 'content-type': contentType }, duplex: 'half' } as RequestInit);
  return { request, seen: body.seen };
};

describe('finding 5: bodies are read after the caller is known, counted as they stream, and cut off at the limit', () => {
  const MB = 1024 * 1024;

  it('layout import: a signed-out 200 MB chunked body answers 401 having read (almost) none of it', async () => {
    signInAs(null);
    const { POST } = await import('@/app/api/layouts/import/route');
    const { request, seen } = chunked('/api/layouts/import', 'application/json', 200 * MB);
    const response = await POST(request, ctx({}));
    expect(response.status).toBe(401);
    // At most what the stream queues on its own before anyone reads (one chunk).
    expect(seen.pulled).toBeLessThanOrEqual(64 * 1024);
  });

  it('every body-reading route answers a 50 MB chunked body with 413, never 500, having read no more than its limit and one chunk', async () => {
    const world = makeWorld();
    signInAs(world.host);
    const s = makeSessionWorld(world);
    const { layoutId } = s.layout;
    const cases: { name: string; limit: number; send: () => Promise<{ status: number; pulled: number }> }[] = [];
    const add = (name: string, limit: number, path: string, type: string, call: (request: Request) => Promise<Response>) =>
      cases.push({
        name,
        limit,
        send: async () => {
          const { request, seen } = chunked(path, type, 50 * MB);
          const response = await call(request);
          return { status: response.status, pulled: seen.pulled };
        },
      });
    const importRoute = await import('@/app/api/layouts/import/route');
    add('layout import', 2_000_000, '/api/layouts/import', 'application/json', (r) => importRoute.POST(r, ctx({})));
    const csvRoute = await import('@/app/api/layouts/[layoutId]/csv/[table]/route');
    add('CSV import', 1_000_000, `/api/layouts/${layoutId}/csv/blocks?mode=preview`, 'text/csv', (r) => csvRoute.POST(r, ctx({ layoutId, table: 'blocks' })));
    const imageRoute = await import('@/app/api/layouts/[layoutId]/track-plan/route');
    add('track-plan upload', 5 * MB + 64_000, `/api/layouts/${layoutId}/track-plan`, 'multipart/form-data; boundary=x', (r) => imageRoute.POST(r, ctx({ layoutId })));
    const runsRoute = await import('@/app/api/sessions/[sessionId]/runs/route');
    add('runs (JSON)', 1_000_000, `/api/sessions/${s.session.id}/runs`, 'application/json', (r) => runsRoute.POST(r, ctx({ sessionId: s.session.id })));
    const planRoute = await import('@/app/api/sessions/[sessionId]/plan/route');
    add('session plan (JSON)', 5_000_000, `/api/sessions/${s.session.id}/plan`, 'application/json', (r) => planRoute.POST(r, ctx({ sessionId: s.session.id })));
    const checkRoute = await import('@/app/api/plans/check/route');
    add('plan check (JSON)', 5_000_000, '/api/plans/check', 'application/json', (r) => checkRoute.POST(r, ctx({})));
    for (const c of cases) {
      const { status, pulled } = await c.send();
      expect(status, c.name).toBe(413);
      expect(pulled, c.name).toBeLessThanOrEqual(c.limit + 2 * 64 * 1024);
    }
  });
});

describe('finding 13: writes from another site are refused', () => {
  const ROUTES = (() => {
    const found: string[] = [];
    const walk = (dir: string): string[] =>
      fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? walk(path.join(dir, e.name)) : [path.join(dir, e.name)]));
    for (const file of walk(path.join(ROOT, 'app/api'))) {
      if (!file.endsWith('route.ts') || file.includes('[...nextauth]')) continue; // next-auth checks its own CSRF token
      for (const m of fs.readFileSync(file, 'utf8').matchAll(/\b(\w+) as (POST|PUT|PATCH|DELETE)\b|export\s+(?:async\s+)?function\s+(POST|PUT|PATCH|DELETE)\b/g)) {
        found.push(`${path.relative(ROOT, file)}#${m[2] ?? m[3]}`);
      }
    }
    return found;
  })();

  it('every mutating route handler answers 403 to a browser write from another origin or site, before anything else', async () => {
    const world = makeWorld();
    signInAs(world.host);
    expect(ROUTES.length).toBeGreaterThan(8);
    const foreign: Record<string, string>[] = [
      { origin: 'http://127.0.0.1:4000' }, // another port of the same host: SameSite=Lax does not separate it
      { origin: 'http://evil.example' },
      { origin: 'null' },
      { 'sec-fetch-site': 'same-site' },
      { 'sec-fetch-site': 'cross-site' },
    ];
    for (const route of ROUTES) {
      const [file, method] = route.split('#') as [string, string];
      const handlers = (await import(path.join(ROOT, file))) as Record<string, (r: Request, c: unknown) => Promise<Response>>;
      for (const headers of foreign) {
        const request = new Request(url('/api/x'), { method, body: method === 'DELETE' ? undefined : '{}', headers: { 'content-type': 'application/json', ...headers } });
        const response = await handlers[method]!(request, ctx({ sessionId: 'x', runId: 'x', layoutId: 'x', table: 'blocks' }));
        expect(response.status, `${route} with ${JSON.stringify(headers)}`).toBe(403);
      }
    }
  });

  it('a text/plain body (what a cross-site form sends without asking) answers 415 and stores nothing; the same from this site as JSON works', async () => {
    const world = makeWorld();
    signInAs(world.planner);
    const s = makeSessionWorld(world);
    const body = JSON.stringify({ trainId: s.layout.trains.t1, cabId: s.layout.cabs.c1, operatorId: null, depart: '06:30', waypoints: [s.layout.blocks.A, s.layout.blocks.D], speedKmh: 60 });
    const { POST } = await import('@/app/api/sessions/[sessionId]/runs/route');
    const send = (headers: Record<string, string>) => POST(new Request(url(`/api/sessions/${s.session.id}/runs`), { method: 'POST', body, headers }), ctx({ sessionId: s.session.id }));
    expect((await send({ 'content-type': 'text/plain' })).status).toBe(415);
    expect((await send({})).status).toBe(415); // a string body is text/plain;charset=UTF-8 by default
    expect((await send({ 'content-type': 'application/x-www-form-urlencoded' })).status).toBe(415);
    const csv = await import('@/app/api/layouts/[layoutId]/csv/[table]/route');
    const csvPlain = new Request(url(`/api/layouts/${s.layout.layoutId}/csv/blocks?mode=preview`), { method: 'POST', body: 'name,length\nX,10', headers: { 'content-type': 'text/plain' } });
    expect((await csv.POST(csvPlain, ctx({ layoutId: s.layout.layoutId, table: 'blocks' }))).status).toBe(415);
    const { GET } = await import('@/app/api/sessions/[sessionId]/runs/route');
    const runs = async () => (await (await GET(new Request(url(`/api/sessions/${s.session.id}/runs`)), ctx({ sessionId: s.session.id }))).json()).runs.length;
    expect(await runs()).toBe(2);
    // From this site (same origin, or no browser headers at all, as curl sends): accepted.
    expect((await send({ 'content-type': 'application/json', origin: 'http://127.0.0.1:3999', 'sec-fetch-site': 'same-origin' })).status).toBe(201);
    expect((await send({ 'content-type': 'application/json; charset=utf-8' })).status).toBe(201);
    expect(await runs()).toBe(4);
  });
});

describe('finding 12: CSV exports escape formulae', () => {
  it('a name a spreadsheet would run as a formula is exported behind a quote, and imports back as it was', async () => {
    const world = makeWorld();
    signInAs(world.planner);
    const { insertLayout } = await import('@/db/queries/layouts');
    const { insertBlock } = await import('@/db/queries/layout-blocks');
    const layout = insertLayout(world.railway.id, { name: 'Formulae', scaleName: 'H0 (NEM)', scaleRatio: 87, setting: 'indoor', notes: '' });
    // OWASP, "CSV Injection": cells starting with =, +, -, @ (tab and carriage return too) run as formulae.
    const hostile = ['=HYPERLINK("http://evil.example","Yard")', '+1+1', '-2+3', '@SUM(1)', "'=already quoted"];
    const ordinary = ['Yard road 1', "Brook's halt", 'Platform 2 (east)'];
    [...hostile, ...ordinary].forEach((name, i) => insertBlock(layout.id, { name, lengthMm: 1000, positionMm: i * 1000 }));
    const csvRoute = await import('@/app/api/layouts/[layoutId]/csv/[table]/route');
    const text = await (await csvRoute.GET(new Request(url('/api/x')), ctx({ layoutId: layout.id, table: 'blocks' }))).text();
    const Papa = (await import('papaparse')).default;
    const cells = Papa.parse<string[]>(text.trim()).data.slice(1).map((row) => row[0]!);
    for (const name of hostile) expect(cells).toContain(`'${name}`);
    for (const name of ordinary) expect(cells).toContain(name);
    for (const cell of cells) expect(cell).not.toMatch(/^[=+\-@\t\r]/);
    // Round trip: the export into an empty layout gives the same names.
    const empty = insertLayout(world.railway.id, { name: 'Empty', scaleName: 'H0 (NEM)', scaleRatio: 87, setting: 'indoor', notes: '' });
    const send = (query: string) =>
      csvRoute.POST(new Request(url(`/api/x?${query}`), { method: 'POST', body: text, headers: { 'content-type': 'text/csv' } }), ctx({ layoutId: empty.id, table: 'blocks' }));
    const preview = await (await send('mode=preview')).json();
    expect(preview.issues).toEqual([]);
    expect((await send(`mode=commit&basis=${preview.basis}`)).status).toBe(200);
    const { loadLayoutRows } = await import('@/db/queries/plan-data');
    expect(loadLayoutRows(empty.id).blocks.map((b) => b.name).sort()).toEqual([...hostile, ...ordinary].sort());
  });
});
