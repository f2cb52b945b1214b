/**
 * Stored rows as the plan interchange's shapes (lib/layouts/track-rows.ts): a step's direction is
 * written only when it was recorded (lib/planning/schema.ts stepSchema: fromEnd and toEnd are
 * optional, absent means derived from the route), and a block's wiring only where it differs from
 * the default right-hand rail (NEM 631 2.3).
 */
import { describe, expect, it } from 'vitest';
import { planBlockOf, planLinkOf, stepEndsOf } from '@/lib/layouts/track-rows';

describe('track rows', () => {
  it('writes each recorded end of a step, and leaves out the ones not recorded', () => {
    expect(stepEndsOf({ fromEnd: 'a', toEnd: 'b' })).toEqual({ fromEnd: 'a', toEnd: 'b' });
    expect(stepEndsOf({ fromEnd: 'b', toEnd: null })).toEqual({ fromEnd: 'b' });
    expect(stepEndsOf({ fromEnd: null, toEnd: 'a' })).toEqual({ toEnd: 'a' });
    expect(Object.keys(stepEndsOf({ fromEnd: null, toEnd: null }))).toEqual([]);
  });

  it('writes a block’s wiring and flags only where they differ from the defaults, and a link with both ends', () => {
    const row = { id: 'b1', name: 'West', lengthMm: 1200, positiveRail: 'right' as const, reversingSection: false, reversingPlace: false };
    expect(planBlockOf(row)).toEqual({ id: 'b1', name: 'West', lengthMm: 1200 });
    expect(planBlockOf({ ...row, positiveRail: 'left', reversingSection: true, reversingPlace: true })).toEqual({
      id: 'b1',
      name: 'West',
      lengthMm: 1200,
      positiveRail: 'left',
      reversingSection: true,
      reversingPlace: true,
    });
    expect(planLinkOf({ blockAId: 'b1', blockBId: 'b2', blockAEnd: 'a', blockBEnd: 'b' })).toEqual({ a: 'b1', b: 'b2', aEnd: 'a', bEnd: 'b' });
  });
});
