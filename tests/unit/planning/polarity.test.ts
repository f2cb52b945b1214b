import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkJointParity, checkPlan, jointAgrees, neededOutput, planSchema, routeThrough, toPlanJson, type Plan } from '@/lib/planning';
import { basePlan } from './polarity-plan';

type End = 'a' | 'b';
type Rail = 'right' | 'left';

/**
 * Rails as they lie, for the oracle: each block has the rail on the right looking towards its `b`
 * end ("R") and the other one ("L"). The cab's positive output feeds `positiveRail`'s rail. A cab
 * output of +1 puts + on that rail and − on the other. Independent of lib/planning/track.ts.
 */
const railVolts = (positiveRail: Rail, rail: 'R' | 'L', output: number) => ((positiveRail === 'right') === (rail === 'R') ? output : -output);
/** The rail on a traveller's right, heading for `toEnd`: R towards b, L towards a. */
const rightRail = (toEnd: End): 'R' | 'L' => (toEnd === 'b' ? 'R' : 'L');
/** The output (+1 forward, −1 reverse) that makes the right-hand rail positive (NEM 631 2.3), tried both ways. */
const oracleOutput = (toEnd: End, positiveRail: Rail) => [1, -1].find((o) => railVolts(positiveRail, rightRail(toEnd), o) > 0)!;
/**
 * Crossing from X (leaving by eX) into Y (entering at eY): the rail on the traveller's right in X
 * runs on into the rail on the traveller's right in Y. With one output on both, do they agree?
 */
const oracleAgrees = (eX: End, wX: Rail, eY: End, wY: Rail) =>
  [1, -1].every((o) => railVolts(wX, rightRail(eX), o) === railVolts(wY, rightRail(eY === 'a' ? 'b' : 'a'), o));

const run = (id: string, trainId: string, cabId: string, blocks: string[], startS = 0, perBlock = 10, overlap = 2) => ({
  id,
  trainId,
  cabId,
  operatorId: null,
  departS: startS,
  arriveS: startS + blocks.length * perBlock,
  steps: blocks.map((blockId, i) => ({ blockId, enterS: startS + i * perBlock - (i === 0 ? 0 : overlap), exitS: startS + (i + 1) * perBlock })),
});

const kinds = (plan: Plan, kind: string) => checkPlan(plan).findings.filter((f) => f.kind === kind);

