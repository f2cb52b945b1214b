import bcrypt from 'bcryptjs';
import { eq } from 'drizzle-orm';
import type { Db } from '@/db';
import * as t from '@/db/schema';
import { demoWiringSheet } from './demo-wiring';
import { presetDriverValues } from '@/lib/layouts/driver-electrics';
import { DRIVER_PRESETS, routeThrough, timeRun, type DriverPreset, type Ramps } from '@/lib/planning';
import type { RunFields } from '@/lib/runs/schema';
import { trainRamps } from '@/lib/sessions/to-plan';

// The demo railway is a scenario of our own invention: the club, its places and its people are
// made up. Currents are the common-practice figures of the reference notes (an HO can motor runs
// at 0.1–0.5 A and stalls near 0.9 A; coach lamps about 30 mA, LEDs about 20 mA).

export const DEMO_PASSWORD = 'demo-railway';
export const DEMO_USERS = [
  { key: 'host', email: 'host@fishplate.example', name: 'Hazel Brightwater', role: 'host' },
  { key: 'planner', email: 'planner@fishplate.example', name: 'Milo Ferrand', role: 'planner' },
  { key: 'operator', email: 'operator@fishplate.example', name: 'Juno Carraway', role: 'operator' },
  { key: 'op2', email: 'priya@fishplate.example', name: 'Priya Lindholt', role: 'operator' },
  { key: 'op3', email: 'bram@fishplate.example', name: 'Bram Odell', role: 'operator' },
  { key: 'op4', email: 'sasha@fishplate.example', name: 'Sasha Verrin', role: 'operator' },
  { key: 'op5', email: 'tomas@fishplate.example', name: 'Tomas Quill', role: 'operator' },
  { key: 'op6', email: 'wren@fishplate.example', name: 'Wren Halloway', role: 'operator' },
] as const;
type UserKey = (typeof DEMO_USERS)[number]['key'];

const preset = (id: string): DriverPreset => {
  const found = DRIVER_PRESETS.find((p) => p.id === id);
  if (!found) throw new Error(`demo: no driver preset ${id}`);
  return found;
};

const INDOOR_BLOCKS = [
  // key, name, length mm, position along the line mm
  ['Y1', 'Larkholm yard road 1', 1400, 0],
  ['Y2', 'Larkholm yard road 2', 1400, 0],
  // Deliberate polarity clash: the new road's feeders went in the other way round (see BLOCK_WIRING).
  ['Y3', 'Larkholm yard road 3', 1400, 0],
  ['YL', 'Larkholm yard lead', 800, 1200],
  ['M1', 'Wrenhollow east', 2000, 2000],
  ['M2', 'Mossgate approach', 1500, 4000],
  ['L1', 'Mossgate loop, main road', 2000, 5500],
  ['L2', 'Mossgate loop, passing road', 2000, 5500],
  ['M3', 'Mossgate west', 1500, 7500],
  ['M4', 'Fernwick bank', 2000, 9000],
  ['M5', 'Fernwick approach', 1500, 11000],
  ['T1', 'Fernwick platform 1', 1400, 12500],
  ['T2', 'Fernwick platform 2', 1400, 12500],
] as const;
const INDOOR_LINKS = [
  ['Y1', 'YL'], ['Y2', 'YL'], ['Y3', 'YL'], ['YL', 'M1'], ['M1', 'M2'], ['M2', 'L1'], ['M2', 'L2'],
  ['L1', 'M3'], ['L2', 'M3'], ['M3', 'M4'], ['M4', 'M5'], ['M5', 'T1'], ['M5', 'T2'],
] as const;

