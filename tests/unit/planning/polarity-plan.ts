import type { Plan } from '@/lib/planning';

/**
 * A plan with one supply, one two-channel driver (cabs c1 "Cab 1" and c2 "Cab 2"), trains t (Goods,
 * 1000 mm) and u (Railcar, 400 mm), and no track or runs: the polarity tests add their own.
 */
export function basePlan(overrides: Partial<Plan>): Plan {
  return {
    version: 1,
    scale: { name: 'H0', ratio: 87 },
    clock: { ratio: 4, fastStart: '07:00' },
    rules: { headwayS: 0, surgeS: 0, derate: 1 },
    supplies: [{ id: 's', name: 'Supply', volts: 12, amps: 10 }],
    drivers: [{ id: 'd', name: 'Driver', supplyId: 's', channels: 2, channelAmps: 5, channelPeakAmps: 5, totalAmps: null, dropVolts: 0 }],
    cabs: [
      { id: 'c1', name: 'Cab 1', driverId: 'd', channel: 1 },
      { id: 'c2', name: 'Cab 2', driverId: 'd', channel: 2 },
    ],
    blocks: [],
    links: [],
    locomotives: [
      { id: 'l', name: 'Loco', runningAmps: 0.3, stallAmps: 0.5, ratedVolts: 12 },
      { id: 'l2', name: 'Railcar motor', runningAmps: 0.2, stallAmps: 0.4, ratedVolts: 12 },
    ],
    trains: [
      { id: 't', name: 'Goods', locomotiveIds: ['l'], lightingAmps: 0, lengthMm: 1000 },
      { id: 'u', name: 'Railcar', locomotiveIds: ['l2'], lightingAmps: 0, lengthMm: 400 },
    ],
    operators: [],
    runs: [],
    ...overrides,
  };
}

/** A run with no operator that departs as its first step begins and arrives as its last one ends. */
export function runOf(id: string, trainId: string, cabId: string, steps: Plan['runs'][number]['steps']): Plan['runs'][number] {
  return { id, trainId, cabId, operatorId: null, departS: steps[0]!.enterS, arriveS: steps[steps.length - 1]!.exitS, steps };
}
