import type { Plan } from '@/lib/planning';

/** The plan of issue 10 finding 3, shared by the benchmark and the hostile-input tests. */
const BLOCKS = ['A', 'B', 'C'];

/**
 * One layout, and `count` identical runs on one cab and operator (the report's plan), each of its own
 * train, all trains hauled by the same locomotive: every pair clashes in every block, on the cab,
 * the operator and the locomotive.
 */
export function identicalRunsPlan(count: number): Plan {
  return {
    version: 1,
    scale: { name: 'H0', ratio: 87 },
    clock: { ratio: 6, fastStart: '06:00' },
    rules: { headwayS: 30, surgeS: 2, derate: 0.8 },
    supplies: [{ id: 's1', name: 'Supply', volts: 12, amps: 5 }],
    drivers: [{ id: 'd1', name: 'Driver', supplyId: 's1', channels: 2, channelAmps: 1, channelPeakAmps: 2, totalAmps: null, dropVolts: 0 }],
    cabs: [{ id: 'c1', name: 'Cab 1', driverId: 'd1', channel: 1 }],
    blocks: BLOCKS.map((id) => ({ id, name: `Block ${id}`, lengthMm: 2000 })),
    links: [
      { a: 'A', b: 'B' },
      { a: 'B', b: 'C' },
    ],
    locomotives: [{ id: 'l1', name: 'Loco', runningAmps: 0.3, stallAmps: 0.9, ratedVolts: 12 }],
    trains: Array.from({ length: count }, (_, i) => ({ id: `t${i}`, name: `Train ${i}`, locomotiveIds: ['l1'], lightingAmps: 0.05, lengthMm: 1000 })),
    operators: [{ id: 'o1', name: 'Ann' }],
    runs: Array.from({ length: count }, (_, i) => ({
      id: `r${i}`,
      trainId: `t${i}`,
      cabId: 'c1',
      operatorId: 'o1',
      departS: 0,
      arriveS: 30,
      steps: [
        { blockId: 'A', enterS: 0, exitS: 10 },
        { blockId: 'B', enterS: 5, exitS: 25 },
        { blockId: 'C', enterS: 20, exitS: 40 },
      ],
    })),
  };
}