const GARDEN_BLOCKS = [
  ['G1', 'Quillon halt', 3000, 0],
  ['G2', 'Bramble cutting', 6000, 3000],
  ['G3', 'Pond viaduct', 5000, 9000],
  ['G4', 'Orchard loop', 4000, 14000],
  ['G5', 'Shed siding', 2500, 18000],
  // A balloon loop beyond the orchard: both its ends meet the orchard loop's far end, so it turns
  // trains round and is wired as a reversing section with its own polarity relay, longer than the
  // longest garden train (2.6 m).
  ['G6', 'Orchard balloon', 7000, 18000],
] as const;
// Rail joints, end to end: [block, its end, block, its end]. Unlisted ends run b → a along the line.
const GARDEN_LINKS = [
  ['G1', 'G2'], ['G2', 'G3'], ['G3', 'G4'], ['G4', 'G5'],
  ['G4', 'G6', 'b', 'a'], ['G4', 'G6', 'b', 'b'],
] as const;

/** Blocks wired or used unlike the rest: which rail the positive feeder goes to, and polarity switches. */
const BLOCK_WIRING: Record<string, { positiveRail?: 'left'; reversingSection?: true }> = {
  Y3: { positiveRail: 'left' },
  G6: { reversingSection: true },
};

const INDOOR_LOCOMOTIVES = [
  // key, name, running A, stall A, rated V, top scale km/h at rated V, start V (common practice: 1.5–3 V on small can motors)
  ['tank41', 'Tank engine No. 41', 0.35, 0.9, 12, 80, 2.0],
  ['diesel7', 'Mixed-traffic diesel No. 7', 0.45, 1.0, 12, 120, 1.8],
  ['railcar12', 'Railcar No. 12', 0.3, 0.8, 12, 100, 1.5],
  ['shunter3', 'Yard shunter No. 3', 0.25, 0.7, 12, 50, 2.2],
  ['express88', 'Express engine No. 88', 0.5, 1.2, 12, 140, 2.0],
  // Not measured: starts are judged at its full 1.6 A stall current.
  ['freight205', 'Open-frame freight diesel No. 205', 0.6, 1.6, 12, 90, null],
  // The stone train's second engine, the same class and just as unmeasured: a locomotive runs in one train.
  ['freight318', 'Open-frame freight diesel No. 318', 0.6, 1.6, 12, 90, null],
] as const;
const GARDEN_LOCOMOTIVES = [
  ['mogul', 'Garden 2-6-0 "Thistle"', 1.5, 3.0, 18, 50, 3.0],
  ['railbus', 'Garden railbus', 0.8, 2.0, 18, 45, 2.5],
] as const;

const INDOOR_TRAINS = [
  // key, name, locomotives, lighting A, length mm
  ['stopper', 'Wrenhollow stopper', ['tank41'], 0.09, 900],
  ['express', 'Fernwick express', ['express88'], 0.15, 1300],
  ['goods', 'Pick-up goods', ['freight205'], 0, 1100],
  ['shuttle', 'Railcar shuttle', ['railcar12'], 0.04, 350],
  ['heavy', 'Double-headed stone train', ['diesel7', 'freight318'], 0, 1350],
] as const;
const GARDEN_TRAINS = [['garden', 'Orchard passenger', ['mogul'], 0.06, 2600]] as const;

type RunSpec = {
  train: (typeof INDOOR_TRAINS)[number][0];
  cab: 'cab1' | 'cab2' | 'cab3' | 'cab4';
  operator: UserKey | null;
  from: string;
  to: string;
  via?: string;
  /** Real minutes from the session's start. */
  departMin: number;
  speedKmh: number;
  standBeforeS: number;
  standAfterS: number;
};

