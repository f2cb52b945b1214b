/**
 * Duty tables (lib/layouts/power-budget.ts dutyTables) with start voltages: the duty a speed needs is
 * (start + (rated − start) × speed / top) / track volts (lib/planning/duty.ts, the linear motor model
 * of common practice), track volts = supply − bridge drop. In a consist the locomotive needing the most
 * sets the duty (the first of equals), and a locomotive the layout does not have is left out.
 */
import { describe, expect, it } from 'vitest';
import { dutyTables, type BudgetInput } from '@/lib/layouts/power-budget';

const input = (locomotives: BudgetInput['locomotives'], locomotiveIds: string[]): BudgetInput => ({
  scale: { name: 'H0 (NEM)', ratio: 87 },
  derate: 0.8,
  surgeS: 2,
  supplies: [{ id: 's', name: 'Bench', volts: 20, amps: 2 }],
  // An own driver with a flat 1 V drop: 19 V on the track.
  drivers: [{ id: 'd', name: 'Board', supplyId: 's', presetId: null, partNumber: null, channels: 1, channelAmps: 1, channelPeakAmps: 2, totalAmps: null, dropVolts: 1 }],
  cabs: [{ id: 'c1', name: 'Cab 1', driverId: 'd', channel: 1 }],
  locomotives,
  trains: [{ id: 't', name: 'Goods', locomotiveIds, lightingAmps: 0, lengthMm: 900 }],
});
const loco = (id: string, startVolts: number | null) => ({ id, name: id, runningAmps: 0.5, stallAmps: 1, ratedVolts: 12, topSpeedKmh: 100, startVolts });

describe('duty tables with start voltages', () => {
  it('adds the start voltage below the rated voltage: 2 + 10 × 50/100 = 7 V of 19 V at half speed', () => {
    const [table] = dutyTables(input([loco('A', 2)], ['A', 'missing']));
    expect(table!.speeds).toEqual([25, 50, 75, 100]);
    expect(table!.rows[1]![0]!.duty).toBeCloseTo(7 / 19, 9);
    expect(table!.rows[3]![0]!.duty).toBeCloseTo(12 / 19, 9);
    expect(table!.rows[1]![0]!.note).toBe('');
  });

  it('names the locomotive that needs the most, the first of two that need the same', () => {
    // At 25 km/h A needs 2 + 10 × 0.25 = 4.5 V, B 3 + 9 × 0.25 = 5.25 V; at 100 km/h both need 12 V.
    const [table] = dutyTables(input([loco('A', 2), loco('B', 3)], ['A', 'B']));
    expect(table!.rows[0]![0]).toMatchObject({ ok: true, note: 'set by B' });
    expect(table!.rows[0]![0]!.duty).toBeCloseTo(5.25 / 19, 9);
    expect(table!.rows[3]![0]).toMatchObject({ ok: true, note: 'set by A' });
  });
});
