import { describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { formatIssuePath, formatPlanIssues, planSchema, toPlanJson } from '@/lib/planning';

/** Version 1 of the interchange, as a file holds it: `locos` and trains' `locoIds`. */
type PlanV1 = Extract<z.input<typeof planSchema>, { version: 1 }>;

function goodPlan(): PlanV1 {
  return {
    version: 1,
    scale: { name: 'H0', ratio: 87 },
    clock: { ratio: 6, fastStart: '06:00' },
    rules: { headwayS: 30, surgeS: 2, derate: 0.8 },
    supplies: [{ id: 's1', name: 'Supply', volts: 12, amps: 5 }],
    drivers: [{ id: 'd1', name: 'Driver', supplyId: 's1', channels: 2, channelAmps: 1, channelPeakAmps: 2, totalAmps: null, dropVolts: 2.6 }],
    cabs: [
      { id: 'c1', name: 'Cab 1', driverId: 'd1', channel: 1 },
      { id: 'c2', name: 'Cab 2', driverId: 'd1', channel: 2 },
    ],
    blocks: [
      { id: 'A', name: 'A', lengthMm: 2000 },
      { id: 'B', name: 'B', lengthMm: 2000 },
    ],
    links: [{ a: 'A', b: 'B' }],
    locos: [{ id: 'l1', name: 'Loco', runningAmps: 0.3, stallAmps: 0.9, ratedVolts: 12 }],
    trains: [{ id: 't1', name: 'Train', locoIds: ['l1'], lightingAmps: 0.05, lengthMm: 1000 }],
    operators: [{ id: 'o1', name: 'Ann' }],
    runs: [0, 1, 2, 3].map((i) => ({
      id: `r${i}`,
      trainId: 't1',
      cabId: 'c1',
      operatorId: 'o1',
      departS: i * 100,
      arriveS: i * 100 + 20,
      steps: [
        { blockId: 'A', enterS: i * 100, exitS: i * 100 + 6 },
        { blockId: 'B', enterS: i * 100, exitS: i * 100 + 30 },
      ],
    })),
  };
}

/** The formatted issues for a plan edited by `edit`. */
function refusal(edit: (plan: PlanV1) => void): string[] {
  const plan = goodPlan();
  edit(plan);
  const result = planSchema.safeParse(plan);
  expect(result.success).toBe(false);
  return result.success ? [] : formatPlanIssues(result.error);
}

describe('planSchema', () => {
  it('accepts a good plan', () => {
    expect(planSchema.safeParse(goodPlan()).success).toBe(true);
  });

  it('writes issue paths the way a reader finds the field', () => {
    expect(formatIssuePath(['runs', 3, 'steps', 0, 'blockId'])).toBe('runs[3].steps[0].blockId');
    expect(formatIssuePath([])).toBe('');
  });

  const cases: [string, (plan: PlanV1) => void, string][] = [
    ['an unknown cab', (p) => void (p.runs[3]!.cabId = 'c9'), 'runs[3].cabId: unknown cab "c9"'],
    ['an unknown train', (p) => void (p.runs[1]!.trainId = 'tX'), 'runs[1].trainId: unknown train "tX"'],
    ['an unknown operator', (p) => void (p.runs[0]!.operatorId = 'nobody'), 'runs[0].operatorId: unknown operator "nobody"'],
    ['an unknown block in a step', (p) => void (p.runs[2]!.steps[1]!.blockId = 'Z'), 'runs[2].steps[1].blockId: unknown block "Z"'],
    ['an unknown supply', (p) => void (p.drivers[0]!.supplyId = 'mains'), 'drivers[0].supplyId: unknown supply "mains"'],
    ['an unknown driver', (p) => void (p.cabs[1]!.driverId = 'd7'), 'cabs[1].driverId: unknown driver "d7"'],
    ['a link to an unknown block', (p) => void (p.links[0]!.b = 'Q'), 'links[0].b: unknown block "Q"'],
    ['an unknown loco', (p) => void (p.trains[0]!.locoIds = ['l1', 'l5']), 'trains[0].locoIds[1]: unknown loco "l5"'],
    ['a loco twice in one train', (p) => void (p.trains[0]!.locoIds = ['l1', 'l1']), 'trains[0].locoIds[1]: loco "l1" is already in this train'],
    ['a duplicate run id', (p) => void (p.runs[2]!.id = 'r0'), 'runs[2].id: duplicate run id "r0" (also runs[0])'],
    ['a duplicate block id', (p) => void (p.blocks[1]!.id = 'A'), 'blocks[1].id: duplicate block id "A" (also blocks[0])'],
    ['a channel beyond the driver', (p) => void (p.cabs[1]!.channel = 3), 'cabs[1].channel: channel 3 is outside 1..2 of driver "d1"'],
    ['two cabs on one channel', (p) => void (p.cabs[1]!.channel = 1), 'cabs[1].channel: channel 1 of driver "d1" is already cab "c1"'],
    ['arrival before departure', (p) => void (p.runs[1]!.arriveS = 100), 'runs[1].arriveS: arriveS 100 must be after departS 100'],
    ['a step that ends as it begins', (p) => void (p.runs[0]!.steps[0]!.exitS = 0), 'runs[0].steps[0].exitS: exitS 0 must be after enterS 0'],
    [
      'steps out of order',
      (p) => void (p.runs[0]!.steps = [{ blockId: 'A', enterS: 3, exitS: 30 }, { blockId: 'B', enterS: 0, exitS: 6 }]),
      'runs[0].steps[1].enterS: steps must be sorted by enterS: 0 comes after 3',
    ],
    [
      'a first step after departure',
      (p) => void (p.runs[0]!.steps[0]!.enterS = 1),
      'runs[0].steps[0].enterS: the first step must begin no later than departS 0, not at 1',
    ],
    [
      'a last step ending before arrival',
      (p) => void (p.runs[0]!.steps[1]!.exitS = 19),
      'runs[0].steps[1].exitS: the last step must end no earlier than arriveS 20, not at 19',
    ],
    ['a run with no steps', (p) => void (p.runs[0]!.steps = []), 'runs[0].steps: a run needs at least one step'],
    ['a train with no locos', (p) => void (p.trains[0]!.locoIds = []), 'trains[0].locoIds: a train needs at least one loco'],
    ['an empty id', (p) => void (p.operators[0]!.id = ''), 'operators[0].id: must not be empty'],
    ['a zero-length block', (p) => void (p.blocks[0]!.lengthMm = 0), 'blocks[0].lengthMm: must be greater than 0'],
    ['negative running current', (p) => void (p.locos[0]!.runningAmps = -0.1), 'locos[0].runningAmps: must be 0 or more'],
    ['a fractional channel count', (p) => void (p.drivers[0]!.channels = 1.5), 'drivers[0].channels: must be a whole number'],
    ['a zero total rating', (p) => void (p.drivers[0]!.totalAmps = 0), 'drivers[0].totalAmps: must be greater than 0'],
    ['derate above 1', (p) => void (p.rules.derate = 1.2), 'rules.derate: must be 1 or less'],
    ['derate of 0', (p) => void (p.rules.derate = 0), 'rules.derate: must be greater than 0'],
    ['a slow fast clock', (p) => void (p.clock.ratio = 0.5), 'clock.ratio: must be 1 or more'],
    ['a bad fast start', (p) => void (p.clock.fastStart = '24:00'), 'clock.fastStart: must be a time of day written HH:MM'],
    ['a negative headway', (p) => void (p.rules.headwayS = -1), 'rules.headwayS: must be 0 or more'],
    ['a zero scale ratio', (p) => void (p.scale.ratio = 0), 'scale.ratio: must be 1 or more'],
    ['a zero-volt supply', (p) => void (p.supplies[0]!.volts = 0), 'supplies[0].volts: must be greater than 0'],
  ];

  for (const [what, edit, expected] of cases) {
    it(`refuses ${what}, naming the field`, () => {
      expect(refusal(edit)).toContain(expected);
    });
  }

  it('refuses another version and infinite times', () => {
    expect(refusal((p) => void ((p as { version: number }).version = 3))[0]).toMatch(/^version: /);
    expect(refusal((p) => void (p.runs[0]!.departS = Infinity))[0]).toMatch(/^runs\[0\]\.departS: /);
  });
});

describe('plan interchange version 2', () => {
  const asV2 = (plan: PlanV1) => {
    const { locos, trains, ...rest } = plan;
    return {
      ...rest,
      version: 2,
      locomotives: locos,
      trains: trains.map(({ locoIds, ...train }) => ({ ...train, locomotiveIds: locoIds, accelKmhPerS: 12, brakingKmhPerS: 18 })),
    };
  };

  it('reads version 1 upgraded with version 2 names: a train without ramps gets the common-practice figures for its scale (H0: 15 up, 20 down)', () => {
    const parsed = planSchema.parse(goodPlan());
    expect(parsed.version).toBe(1);
    expect(parsed.trains[0]).toMatchObject({ locomotiveIds: ['l1'], accelKmhPerS: 15, brakingKmhPerS: 20 });
    const n = { ...goodPlan(), scale: { name: 'N', ratio: 160 } };
    expect(planSchema.parse(n).trains[0]).toMatchObject({ accelKmhPerS: 20, brakingKmhPerS: 25 });
  });

  it('reads version 2 with one name per concept, and toPlanJson writes it back unchanged', () => {
    const json = asV2(goodPlan());
    const parsed = planSchema.parse(json);
    expect(parsed.locomotives).toEqual(json.locomotives);
    expect(parsed.trains[0]).toMatchObject({ locomotiveIds: ['l1'], accelKmhPerS: 12, brakingKmhPerS: 18 });
    expect(toPlanJson(parsed)).toEqual(json);
  });

  it('writes every plan as version 2: a version-1 plan comes out with its upgraded ramps and reads back the same', () => {
    const written = toPlanJson(planSchema.parse(goodPlan()));
    expect(written.version).toBe(2);
    expect(written).not.toHaveProperty('locos');
    expect(written.trains[0]).toMatchObject({ locomotiveIds: ['l1'], accelKmhPerS: 15, brakingKmhPerS: 20 });
    expect(toPlanJson(planSchema.parse(written))).toEqual(written);
  });

  it('refuses a version-2 plan with version 1 names or without ramps, naming its own fields', () => {
    const issues = (plan: unknown) => {
      const result = planSchema.safeParse(plan);
      return result.success ? [] : formatPlanIssues(result.error);
    };
    const json = asV2(goodPlan());
    const { locomotives, ...withoutLocomotives } = json;
    expect(issues({ ...withoutLocomotives, locos: locomotives })[0]).toMatch(/^locomotives: /);
    const { accelKmhPerS: _accel, ...noAccel } = json.trains[0]!;
    expect(issues({ ...json, trains: [noAccel] })).toEqual([expect.stringMatching(/^trains\[0\]\.accelKmhPerS: /)]);
    expect(issues({ ...json, trains: [{ ...json.trains[0]!, locomotiveIds: ['l9'] }] })).toEqual(['trains[0].locomotiveIds[0]: unknown locomotive "l9"']);
    // Version 1 keeps its own names.
    expect(issues({ ...goodPlan(), trains: [{ ...goodPlan().trains[0]!, locoIds: ['l9'] }] })).toEqual(['trains[0].locoIds[0]: unknown loco "l9"']);
  });
});

describe('cross-references and electrical sense, one bad field at a time', () => {
  const issues = (edit: (plan: PlanV1) => void) => {
    const plan = goodPlan();
    edit(plan);
    const result = planSchema.safeParse(plan);
    return result.success ? [] : formatPlanIssues(result.error);
  };

  it('takes the good plan', () => {
    expect(issues(() => {})).toEqual([]);
  });

  it('names a link end that is no block', () => {
    expect(issues((p) => (p.links[0]!.a = 'Z'))).toEqual(['links[0].a: unknown block "Z"']);
  });

  it('names a duplicate id with its list and the first holder', () => {
    expect(issues((p) => p.supplies.push({ ...p.supplies[0]! }))).toEqual(['supplies[1].id: duplicate supply id "s1" (also supplies[0])']);
    expect(issues((p) => p.cabs.push({ ...p.cabs[0]!, channel: 1 }))).toContain('cabs[2].id: duplicate cab id "c1" (also cabs[0])');
    expect(issues((p) => p.operators.push({ ...p.operators[0]! }))).toEqual(['operators[1].id: duplicate operator id "o1" (also operators[0])']);
    expect(issues((p) => p.trains.push({ ...p.trains[0]! }))).toEqual(['trains[1].id: duplicate train id "t1" (also trains[0])']);
  });

  it('wants a bridge drop, and a least drop line at or below the greatest (the datasheets give typical ≤ maximum)', () => {
    expect(issues((p) => delete (p.drivers[0] as { dropVolts?: number }).dropVolts)).toEqual(['drivers[0].drop: give the bridge drop (drop or dropVolts)']);
    const line = (fixedVolts: number, ohms: number) => ({ fixedVolts, ohms });
    const withDrop = (min: { fixedVolts: number; ohms: number }, max: { fixedVolts: number; ohms: number }) => (p: PlanV1) => {
      Object.assign(p.drivers[0]!, { drop: { min, max } });
    };
    // Invented lines (fixed volts + ohms × amps): least 1.4 V + 1.2 Ω, greatest 1.8 V + 1.3 Ω; equal lines are fine.
    expect(issues(withDrop(line(1.4, 1.2), line(1.8, 1.3)))).toEqual([]);
    expect(issues(withDrop(line(1.8, 1.2), line(1.8, 1.2)))).toEqual([]);
    expect(issues(withDrop(line(1.9, 1.2), line(1.8, 1.3)))).toEqual(['drivers[0].drop: the minimum drop line must lie at or below the maximum one']);
    expect(issues(withDrop(line(1.4, 1.4), line(1.8, 1.3)))).toEqual(['drivers[0].drop: the minimum drop line must lie at or below the maximum one']);
  });

  it('wants a start voltage below the rated voltage (a loco that moves only at full voltage has no speed range)', () => {
    expect(issues((p) => Object.assign(p.locos[0]!, { startVolts: 11.9 }))).toEqual([]);
    expect(issues((p) => Object.assign(p.locos[0]!, { startVolts: null }))).toEqual([]);
    expect(issues((p) => Object.assign(p.locos[0]!, { startVolts: 12 }))).toEqual(['locos[0].startVolts: start voltage 12 V must be below the rated 12 V']);
  });
});
