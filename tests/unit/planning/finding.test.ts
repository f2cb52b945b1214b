import { beforeEach, describe, expect, it, vi } from 'vitest';
import { compareFindings, type Finding, type FindingKind } from '@/lib/planning';
import { orderedPair } from '@/lib/planning/finding';

const finding = (over: Partial<Finding>): Finding => ({ kind: 'block-overlap', severity: 'error', ids: [], fromS: 0, toS: 60, message: '', ...over });

// Every kind written out once, independently of FINDING_KINDS: the Record type makes TypeScript refuse a
// kind left out or one that does not exist.
const EVERY_KIND: Record<FindingKind, true> = {
  'block-overlap': true, 'block-occupied': true, 'cab-double-booked': true, 'operator-double-booked': true,
  'train-double-booked': true, 'locomotive-in-two-trains': true, 'train-continuity': true, 'route-gap': true,
  'step-gap': true, 'train-too-long': true, 'route-reversal': true, 'reversing-loop': true, 'joint-wiring': true,
  'joint-short': true, 'reversing-section-short': true, 'channel-overload': true, 'channel-peak-overload': true,
  'driver-overload': true, 'driver-heat': true, 'supply-overload': true, 'supply-derate': true,
  'track-voltage-high': true, 'track-voltage-low': true, 'speed-not-reachable': true,
};

// FINDING_KINDS and the rank compareFindings reads are built when the module is imported; Stryker's Vitest
// runner switches a mutant on after this file's own imports, so these checks load a fresh copy.
describe('FINDING_KINDS and the kind order as loaded', () => {
  let fresh: typeof import('@/lib/planning/finding');
  beforeEach(async () => {
    vi.resetModules();
    fresh = await import('@/lib/planning/finding');
  });

  it('FINDING_KINDS names every kind exactly once', () => {
    expect(fresh.FINDING_KINDS).toHaveLength(Object.keys(EVERY_KIND).length);
    expect([...fresh.FINDING_KINDS].sort()).toEqual(Object.keys(EVERY_KIND).sort());
  });

  it('two findings at the same time and ids are ordered by their kinds’ places in FINDING_KINDS', () => {
    const kinds = fresh.FINDING_KINDS;
    for (let i = 0; i < kinds.length; i++) {
      for (let j = 0; j < kinds.length; j++) {
        const order = fresh.compareFindings(finding({ kind: kinds[i]!, ids: ['r1'] }), finding({ kind: kinds[j]!, ids: ['r1'] }));
        expect(Math.sign(order), `${kinds[i]} vs ${kinds[j]}`).toBe(Math.sign(i - j));
      }
    }
  });
});

describe('compareFindings: start, then kind, then ids (worked by hand)', () => {
  it('puts the earlier finding first whatever its kind', () => {
    expect(compareFindings(finding({ kind: 'speed-not-reachable', fromS: 10 }), finding({ kind: 'block-overlap', fromS: 20 }))).toBeLessThan(0);
  });

  it('then compares ids one by one: the first that differs decides, in string order', () => {
    // 'r1' < 'r2' decides although 'r9' > 'r0' comes after.
    expect(compareFindings(finding({ ids: ['r1', 'r9'] }), finding({ ids: ['r2', 'r0'] }))).toBe(-1);
    expect(compareFindings(finding({ ids: ['r2', 'r0'] }), finding({ ids: ['r1', 'r9'] }))).toBe(1);
    expect(compareFindings(finding({ ids: ['r1', 'r2'] }), finding({ ids: ['r1', 'r3'] }))).toBe(-1);
    expect(compareFindings(finding({ ids: ['r1', 'r2'] }), finding({ ids: ['r1', 'r2'] }))).toBe(0);
  });

  it('puts a list of ids before a longer list that starts with it (as a dictionary orders words)', () => {
    // ['b1'] is a prefix of ['b1', 'b2']: one id fewer, so −1 one way and +1 the other.
    expect(compareFindings(finding({ ids: ['b1'] }), finding({ ids: ['b1', 'b2'] }))).toBe(-1);
    expect(compareFindings(finding({ ids: ['b1', 'b2'] }), finding({ ids: ['b1'] }))).toBe(1);
  });

  it('orderedPair gives two ids in ascending string order', () => {
    expect(orderedPair('r2', 'r10')).toEqual(['r10', 'r2']);
    expect(orderedPair('r10', 'r2')).toEqual(['r10', 'r2']);
  });
});