describe('polarity and direction (NEM 631 2.3)', () => {
  it('worked example: the right-hand rail is positive in the direction of travel', () => {
    // NEM 631 2.3: DC two-rail, the right-hand rail looking in the direction of travel is positive.
    // Block wired with the cab's + on the rail that is on the right looking towards b:
    expect(neededOutput('b', 'right')).toBe(1); // heading for b: that rail is on the right → forward output
    expect(neededOutput('a', 'right')).toBe(-1); // heading for a: it is on the left → reverse output
    // Feeders swapped (+ on the left rail looking towards b): the outputs swap too.
    expect(neededOutput('b', 'left')).toBe(-1);
    expect(neededOutput('a', 'left')).toBe(1);
    // A joint b → a with the same wiring on both sides carries the right-hand rail straight on (common practice:
    // blocks of a plain line are wired alike); a joint a → a (a loop closing on itself) turns it round.
    expect(jointAgrees({ end: 'b', positiveRail: 'right' }, { end: 'a', positiveRail: 'right' })).toBe(true);
    expect(jointAgrees({ end: 'a', positiveRail: 'right' }, { end: 'a', positiveRail: 'right' })).toBe(false);
    expect(jointAgrees({ end: 'a', positiveRail: 'right' }, { end: 'a', positiveRail: 'left' })).toBe(true);
  });

  it('agrees with a rail-by-rail model at every joint and wiring (brute force over all 32 cases)', () => {
    const ends: End[] = ['a', 'b'];
    const rails: Rail[] = ['right', 'left'];
    for (const toEnd of ends) for (const w of rails) expect(neededOutput(toEnd, w)).toBe(oracleOutput(toEnd, w));
    for (const eX of ends)
      for (const eY of ends)
        for (const wX of rails)
          for (const wY of rails) {
            // jointAgrees takes the two ends of the joint; a traveller leaving X by eX enters Y by eY.
            expect(jointAgrees({ end: eX, positiveRail: wX }, { end: eY, positiveRail: wY })).toBe(oracleAgrees(eX, wX, eY, wY));
          }
  });

  it('finds a reversing loop exactly when no wiring of the ordinary blocks makes every joint agree (brute force over wirings)', () => {
    const end = fc.constantFrom<End>('a', 'b');
    fc.assert(
      fc.property(
        fc.array(fc.record({ rail: fc.constantFrom<Rail>('right', 'left'), section: fc.boolean() }), { minLength: 1, maxLength: 6 }),
        fc.array(fc.tuple(fc.nat(), fc.nat(), end, end), { maxLength: 9 }),
        (raw, pairs) => {
          const blocks = raw.map((b, i) => ({ id: `b${i}`, positiveRail: b.rail, reversingSection: b.section && i % 2 === 1 }));
          const links = pairs.map(([a, b, aEnd, bEnd]) => ({ a: blocks[a % blocks.length]!.id, b: blocks[b % blocks.length]!.id, aEnd, bEnd }));
          const ordinary = links.filter((l) => !blocks.find((b) => b.id === l.a)!.reversingSection && !blocks.find((b) => b.id === l.b)!.reversingSection);
          const wiringOf = (mask: number, id: string): Rail => ((mask >> Number(id.slice(1))) & 1 ? 'left' : 'right');
          let someWiringAgrees = false;
          for (let mask = 0; mask < 1 << blocks.length; mask++) {
            if (ordinary.every((l) => oracleAgrees(l.aEnd, wiringOf(mask, l.a), l.bEnd, wiringOf(mask, l.b)))) someWiringAgrees = true;
          }
          const parity = checkJointParity(blocks, links, (id) => (blocks.some((b) => b.id === id) ? Number(id.slice(1)) : undefined));
          expect(parity.reversingLoops.length > 0).toBe(!someWiringAgrees);
          // Where a wiring can agree, the joints reported as mismatched are exactly those that disagree as wired.
          if (someWiringAgrees) {
            const disagree = links
              .map((l, i) => ({ l, i }))
              .filter(({ l }) => ordinary.includes(l))
              .filter(({ l }) => !oracleAgrees(l.aEnd, blocks.find((b) => b.id === l.a)!.positiveRail, l.bEnd, blocks.find((b) => b.id === l.b)!.positiveRail))
              .map(({ i }) => i);
            expect(parity.mismatched).toEqual(disagree);
          }
        },
      ),
      { numRuns: 400 },
    );
  });

  it('finds exactly the crossings that short by polarity on random track and routes (brute force per joint)', () => {
    const end = fc.constantFrom<End>('a', 'b');
    fc.assert(
      fc.property(
        fc.array(fc.record({ rail: fc.constantFrom<Rail>('right', 'left'), turn: fc.boolean() }), { minLength: 2, maxLength: 6 }),
        fc.array(fc.tuple(fc.nat(), fc.nat(), end, end), { minLength: 1, maxLength: 9 }),
        fc.array(fc.nat(), { minLength: 2, maxLength: 4 }),
        (raw, pairs, stops) => {
          const blocks = raw.map((b, i) => ({ id: `b${i}`, name: `Block ${i}`, lengthMm: 2000, positiveRail: b.rail, reversingPlace: b.turn }));
          const links = pairs
            .map(([a, b, aEnd, bEnd]) => ({ a: blocks[a % blocks.length]!.id, b: blocks[b % blocks.length]!.id, aEnd, bEnd }))
            .filter((l) => l.a !== l.b);
          const route = routeThrough({ blocks, links }, stops.map((s) => blocks[s % blocks.length]!.id));
          if (!route.ok || route.steps.length < 2) return;
          const plan = basePlan({ blocks, links, runs: [run('r', 't', 'c1', route.steps.map((s) => s.blockId))] });
          // Record the route's own ends on the steps, as the builder does.
          plan.runs[0]!.steps.forEach((step, i) => Object.assign(step, { fromEnd: route.steps[i]!.fromEnd, toEnd: route.steps[i]!.toEnd }));
          expect(planSchema.safeParse(toPlanJson(plan)).success).toBe(true);
          const expected: string[] = [];
          route.steps.forEach((step, i) => {
            if (i === 0) return;
            const before = route.steps[i - 1]!;
            const wX = blocks.find((b) => b.id === before.blockId)!.positiveRail;
            const wY = blocks.find((b) => b.id === step.blockId)!.positiveRail;
            // The cab gives what the block left needs; does it suit the rails of the block entered?
            const output = oracleOutput(before.toEnd, wX);
            const inY = oracleOutput(step.fromEnd === 'a' ? 'b' : 'a', wY);
            if (output !== inY) expect(oracleAgrees(before.toEnd, wX, step.fromEnd, wY)).toBe(false);
            if (output !== inY) expected.push(`${before.blockId}>${step.blockId}`);
          });
          const found = kinds(plan, 'joint-short').map((f) => `${f.ids[1]}>${f.ids[2]}`);
          expect(found).toEqual(expected);
          expect(kinds(plan, 'route-reversal')).toEqual([]);
        },
      ),
      { numRuns: 300 },
    );
  });
});