// Twenty runs over a three-hour evening. The trains start where their first run leaves: the stopper in
// the loop's passing road, the express in yard road 2, the goods in Fernwick platform 1, the railcar in
// the loop's main road, the stone train in yard road 3. The whole session's occupancy holds: no train
// stands in a block another run passes through (trains stand in the terminal roads and the loop's roads;
// a run passes the loop by whichever road is free), and the line is timed with each train's ramps. Three clashes are there
// on purpose, so that a newcomer sees the checker's point at once: the railcar shuttle is put on cab 3
// while the goods is still moving on it, the goods sets off from the loop while the express is still
// coming down Fernwick bank, and the double-headed stone train draws more than its 1 A-class channel
// can carry (it also leaves from yard road 3, whose feeders are the wrong way round: a short at its
// rail gap).
const RUNS: RunSpec[] = [
  { train: 'stopper', cab: 'cab1', operator: 'operator', from: 'L2', to: 'Y1', departMin: 5, speedKmh: 50, standBeforeS: 120, standAfterS: 180 },
  { train: 'express', cab: 'cab2', operator: 'op2', from: 'Y2', to: 'T2', via: 'L2', departMin: 8, speedKmh: 90, standBeforeS: 180, standAfterS: 300 },
  { train: 'goods', cab: 'cab3', operator: 'op3', from: 'T1', to: 'L2', departMin: 14, speedKmh: 40, standBeforeS: 120, standAfterS: 240 },
  // Clash: the railcar shuttle is put on cab 3 while the goods is still moving on it.
  { train: 'shuttle', cab: 'cab3', operator: 'op4', from: 'L1', to: 'Y2', departMin: 14.3, speedKmh: 60, standBeforeS: 60, standAfterS: 120 },
  { train: 'shuttle', cab: 'cab3', operator: 'op4', from: 'Y2', to: 'T1', via: 'L1', departMin: 24, speedKmh: 60, standBeforeS: 60, standAfterS: 120 },
  // Clash: the goods sets off from the loop while the express is still coming down Fernwick bank.
  { train: 'express', cab: 'cab2', operator: 'op2', from: 'T2', to: 'Y2', via: 'L1', departMin: 32, speedKmh: 90, standBeforeS: 120, standAfterS: 300 },
  { train: 'goods', cab: 'cab3', operator: 'op3', from: 'L2', to: 'T2', departMin: 32.1, speedKmh: 40, standBeforeS: 60, standAfterS: 300 },
  { train: 'shuttle', cab: 'cab4', operator: 'op5', from: 'T1', to: 'L1', departMin: 40, speedKmh: 60, standBeforeS: 60, standAfterS: 120 },
  { train: 'stopper', cab: 'cab1', operator: 'operator', from: 'Y1', to: 'T1', via: 'L2', departMin: 45, speedKmh: 50, standBeforeS: 60, standAfterS: 240 },
  { train: 'goods', cab: 'cab3', operator: 'op3', from: 'T2', to: 'Y1', via: 'L2', departMin: 52, speedKmh: 40, standBeforeS: 60, standAfterS: 300 },
  { train: 'express', cab: 'cab2', operator: 'op2', from: 'Y2', to: 'T2', via: 'L2', departMin: 58.5, speedKmh: 90, standBeforeS: 120, standAfterS: 300 },
  { train: 'stopper', cab: 'cab1', operator: 'operator', from: 'T1', to: 'Y2', via: 'L2', departMin: 66, speedKmh: 50, standBeforeS: 60, standAfterS: 240 },
  { train: 'shuttle', cab: 'cab4', operator: 'op4', from: 'L1', to: 'T1', departMin: 72, speedKmh: 60, standBeforeS: 60, standAfterS: 120 },
  // Clash: two motors on one 1 A-class channel (0.45 A + 0.6 A running, more at start-up). It
  // also leaves from yard road 3, whose feeders are the wrong way round: a short at its rail gap.
  { train: 'heavy', cab: 'cab1', operator: 'op6', from: 'Y3', to: 'L1', departMin: 100, speedKmh: 35, standBeforeS: 120, standAfterS: 300 },
  { train: 'stopper', cab: 'cab1', operator: 'operator', from: 'Y2', to: 'L2', departMin: 108, speedKmh: 50, standBeforeS: 60, standAfterS: 240 },
  { train: 'heavy', cab: 'cab1', operator: 'op6', from: 'L1', to: 'Y2', departMin: 118, speedKmh: 35, standBeforeS: 60, standAfterS: 300 },
  { train: 'shuttle', cab: 'cab4', operator: 'op5', from: 'T1', to: 'L1', departMin: 126, speedKmh: 60, standBeforeS: 60, standAfterS: 120 },
  { train: 'stopper', cab: 'cab3', operator: 'operator', from: 'L2', to: 'T1', departMin: 134, speedKmh: 50, standBeforeS: 60, standAfterS: 240 },
  { train: 'goods', cab: 'cab3', operator: 'op3', from: 'Y1', to: 'L2', departMin: 142, speedKmh: 40, standBeforeS: 60, standAfterS: 300 },
  { train: 'shuttle', cab: 'cab3', operator: 'op5', from: 'L1', to: 'Y1', departMin: 150, speedKmh: 60, standBeforeS: 60, standAfterS: 120 },
];

