import { describe, expect, it } from 'vitest';
import { carryOnFrom } from '@/lib/sessions/carry-on';

// A fast clock at 4:1 from 06:00: one fast minute is 15 real seconds (common practice for club sessions).
const clock = { ratio: 4, fastStart: '06:00' };

const run = (trainId: string, departS: number, arriveS: number, blocks: string[], standAfterS = 30) => ({
  trainId,
  departS,
  arriveS,
  steps: blocks.map((blockId, i) => ({ blockId, exitS: i === blocks.length - 1 ? arriveS + standAfterS : departS + i })),
});

describe('the add-run form carries on from the train\'s last run (issue 13 item 14)', () => {
  it('starts where the last run stopped and departs after its stand and the new stand before', () => {
    const runs = [run('goods', 0, 120, ['Y1', 'M', 'P2']), run('goods', 300, 420, ['P2', 'M', 'Y2']), run('express', 0, 600, ['Y1', 'P1'])];
    // Last arrival 420 s, stand after 30 s → free at 450 s; a 60 s stand before → 510 s real,
    // = 06:00 + 510 × 4 s = 06:34:00 fast, already a whole minute.
    expect(carryOnFrom(runs, 'goods', clock, 60)).toEqual({ depart: '06:34', fromBlockId: 'Y2' });
    // 511 s real is 06:34:04 fast: the next whole minute, 06:35.
    expect(carryOnFrom(runs, 'goods', clock, 61)).toEqual({ depart: '06:35', fromBlockId: 'Y2' });
  });

  it('takes the run arriving last, whatever the order of the list', () => {
    const runs = [run('goods', 300, 420, ['P2', 'Y2']), run('goods', 0, 120, ['Y1', 'P2'])];
    expect(carryOnFrom(runs, 'goods', clock, 0)?.fromBlockId).toBe('Y2');
  });

  it('has nothing to carry on from for a train with no runs', () => {
    expect(carryOnFrom([run('express', 0, 600, ['Y1', 'P1'])], 'goods', clock, 60)).toBeUndefined();
  });

  it('wraps past fast midnight like the clock face', () => {
    // 23:50 fast start; arriving 150 s real later (+10 fast min) with no stands → 00:00.
    expect(carryOnFrom([run('goods', 0, 150, ['A', 'B'], 0)], 'goods', { ratio: 4, fastStart: '23:50' }, 0)?.depart).toBe('00:00');
  });
});
