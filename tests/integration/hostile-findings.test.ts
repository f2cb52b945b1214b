import { createElement } from 'react';
import { renderToString } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { insertRuns } from '@/db/queries/runs';
import { makeLayout, makeSessionWorld } from './authz/sessions';
import { signInAs } from './caller';
import { makeWorld } from './world';

// The security review's findings (issue 10), each as the request that showed it, refused now.

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
    const { builderLayout, loadSessionPlan, snapshotOf } = await import('@/lib/sessions/builder');
    const { TimetableBuilder } = await import('@/components/timetable/timetable-builder');
    const loaded = loadSessionPlan(session.id);
    const props = { sessionId: session.id, initial: snapshotOf(session.id, loaded), layout: builderLayout(loaded.rows), canEdit: true, dateLabel: 'test evening' };
    const html = renderToString(createElement(TimetableBuilder, props));
    expect(html).toContain('data-testid="train-graph"');
    // Grid lines stay a handful, however far the run reaches (before: one per fast step up to 1e12 s).
    expect(html.match(/class="stroke-line"/g)?.length ?? 0).toBeLessThanOrEqual(60);
  });
});