/** The indoor branch is H0. */
const INDOOR_SCALE_RATIO = 87;

const INDOOR_TRACK = {
  blocks: INDOOR_BLOCKS.map(([key, , lengthMm]) => ({ id: key, lengthMm })),
  links: INDOOR_LINKS.map(([a, b]) => ({ a, b })),
};

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

/**
 * Times one demo run on the indoor branch (block keys) as the builder does (lib/runs/rules.ts): the
 * route a train can take through the waypoints without reversing, timed with the train's ramps, each
 * step recording its direction of travel; then writes it with its steps.
 */
function insertDemoRun(
  tx: Tx,
  spec: RunSpec,
  ids: { sessionId: string; trainId: string; trainLengthMm: number; ramps: Ramps; cabId: string; operatorId: string | null; blockId: (key: string) => string },
  offsetS = 0,
): void {
  const found = routeThrough(INDOOR_TRACK, spec.via ? [spec.from, spec.via, spec.to] : [spec.from, spec.to]);
  if (!found.ok || found.steps.length < 2) throw new Error(`demo: no route ${spec.from} → ${spec.to}`);
  const timed = timeRun({
    blocks: INDOOR_TRACK.blocks,
    scaleRatio: INDOOR_SCALE_RATIO,
    trainLengthMm: ids.trainLengthMm,
    route: found.steps.map((step) => step.blockId),
    departS: offsetS + spec.departMin * 60,
    speedKmh: spec.speedKmh,
    standBeforeS: spec.standBeforeS,
    standAfterS: spec.standAfterS,
    ...ids.ramps,
  });
  // The same record every other path writes (lib/runs/schema.ts), so a new run field shows here too.
  const run: RunFields = {
    trainId: ids.trainId,
    cabId: ids.cabId,
    operatorId: ids.operatorId,
    departS: timed.departS,
    arriveS: timed.arriveS,
    speedKmh: spec.speedKmh,
    note: '',
    steps: timed.steps.map((step, i) => ({ ...step, blockId: ids.blockId(step.blockId), fromEnd: found.steps[i]!.fromEnd, toEnd: found.steps[i]!.toEnd })),
  };
  const { steps, ...row } = run;
  const runId = tx
    .insert(t.runs)
    .values({ ...row, sessionId: ids.sessionId })
    .returning({ id: t.runs.id })
    .get().id;
  steps.forEach((step, position) => tx.insert(t.runSteps).values({ runId, position, ...step }).run());
}

/** Next Saturday (at least two days ahead) at 18:30 UTC — always in the future when seeded. */
export function demoSessionStart(now = new Date()): Date {
  const d = new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate(), 18, 30));
  const daysToSaturday = (6 - d.getUTCDay() + 7) % 7 || 7;
  d.setUTCDate(d.getUTCDate() + (daysToSaturday < 2 ? daysToSaturday + 7 : daysToSaturday));
  return d;
}

export function hasDemoData(db: Db): boolean {
  return db.select({ id: t.users.id }).from(t.users).where(eq(t.users.email, DEMO_USERS[0].email)).get() !== undefined;
}

/**
 * Writes the demo railway in one transaction: the club, its members, an indoor H0 layout and an
 * outdoor garden line, power and rolling stock, and one published session with about twenty runs.
 */