describe('reversing loops, reversing sections and shorts across a rail gap', () => {
  // A balloon loop: the line M ends at a turnout whose two routes are the two ends of the loop block L.
  const balloon = (section: boolean, loopMm = 3000) =>
    basePlan({
      blocks: [
        { id: 'M', name: 'Main', lengthMm: 2000 },
        { id: 'L', name: 'Balloon', lengthMm: loopMm, reversingSection: section },
      ],
      links: [
        { a: 'M', aEnd: 'b', b: 'L', bEnd: 'a' },
        { a: 'M', aEnd: 'b', b: 'L', bEnd: 'b' },
      ],
    });

  it('detects a reversing loop without a reversing section, and none once the loop has one', () => {
    // NEM 631 2.3 fixes the positive rail by the direction of travel; round a loop the train comes back
    // facing the other way, so the rail that was positive meets the negative one at the turnout. Common
    // practice: gap the loop and give it its own polarity switch (a reversing section).
    const found = kinds(balloon(false), 'reversing-loop');
    expect(found).toHaveLength(1);
    expect(found[0]!.severity).toBe('error');
    expect(new Set(found[0]!.ids)).toEqual(new Set(['M', 'L']));
    expect(found[0]!.message).toMatch(/reversing loop or wye/);
    expect(kinds(balloon(true), 'reversing-loop')).toEqual([]);
  });

  it('detects a wye: three legs meeting the line the other way round (common practice: a wye turns a train like a loop)', () => {
    // P and Q are the turnouts on the line W–S–E; legs PR and QR meet at R, where the tail T starts.
    const wye = (tailSection: boolean) =>
      basePlan({
        blocks: ['W', 'S', 'E', 'PR', 'QR', 'T'].map((id) => ({ id, name: id, lengthMm: 2000, reversingSection: id === 'T' && tailSection })),
        links: [
          { a: 'W', aEnd: 'b', b: 'S', bEnd: 'a' },
          { a: 'W', aEnd: 'b', b: 'PR', bEnd: 'a' },
          { a: 'S', aEnd: 'b', b: 'E', bEnd: 'a' },
          { a: 'E', aEnd: 'a', b: 'QR', bEnd: 'a' },
          { a: 'PR', aEnd: 'b', b: 'T', bEnd: 'a' },
          { a: 'QR', aEnd: 'b', b: 'T', bEnd: 'a' },
        ],
      });
    expect(kinds(wye(false), 'reversing-loop')).toHaveLength(1);
    expect(kinds(wye(true), 'reversing-loop')).toEqual([]);
  });

  it('a train round the loop passes when it fits wholly inside the reversing section, and is reported when it does not', () => {
    // Common practice: the section is longer than the train, and flips only while the whole train is inside it.
    // In at the loop's a end, round, and out at its b end back into M: M → L → M.
    const through = (loopMm: number) => {
      const plan = balloon(true, loopMm);
      plan.blocks[0] = { ...plan.blocks[0]!, reversingPlace: false };
      plan.runs = [run('r', 't', 'c1', ['M', 'L', 'M'], 0, 20, 2)];
      return plan;
    };
    const fits = through(3000);
    expect(kinds(fits, 'reversing-section-short')).toEqual([]);
    expect(kinds(fits, 'joint-short')).toEqual([]);
    expect(kinds(fits, 'route-reversal')).toEqual([]);
    const short = kinds(through(800), 'reversing-section-short');
    expect(short.map((f) => f.ids)).toEqual([['r', 'L']]);
    expect(short[0]!.message).toMatch(/800 mm, shorter than the train's 1000 mm/);
  });

  it('a train round a loop without a reversing section shorts the supply where it bridges the joint that closes the loop', () => {
    // NEM 631 2.3: in at the loop's a end with the cab forward; out at its b end into M's b end, where
    // M needs reverse for the right-hand rail to stay positive. The wheels bridge the gap while the
    // 1000 mm train crosses it (steps M 38 s, L until 40 s): a short across the rail gap.
    const plan = balloon(false);
    plan.runs = [run('r', 't', 'c1', ['M', 'L', 'M'], 0, 20, 2)];
    const shorts = kinds(plan, 'joint-short');
    expect(shorts.map((f) => [f.ids, f.fromS, f.toS])).toEqual([[['r', 'L', 'M'], 38, 40]]);
    expect(shorts[0]!.message).toMatch(/needs reverse .*NEM 631 2\.3.*short the supply across the gap/);
    // The same run with the loop a reversing section (its own polarity switch, common practice): no short.
    const switched = balloon(true);
    switched.runs = plan.runs;
    expect(kinds(switched, 'joint-short')).toEqual([]);
  });

  it('a train bridging a joint whose blocks need opposite cab outputs shorts the supply', () => {
    const plan = basePlan({
      blocks: [
        { id: 'A', name: 'Yard road', lengthMm: 2000 },
        { id: 'B', name: 'Yard lead', lengthMm: 2000, positiveRail: 'left' },
      ],
      links: [{ a: 'A', b: 'B' }],
      runs: [run('r', 't', 'c1', ['A', 'B'], 0, 10, 2)],
    });
    const found = kinds(plan, 'joint-short');
    expect(found.map((f) => [f.ids, f.fromS, f.toS])).toEqual([[['r', 'A', 'B'], 8, 10]]);
    expect(found[0]!.message).toMatch(/NEM 631 2.3/);
    // The layout check says the same before any train runs.
    expect(kinds(plan, 'joint-wiring').map((f) => f.ids)).toEqual([['A', 'B']]);
    // Wired alike, the same run crosses cleanly.
    plan.blocks[1] = { ...plan.blocks[1]!, positiveRail: 'right' };
    expect(kinds(plan, 'joint-short')).toEqual([]);
    expect(kinds(plan, 'joint-wiring')).toEqual([]);
  });

  it('a train bridging a joint while the block beyond is fed by another cab shorts the two cabs together', () => {
    const plan = basePlan({
      blocks: ['A', 'B', 'C'].map((id) => ({ id, name: id, lengthMm: 2000 })),
      links: [
        { a: 'A', b: 'B' },
        { a: 'B', b: 'C' },
      ],
      runs: [run('r1', 't', 'c1', ['A', 'B'], 0, 10, 2), { ...run('r2', 'u', 'c2', ['C', 'B'], 0, 9, 0), steps: [{ blockId: 'B', enterS: 0, exitS: 9 }] }],
    });
    const found = kinds(plan, 'joint-short').filter((f) => f.ids[0] === 'r1');
    expect(found.map((f) => f.ids)).toEqual([['r1', 'A', 'B']]);
    expect(found[0]!.message).toMatch(/fed by cab 2/i);
  });

  it('refuses a reversal in the middle of a run except in a reversing place', () => {
    const plan = basePlan({
      blocks: ['A', 'B', 'S'].map((id) => ({ id, name: id, lengthMm: 2000 })),
      links: [
        { a: 'A', aEnd: 'b', b: 'B', bEnd: 'a' },
        { a: 'A', aEnd: 'b', b: 'S', bEnd: 'a' },
      ],
      runs: [run('r', 't', 'c1', ['B', 'A', 'S'])],
    });
    expect(kinds(plan, 'route-reversal').map((f) => f.ids)).toEqual([['r', 'A']]);
    plan.blocks[0] = { ...plan.blocks[0]!, reversingPlace: true };
    expect(kinds(plan, 'route-reversal')).toEqual([]);
    // Turning round with the whole train fed by one cab needs no polarity change: no short.
    expect(kinds(plan, 'joint-short')).toEqual([]);
  });
});
