// Length units as the planner sees them: the picker's labels, the shown figure and the unit check.
// The module is loaded again inside each test (vi.resetModules, then import): its label table is built
// when the module is evaluated, before a mutation test run switches a change on (Stryker's Vitest
// runner does that in a beforeAll).
import { beforeEach, describe, expect, it, vi } from 'vitest';

type Units = typeof import('@/lib/layouts/units');
let U: Units;

beforeEach(async () => {
  vi.resetModules();
  U = await import('@/lib/layouts/units');
});

describe('length unit labels', () => {
  it('names each unit with its SI or international symbol', () => {
    // SI Brochure (BIPM, 9th ed.) for mm, cm, m; the international yard and pound agreement (1959) for in and ft.
    expect(U.LENGTH_UNIT_LABELS).toEqual({
      mm: 'millimetres (mm)',
      cm: 'centimetres (cm)',
      m: 'metres (m)',
      in: 'inches (in)',
      ft: 'feet (ft)',
    });
  });
});

describe('formatLength', () => {
  it('shows millimetres by default, with thousands grouped (en-GB)', () => {
    expect(U.formatLength(1234.5)).toBe('1,234.5 mm');
  });

  it('shows the figure in the unit asked for: 1 ft = 304.8 mm, 1 in = 25.4 mm (1959 agreement), 1 m = 1000 mm (SI)', () => {
    expect(U.formatLength(1524, 'ft')).toBe('5 ft');
    expect(U.formatLength(762, 'in')).toBe('30 in');
    expect(U.formatLength(2500, 'm')).toBe('2.5 m');
    expect(U.formatLength(125, 'cm')).toBe('12.5 cm');
  });

  it('shows at most four decimals: 1 mm is 0.03937… in, shown 0.0394 in', () => {
    expect(U.formatLength(1, 'in')).toBe('0.0394 in');
    expect(U.formatLength(1, 'ft')).toBe('0.0033 ft');
  });
});

describe('isLengthUnit', () => {
  it('takes the five units and nothing else', () => {
    for (const unit of ['mm', 'cm', 'm', 'in', 'ft']) expect(U.isLengthUnit(unit)).toBe(true);
    for (const other of ['yd', 'MM', '', 'm ', 25.4, null, undefined, ['mm'], { mm: 1 }]) expect(U.isLengthUnit(other)).toBe(false);
  });
});