export function seedDemoRailway(db: Db, options: { now?: Date; passwordHash?: string } = {}): { railwayId: string; sessionId: string } {
  const passwordHash = options.passwordHash ?? bcrypt.hashSync(DEMO_PASSWORD, 10);
  return db.transaction((tx) => {
    const userIds = {} as Record<UserKey, string>;
    for (const u of DEMO_USERS) {
      userIds[u.key] = tx
        .insert(t.users)
        .values({ email: u.email, name: u.name, passwordHash, emailVerifiedAt: new Date() })
        .returning({ id: t.users.id })
        .get().id;
    }
    const railwayId = tx
      .insert(t.railways)
      .values({ name: 'Kestrel Vale Railway Circle', timeZone: 'Europe/London' })
      .returning({ id: t.railways.id })
      .get().id;
    for (const u of DEMO_USERS) tx.insert(t.memberships).values({ railwayId, userId: userIds[u.key], role: u.role }).run();

    const insertLayout = (
      values: Omit<typeof t.layouts.$inferInsert, 'railwayId'>,
      blockRows: readonly (readonly [string, string, number, number])[],
      linkRows: readonly (readonly [string, string, ('a' | 'b')?, ('a' | 'b')?])[],
    ) => {
      const layoutId = tx.insert(t.layouts).values({ ...values, railwayId }).returning({ id: t.layouts.id }).get().id;
      const blockIds: Record<string, string> = {};
      for (const [key, name, lengthMm, positionMm] of blockRows) {
        blockIds[key] = tx
          .insert(t.blocks)
          .values({ layoutId, name, lengthMm, positionMm, ...BLOCK_WIRING[key] })
          .returning({ id: t.blocks.id })
          .get().id;
      }
      for (const [a, b, aEnd = 'b', bEnd = 'a'] of linkRows) {
        tx.insert(t.links).values({ layoutId, blockAId: blockIds[a]!, blockBId: blockIds[b]!, blockAEnd: aEnd, blockBEnd: bEnd }).run();
      }
      return { layoutId, blockIds };
    };

    const indoor = insertLayout(
      {
        name: 'Kestrel Vale branch (H0)',
        scaleName: 'H0',
        scaleRatio: INDOOR_SCALE_RATIO,
        setting: 'indoor',
        notes: 'Single-track branch from Larkholm yard through the Mossgate passing loop to the Fernwick terminus. Thirteen blocks, four cabs.',
      },
      INDOOR_BLOCKS,
      INDOOR_LINKS,
    );
    const garden = insertLayout(
      {
        name: 'Quillon garden line (IIm)',
        scaleName: 'IIm',
        scaleRatio: 22.5,
        setting: 'outdoor',
        notes: 'Outdoor large-scale line on 45 mm track. Low voltage only on the track; weatherproof joints; the supply sits indoors behind a residual-current device.',
      },
      GARDEN_BLOCKS,
      GARDEN_LINKS,
    );

    const supply = (layoutId: string, name: string, volts: number, amps: number) =>
      tx.insert(t.supplies).values({ layoutId, name, volts, amps }).returning({ id: t.supplies.id }).get().id;
    const driver = (layoutId: string, supplyId: string, name: string, p: DriverPreset) =>
      tx
        .insert(t.drivers)
        .values({
          layoutId,
          supplyId,
          name,
          presetId: p.id,
          ...presetDriverValues(p),
        })
        .returning({ id: t.drivers.id })
        .get().id;
    const cab = (layoutId: string, driverId: string, name: string, channel: number) =>
      tx.insert(t.cabs).values({ layoutId, driverId, name, channel }).returning({ id: t.cabs.id }).get().id;

    const benchA = supply(indoor.layoutId, 'Bench supply A (14.6 V)', 14.6, 3);
    const benchB = supply(indoor.layoutId, 'Bench supply B (12.6 V)', 12.6, 2);
    const gardenSupply = supply(garden.layoutId, 'Shed supply (18 V)', 18, 5);
    const mainDriver = driver(indoor.layoutId, benchA, 'Main line board', preset('bipolar-quad-half-h-1a'));
    const terminusDriver = driver(indoor.layoutId, benchB, 'Terminus board', preset('mosfet-dual-low-voltage-1-2a'));
    const gardenDriver = driver(garden.layoutId, gardenSupply, 'Garden board', preset('bipolar-dual-full-bridge-2a'));
    const cabIds = {
      cab1: cab(indoor.layoutId, mainDriver, 'Cab 1', 1),
      cab2: cab(indoor.layoutId, mainDriver, 'Cab 2', 2),
      cab3: cab(indoor.layoutId, terminusDriver, 'Cab 3', 1),
      cab4: cab(indoor.layoutId, terminusDriver, 'Cab 4', 2),
    };
    tx.insert(t.wiringSheets)
      .values({
        layoutId: indoor.layoutId,
        sheet: JSON.stringify(demoWiringSheet((key) => indoor.blockIds[key]!, (key) => cabIds[key])),
      })
      .run();
    cab(garden.layoutId, gardenDriver, 'Garden cab A', 1);
    cab(garden.layoutId, gardenDriver, 'Garden cab B', 2);

    const insertStock = (
      layoutId: string,
      locomotiveRows: readonly (readonly [string, string, number, number, number, number, number | null])[],
      trainRows: readonly (readonly [string, string, readonly string[], number, number])[],
    ) => {
      const locomotiveIds: Record<string, string> = {};
      for (const [key, name, runningAmps, stallAmps, ratedVolts, topSpeedKmh, startVolts] of locomotiveRows) {
        locomotiveIds[key] = tx
          .insert(t.locomotives)
          .values({ layoutId, name, runningAmps, stallAmps, ratedVolts, topSpeedKmh, startVolts })
          .returning({ id: t.locomotives.id })
          .get().id;
      }
      const trainIds: Record<string, { id: string; lengthMm: number }> = {};
      for (const [key, name, locomotives, lightingAmps, lengthMm] of trainRows) {
        const id = tx.insert(t.trains).values({ layoutId, name, lightingAmps, lengthMm }).returning({ id: t.trains.id }).get().id;
        locomotives.forEach((locomotive, position) => tx.insert(t.trainLocomotives).values({ trainId: id, locomotiveId: locomotiveIds[locomotive]!, position }).run());
        trainIds[key] = { id, lengthMm };
      }
      return trainIds;
    };
    const indoorTrains = insertStock(indoor.layoutId, INDOOR_LOCOMOTIVES, INDOOR_TRAINS);
    insertStock(garden.layoutId, GARDEN_LOCOMOTIVES, GARDEN_TRAINS);

    const startsAt = demoSessionStart(options.now);
    const sessionId = tx
      .insert(t.sessions)
      .values({
        railwayId,
        layoutId: indoor.layoutId,
        title: 'December running evening',
        place: 'Kestrel Vale clubroom, layout room 2',
        description: 'Evening timetable on the branch: stopper, express, goods and the railcar shuttle. Tea at half time.',
        startsAt,
        endsAt: new Date(startsAt.getTime() + 3 * 3600_000),
        timeZone: 'Europe/London',
        clockRatio: 4,
        fastStart: '06:00',
        headwayS: 30,
        surgeS: 2,
        derate: 0.8,
        status: 'published',
        sequence: 0,
      })
      .returning({ id: t.sessions.id })
      .get().id;

    for (const spec of RUNS) {
      const train = indoorTrains[spec.train]!;
      insertDemoRun(tx, spec, {
        sessionId,
        trainId: train.id,
        trainLengthMm: train.lengthMm,
        // The demo's trains store no ramps of their own: H0's common practice, as the builder would use.
        ramps: trainRamps({ accelKmhPerS: null, brakingKmhPerS: null }, INDOOR_SCALE_RATIO),
        cabId: cabIds[spec.cab],
        operatorId: spec.operator ? userIds[spec.operator] : null,
        blockId: (key) => indoor.blockIds[key]!,
      });
    }

    const crew: UserKey[] = ['operator', 'op2', 'op3', 'op4', 'op5', 'op6'];
    for (const key of crew) {
      tx.insert(t.crewAssignments).values({ sessionId, userId: userIds[key], duty: 'driver' }).run();
      tx.insert(t.invitations)
        .values({
          sessionId,
          userId: userIds[key],
          email: DEMO_USERS.find((u) => u.key === key)!.email,
          // Invited but not e-mailed yet (the host's first step in the demo is to send them), so no
          // one has replied: a reply without an invitation sent would contradict the tracker.
          reply: 'needs-action',
        })
        .run();
    }
    tx.insert(t.crewAssignments).values({ sessionId, userId: userIds.op5, duty: 'stand-by', note: 'Covers any cab if a driver is late.' }).run();
    tx.insert(t.auditLog).values({ railwayId, userId: userIds.host, action: 'seed', entity: 'railway', entityId: railwayId }).run();
    return { railwayId, sessionId };
  }, { behavior: 'immediate' });
}

