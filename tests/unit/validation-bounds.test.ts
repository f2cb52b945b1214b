import { describe, expect, it } from 'vitest';
import { driverSchema, locomotiveSchema, supplySchema } from '@/lib/validations/layout';
import { createRunSchema, seriesSchema } from '@/lib/runs/schema';
import { sessionSettingsSchema } from '@/lib/validations/session';
import {
  DRIVER_BOUNDS,
  LOCOMOTIVE_BOUNDS,
  RUN_TIMING_BOUNDS,
  SERIES_BOUNDS,
  SESSION_SETTINGS_BOUNDS,
  SUPPLY_BOUNDS,
  type Bound,
} from '../shared/expected-bounds';

type Schema = { safeParse: (v: unknown) => { success: boolean; error?: { issues: { path: PropertyKey[] }[] } } };

/**
 * Each edge of each bound, with every other field of a valid input left as it is: the value on the
 * edge is taken, the value just past it refused with one issue, on that field. (The step past the
 * edge is 1, or 0.5 for the side of a `gt` bound, which refuses the minimum itself.)
 */
function probe(name: string, schema: Schema, valid: Record<string, unknown>, bounds: Bound[], asText: boolean) {
  describe(name, () => {
    it('takes the valid input the probes start from', () => {
      expect(schema.safeParse(valid).success).toBe(true);
    });
    for (const b of bounds) {
      it(`${b.field}: ${b.gt ? `more than ${b.min}` : `${b.min}`} to ${b.max} (${b.source})`, () => {
        const value = (n: number) => (asText ? String(n) : n);
        const accepted = b.gt ? [b.min + 0.5, b.max] : [b.min, b.max];
        const refusedValues = [b.gt ? b.min : b.min - 1, b.max + 1, ...(b.int ? [b.min + 0.5] : [])];
        for (const n of accepted) expect(schema.safeParse({ ...valid, [b.field]: value(n) }).success, `${b.field} = ${n}`).toBe(true);
        for (const n of refusedValues) {
          const result = schema.safeParse({ ...valid, [b.field]: value(n) });
          expect(result.success, `${b.field} = ${n}`).toBe(false);
          expect(result.error!.issues.map((i) => i.path.join('.')), `${b.field} = ${n}`).toEqual([b.field]);
        }
      });
    }
  });
}

const settings = {
  title: 'Running evening',
  place: '',
  description: '',
  date: '2031-01-15',
  startTime: '18:30',
  endTime: '21:30',
  clockRatio: '4',
  fastStart: '06:00',
  headwayS: '30',
  surgeS: '2',
  deratePercent: '80',
};

describe('validation limits against the tests’ own table of expected bounds, one field at a time', () => {
  probe('session settings (form text)', sessionSettingsSchema, settings, SESSION_SETTINGS_BOUNDS, true);
  probe('copies of a run (JSON)', seriesSchema, { everyFastMin: 30, count: 3 }, SERIES_BOUNDS, false);
  probe(
    'a run timed from its route (JSON)',
    createRunSchema,
    { trainId: 't', cabId: 'c', operatorId: null, depart: '06:30', waypoints: ['a', 'b'], speedKmh: 60, standBeforeS: 60, standAfterS: 120 },
    RUN_TIMING_BOUNDS,
    false,
  );
  probe('supply (form text)', supplySchema, { name: 'Supply', volts: '15', amps: '3' }, SUPPLY_BOUNDS, true);
  probe(
    'driver (form text)',
    driverSchema,
    { name: 'Driver', supplyId: 's', presetId: '', partNumber: '', channels: '2', channelAmps: '1', channelPeakAmps: '100', totalAmps: '', dropVolts: '2' },
    DRIVER_BOUNDS,
    true,
  );
  probe(
    'locomotive (form text)',
    locomotiveSchema,
    { name: 'Tank engine', runningAmps: '0.3', stallAmps: '40', ratedVolts: '12', topSpeedKmh: '80' },
    LOCOMOTIVE_BOUNDS,
    true,
  );
});
