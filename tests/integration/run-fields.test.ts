// Every copy path carries every field of a run: series, plan export and import, and the builder's
// undo of a delete and of an edit. The sample below is typed as the schema's RunFields, so a field
// added to the schema fails to compile here until the sample gives it a value, and the checks run
// over the schema's own field names, so a copy path that drops the new field fails at run time.
import { describe, expect, it } from 'vitest';
import { DELETE, PATCH } from '@/app/api/sessions/[sessionId]/runs/[runId]/route';
import { POST as postSeries } from '@/app/api/sessions/[sessionId]/runs/[runId]/series/route';
import { POST as createRun } from '@/app/api/sessions/[sessionId]/runs/route';
import { GET as getPlan, POST as postPlan } from '@/app/api/sessions/[sessionId]/plan/route';
import { getRun } from '@/db/queries/runs';
import { RUN_FIELD_NAMES, restoreEdit, runFieldsOf, runFieldsSchema, shiftTiming, type RunFields } from '@/lib/runs/schema';
import { planSchema, toPlanJson } from '@/lib/planning';
import type { TimetableChange } from '@/lib/sessions/types';
import { makeSessionWorld, timedSteps } from './authz/sessions';
import { signInAs } from './caller';
import { makeWorld } from './world';

const ctx = <P>(params: P) => ({ params: Promise.resolve(params) });
const url = (path: string) => `http://127.0.0.1:3999${path}`;
const json = (method: string, path: string, body?: unknown) =>
  new Request(url(path), {
    method,
    ...(body === undefined ? {} : { headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) }),
  });

async function ok<T>(response: Response, status = 200): Promise<T> {
  const body = await response.json();
  expect(response.status, JSON.stringify(body)).toBe(status);
  return body as T;
}

function setup() {
  const w = makeWorld();
  const s = makeSessionWorld(w);
  signInAs(w.planner);
  const sid = s.session.id;
  // No field at its default, so a path that drops one (and lets the default stand) is seen.
  const sample: RunFields = {
    trainId: s.layout.trains.t2,
    cabId: s.layout.cabs.c2,
    operatorId: w.operator.id,
    ...timedSteps(s.layout, ['A', 'B', 'C', 'D'], 1800),
    speedKmh: 47.5,
    note: 'Stops at every platform',
  };
  return { w, s, sid, sample };
}

async function addSample(sid: string, sample: RunFields) {
  const change = await ok<TimetableChange>(await createRun(json('POST', `/api/sessions/${sid}/runs`, sample), ctx({ sessionId: sid })), 201);
  return getRun(sid, change.run!.id)!;
}

/** Every field of the run, by the schema's names; times and steps are compared after `shiftS`. */
function expectSameFields(actual: RunFields, expected: RunFields, shiftS = 0) {
  const want = { ...expected, ...shiftTiming(expected, shiftS) };
  for (const name of RUN_FIELD_NAMES) {
    if (name === 'departS' || name === 'arriveS') expect(actual[name], name).toBeCloseTo(want[name], 6);
    else if (name === 'steps') {
      expect(actual.steps.map((st) => st.blockId), name).toEqual(want.steps.map((st) => st.blockId));
      actual.steps.forEach((st, i) => {
        expect(st.enterS).toBeCloseTo(want.steps[i]!.enterS, 6);
        expect(st.exitS).toBeCloseTo(want.steps[i]!.exitS, 6);
      });
    } else expect(actual[name], name).toEqual(want[name]);
  }
}

describe('every field of a run travels through each copy path', () => {
  it('the sample names every field of the schema, none at its default', () => {
    const { sample } = setup();
    expect(Object.keys(sample).sort()).toEqual([...RUN_FIELD_NAMES].sort());
    for (const name of RUN_FIELD_NAMES) {
      const fallback = runFieldsSchema.shape[name].safeParse(undefined);
      if (fallback.success) expect(sample[name], name).not.toEqual(fallback.data);
    }
  });

  it('a series copies every field, shifted by the interval', async () => {
    const { sid, sample } = setup();
    const source = await addSample(sid, sample);
    const path = `/api/sessions/${sid}/runs/${source.id}/series`;
    const change = await ok<TimetableChange>(await postSeries(json('POST', path, { everyFastMin: 20, count: 2 }), ctx({ sessionId: sid, runId: source.id })), 201);
    expect(change.createdIds).toHaveLength(2);
    // 20 fast minutes at 4:1 are 20 × 60 / 4 = 300 real seconds.
    change.createdIds!.forEach((id, i) => expectSameFields(getRun(sid, id)!, sample, 300 * (i + 1)));
  });

  it('a plan read and posted back leaves every field of every run as it was', async () => {
    const { sid, sample } = setup();
    const source = await addSample(sid, sample);
    const plan = await ok<unknown>(await getPlan(json('GET', `/api/sessions/${sid}/plan`), ctx({ sessionId: sid })));
    await ok(await postPlan(json('POST', `/api/sessions/${sid}/plan`, plan), ctx({ sessionId: sid })));
    expectSameFields(getRun(sid, source.id)!, sample);
  });

  it('a plan posted with only the interchange fields keeps the rest from the stored run of the same id', async () => {
    const { sid, sample } = setup();
    const source = await addSample(sid, sample);
    const exported = await ok<unknown>(await getPlan(json('GET', `/api/sessions/${sid}/plan`), ctx({ sessionId: sid })));
    // The engine's own schema drops what the interchange does not define; written back as version 2.
    const bare = toPlanJson(planSchema.parse(exported));
    expect(Object.keys(bare.runs.find((r) => r.id === source.id)!)).not.toContain('note');
    await ok(await postPlan(json('POST', `/api/sessions/${sid}/plan`, bare), ctx({ sessionId: sid })));
    expectSameFields(getRun(sid, source.id)!, sample);
  });

  it('undo of a delete puts back every field (the builder posts runFieldsOf the deleted run)', async () => {
    const { sid, sample } = setup();
    const source = await addSample(sid, sample);
    const path = `/api/sessions/${sid}/runs/${source.id}?version=${source.version}`;
    const deleted = await ok<TimetableChange>(await DELETE(json('DELETE', path), ctx({ sessionId: sid, runId: source.id })));
    expect(getRun(sid, source.id)).toBeUndefined();
    const back = await addSample(sid, runFieldsOf(deleted.deleted!));
    expectSameFields(back, sample);
  });

  it('undo of an edit puts back every field (the builder sends restoreEdit of the run before)', async () => {
    const { w, s, sid, sample } = setup();
    const before = await addSample(sid, sample);
    const path = `/api/sessions/${sid}/runs/${before.id}`;
    const edit = {
      version: before.version,
      trainId: s.layout.trains.t1,
      cabId: s.layout.cabs.c1,
      operatorId: w.planner.id,
      note: 'Changed',
      timing: { waypoints: [s.layout.blocks.D, s.layout.blocks.A], speedKmh: 80, standBeforeS: 10, standAfterS: 10 },
    };
    await ok(await PATCH(json('PATCH', path, edit), ctx({ sessionId: sid, runId: before.id })));
    const edited = getRun(sid, before.id)!;
    expect(edited.speedKmh).toBe(80);
    expect(edited.steps[0]!.blockId).toBe(s.layout.blocks.D);
    await ok(await PATCH(json('PATCH', path, restoreEdit(before, edited.version)), ctx({ sessionId: sid, runId: before.id })));
    expectSameFields(getRun(sid, before.id)!, sample);
  });
});