/**
 * Adds a large draft session to the seeded demo railway: the evening's twenty runs repeated
 * `repeats` times, three hours apart (200 runs for 10). Used by the speed benchmarks.
 */
export function seedLargeSession(db: Db, repeats = 10): { sessionId: string; runCount: number } {
  const railway = db.select().from(t.railways).where(eq(t.railways.name, 'Kestrel Vale Railway Circle')).get();
  if (!railway) throw new Error('seedLargeSession: seed the demo railway first');
  const layout = db.select().from(t.layouts).where(eq(t.layouts.railwayId, railway.id)).all().find((l) => l.setting === 'indoor')!;
  const byName = <R extends { name: string; id: string }>(rows: R[]) => new Map(rows.map((r) => [r.name, r]));
  const blocks = byName(db.select().from(t.blocks).where(eq(t.blocks.layoutId, layout.id)).all());
  const trains = byName(db.select().from(t.trains).where(eq(t.trains.layoutId, layout.id)).all());
  const cabs = byName(db.select().from(t.cabs).where(eq(t.cabs.layoutId, layout.id)).all());
  const users = new Map(db.select().from(t.users).all().map((u) => [u.email, u.id]));
  const blockId = (key: string) => blocks.get(INDOOR_BLOCKS.find(([k]) => k === key)![1])!.id;
  const trainOf = (key: string) => trains.get(INDOOR_TRAINS.find(([k]) => k === key)![1])!;
  const cabId = (key: RunSpec['cab']) => cabs.get(`Cab ${key.slice(3)}`)!.id;
  const userId = (key: UserKey) => users.get(DEMO_USERS.find((u) => u.key === key)!.email)!;
  const startsAt = demoSessionStart(new Date(Date.now() + 7 * 86_400_000));
  return db.transaction((tx) => {
    const sessionId = tx
      .insert(t.sessions)
      .values({
        railwayId: railway.id,
        layoutId: layout.id,
        title: `Marathon weekend (${repeats * RUNS.length} runs)`,
        startsAt,
        endsAt: new Date(startsAt.getTime() + repeats * 3 * 3600_000),
        timeZone: railway.timeZone,
        clockRatio: 4,
        fastStart: '06:00',
        headwayS: 30,
        surgeS: 2,
        derate: 0.8,
        status: 'draft',
      })
      .returning({ id: t.sessions.id })
      .get().id;
    for (let r = 0; r < repeats; r++) {
      for (const spec of RUNS) {
        const train = trainOf(spec.train);
        insertDemoRun(
          tx,
          spec,
          {
            sessionId,
            trainId: train.id,
            trainLengthMm: train.lengthMm,
            ramps: trainRamps(train, layout.scaleRatio),
            cabId: cabId(spec.cab),
            operatorId: spec.operator ? userId(spec.operator) : null,
            blockId,
          },
          r * 3 * 3600,
        );
      }
    }
    return { sessionId, runCount: repeats * RUNS.length };
  }, { behavior: 'immediate' });
}
