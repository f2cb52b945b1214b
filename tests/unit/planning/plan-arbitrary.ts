import fc from 'fast-check';
import type { Plan } from '@/lib/planning';

export interface PlanArbitraryOptions {
  /** Multiplies every time; 0.1 gives times that binary floating point cannot hold exactly. */
  timeScale?: number;
  maxRuns?: number;
}

const quarter = (n: number) => n / 4;

/**
 * Small valid plans with clashes likely: few blocks, cabs and operators, times on a short integer
 * grid (so touching and equal times happen), amps in quarter-amp steps (so loads land exactly on
 * limits), random links (so some routes have gaps).
 */
export function planArbitrary(options: PlanArbitraryOptions = {}): fc.Arbitrary<Plan> {
  const timeScale = options.timeScale ?? 1;
  const maxRuns = options.maxRuns ?? 7;
  return fc
    .record({
      scale: fc.constantFrom(
        { name: 'H0', ratio: 87 },
        { name: 'N', ratio: 160 },
        { name: 'Z', ratio: 220 },
        { name: 'IIm', ratio: 22.5 },
        { name: 'My own', ratio: 50 },
      ),
      headwayS: fc.integer({ min: 0, max: 8 }),
      surgeS: fc.integer({ min: 0, max: 6 }),
      derate: fc.constantFrom(0.5, 0.8, 1),
      supplies: fc.array(
        fc.record({ volts: fc.constantFrom(6, 9, 12, 12.6, 16, 19), amps: fc.integer({ min: 2, max: 16 }) }),
        { minLength: 1, maxLength: 2 },
      ),
      drivers: fc.array(
        fc.record({
          supply: fc.nat(),
          channels: fc.integer({ min: 1, max: 2 }),
          channelAmps: fc.integer({ min: 2, max: 8 }),
          channelPeakAmps: fc.integer({ min: 2, max: 12 }),
          totalAmps: fc.option(fc.integer({ min: 2, max: 12 }), { nil: null }),
          dropVolts: fc.constantFrom(0, 0.6, 2.6, 4.9),
          // Drop lines with binary-exact figures, so heat and voltage land exactly on limits.
          drop: fc.option(
            fc.record({
              fixed: fc.constantFrom(0, 0.5, 1.5),
              ohms: fc.constantFrom(0, 0.25, 0.5, 1),
              extraFixed: fc.constantFrom(0, 1),
              extraOhms: fc.constantFrom(0, 0.5),
            }),
            { nil: undefined },
          ),
          // Absent (older plans: the peak covers any surge), null (no pulse width), or seconds.
          peakPulseS: fc.constantFrom(undefined, null, 0.005, 3),
          packageWatts: fc.option(fc.integer({ min: 1, max: 16 }), { nil: undefined }),
        }),
        { minLength: 1, maxLength: 3 },
      ),
      blocks: fc.array(fc.integer({ min: 2, max: 12 }), { minLength: 2, maxLength: 6 }),
      links: fc.array(fc.tuple(fc.nat(), fc.nat()), { maxLength: 8 }),
      locomotives: fc.array(
        fc.record({
          runningAmps: fc.integer({ min: 0, max: 4 }),
          stallAmps: fc.integer({ min: 0, max: 8 }),
          ratedVolts: fc.constantFrom(8, 12, 16),
          startVolts: fc.constantFrom(undefined, null, 0, 2, 4),
          topSpeedKmh: fc.constantFrom(undefined, null, 60, 120),
        }),
        { minLength: 1, maxLength: 3 },
      ),
      trains: fc.array(
        fc.record({
          locomotives: fc.array(fc.nat(), { minLength: 1, maxLength: 2 }),
          lightingAmps: fc.integer({ min: 0, max: 2 }),
          lengthMm: fc.integer({ min: 2, max: 12 }),
          ramps: fc.constantFrom(undefined, { accelKmhPerS: 15, brakingKmhPerS: 20 }, { accelKmhPerS: 2, brakingKmhPerS: 40 }),
        }),
        { minLength: 1, maxLength: 3 },
      ),
      operators: fc.integer({ min: 0, max: 3 }),
      runs: fc.array(
        fc.record({
          train: fc.nat(),
          cab: fc.nat(),
          operator: fc.nat(),
          start: fc.integer({ min: 0, max: 60 }),
          steps: fc.array(
            fc.record({ block: fc.nat(), gap: fc.integer({ min: 0, max: 8 }), length: fc.integer({ min: 1, max: 15 }) }),
            { minLength: 1, maxLength: 4 },
          ),
          depart: fc.nat(),
          arrive: fc.nat(),
        }),
        { maxLength: maxRuns },
      ),
    })
    .map((raw): Plan => {
      const t = (value: number) => value * timeScale;
      const supplies = raw.supplies.map((s, i) => ({ id: `s${i}`, name: `Supply ${i}`, volts: s.volts, amps: quarter(s.amps) }));
      const drivers = raw.drivers.map((d, i) => ({
        id: `d${i}`,
        name: `Driver ${i}`,
        supplyId: supplies[d.supply % supplies.length]!.id,
        channels: d.channels,
        channelAmps: quarter(d.channelAmps),
        channelPeakAmps: quarter(d.channelPeakAmps),
        totalAmps: d.totalAmps === null ? null : quarter(d.totalAmps),
        ...(d.drop === undefined
          ? { dropVolts: d.dropVolts }
          : {
              drop: {
                min: { fixedVolts: d.drop.fixed, ohms: d.drop.ohms },
                max: { fixedVolts: d.drop.fixed + d.drop.extraFixed, ohms: d.drop.ohms + d.drop.extraOhms },
              },
            }),
        ...(d.peakPulseS === undefined ? {} : { peakPulseS: d.peakPulseS }),
        ...(d.packageWatts === undefined ? {} : { packageWatts: quarter(d.packageWatts) }),
      }));
      const cabs = drivers.flatMap((driver) =>
        Array.from({ length: driver.channels }, (_, k) => ({
          id: `c${driver.id.slice(1)}-${k + 1}`,
          name: `Cab`,
          driverId: driver.id,
          channel: k + 1,
        })),
      );
      const blocks = raw.blocks.map((length, i) => ({ id: `b${i}`, name: `Block ${i}`, lengthMm: length * 100 }));
      const links = raw.links.map(([a, b]) => ({ a: blocks[a % blocks.length]!.id, b: blocks[b % blocks.length]!.id }));
      const locomotives = raw.locomotives.map((l, i) => ({
        id: `l${i}`,
        name: `Loco ${i}`,
        runningAmps: quarter(l.runningAmps),
        stallAmps: quarter(l.stallAmps),
        ratedVolts: l.ratedVolts,
        ...(l.startVolts === undefined ? {} : { startVolts: l.startVolts }),
        ...(l.topSpeedKmh === undefined ? {} : { topSpeedKmh: l.topSpeedKmh }),
      }));
      const trains = raw.trains.map((tr, i) => ({
        id: `t${i}`,
        name: `Train ${i}`,
        locomotiveIds: [...new Set(tr.locomotives.map((n) => locomotives[n % locomotives.length]!.id))],
        lightingAmps: quarter(tr.lightingAmps),
        lengthMm: tr.lengthMm * 100,
        ...tr.ramps,
      }));
      const operators = Array.from({ length: raw.operators }, (_, i) => ({ id: `o${i}`, name: `Operator ${i}` }));
      const runs = raw.runs.map((r, i) => {
        let enter = r.start;
        const grid = r.steps.map((s, k) => {
          if (k > 0) enter += s.gap;
          return { block: s.block % blocks.length, enter, exit: enter + s.length };
        });
        const first = grid[0]!.enter;
        const lastExit = grid[grid.length - 1]!.exit;
        const departS = first + (r.depart % (lastExit - first));
        const arriveS = departS + 1 + (r.arrive % (lastExit - departS));
        return {
          // Ids out of numeric order, so string order and plan order differ.
          id: `r${(i * 7) % 11}-${i}`,
          trainId: trains[r.train % trains.length]!.id,
          cabId: cabs[r.cab % cabs.length]!.id,
          operatorId: operators.length === 0 || r.operator % (operators.length + 1) === 0 ? null : operators[(r.operator % (operators.length + 1)) - 1]!.id,
          departS: t(departS),
          arriveS: t(arriveS),
          steps: grid.map((g) => ({ blockId: blocks[g.block]!.id, enterS: t(g.enter), exitS: t(g.exit) })),
        };
      });
      return {
        version: 1,
        scale: raw.scale,
        clock: { ratio: 4, fastStart: '07:30' },
        rules: { headwayS: t(raw.headwayS), surgeS: t(raw.surgeS), derate: raw.derate },
        supplies,
        drivers,
        cabs,
        blocks,
        links,
        locomotives,
        trains,
        operators,
        runs,
      };
    });
}
