import { describe, expect, it } from 'vitest';
import { getDb } from '@/db';
import { listSessionInvitations } from '@/db/queries/invitation-records';
import { loadLayoutRows, loadSessionRows } from '@/db/queries/plan-data';
import { listRailwaySessions } from '@/db/queries/sessions';
import * as t from '@/db/schema';
import { DEMO_USERS, demoSessionStart, hasDemoData, seedDemoRailway } from '@/lib/demo/demo-railway';
import { deliveryOf } from '@/lib/invitations/tracker';
import { checkPlan, formatFast, planSchema, toPlanJson, type Finding } from '@/lib/planning';
import { layoutToPlan, sessionToPlan } from '@/lib/sessions/to-plan';

describe('demo railway seed', () => {
  const now = new Date('2026-12-01T12:00:00Z');
  const seeded = () => {
    const db = getDb();
    if (!hasDemoData(db)) seedDemoRailway(db, { now, passwordHash: '$2a$04$demo.hash.for.tests.only.............' });
    return db.select().from(t.sessions).get()!;
  };

  it('has the shape the README promises', () => {
    seeded();
    const db = getDb();
    expect(db.select().from(t.railways).all()).toHaveLength(1);
    expect(db.select().from(t.layouts).all().map((l) => l.setting).sort()).toEqual(['indoor', 'outdoor']);
    expect(db.select().from(t.supplies).all().length).toBeGreaterThanOrEqual(2);
    expect(new Set(db.select().from(t.drivers).all().map((d) => d.presetId)).size).toBeGreaterThanOrEqual(2);
    expect(db.select().from(t.cabs).all()).toHaveLength(6);
    expect(db.select().from(t.locomotives).all()).toHaveLength(9);
    expect(db.select().from(t.trains).all()).toHaveLength(6);
    const roles = db.select().from(t.memberships).all().map((m) => m.role);
    expect(roles.filter((r) => r === 'operator').length).toBeGreaterThanOrEqual(6);
    const indoor = db.select().from(t.layouts).all().find((l) => l.setting === 'indoor')!;
    expect(db.select().from(t.blocks).all().filter((b) => b.layoutId === indoor.id).length).toBe(13);
  });

  it('the tracker’s states agree: no invitation was e-mailed, so no one has replied yet', () => {
    const session = seeded();
    const rows = listSessionInvitations(session.id);
    expect(rows.length).toBe(6);
    for (const row of rows) {
      expect(deliveryOf(row)).toBe('not-sent');
      expect(row.reply).toBe('needs-action'); // a reply needs an invitation to reply to
      expect(row.respondedAt).toBeNull();
    }
  });

  it('the session is published, upcoming, about twenty runs, and invites and assigns the demo operator', () => {
    const session = seeded();
    expect(session.status).toBe('published');
    expect(session.startsAt.getTime()).toBe(demoSessionStart(now).getTime());
    expect(session.startsAt.getTime()).toBeGreaterThan(now.getTime());
    const operator = getDb().select().from(t.users).all().find((u) => u.email === DEMO_USERS[2].email)!;
    const visible = listRailwaySessions(session.railwayId, { userId: operator.id, role: 'operator' });
    expect(visible.map((s) => s.id)).toEqual([session.id]);
    const rows = loadSessionRows(session.id)!;
    expect(rows.runs.length).toBeGreaterThanOrEqual(18);
    expect(rows.runs.filter((r) => r.operatorId === operator.id).length).toBeGreaterThanOrEqual(3);
  });

  it('is a valid plan whose deliberate clashes the checker finds: a shared block, a double-booked cab, an overloaded channel, a polarity short', () => {
    const session = seeded();
    const parsed = planSchema.safeParse(toPlanJson(sessionToPlan(loadSessionRows(session.id)!)));
    expect(parsed.success).toBe(true);
    if (!parsed.success) return;
    const findings = checkPlan(parsed.data).findings;
    const kinds = new Set(findings.filter((f) => f.severity === 'error').map((f) => f.kind));
    // The deliberate clashes and nothing else: no train stands in a block another run passes through
    // (issue 12's whole-session occupancy), no locomotive is in two trains, every train's next run leaves
    // from where its last one stopped. Where the goods meets the express each bridges a rail gap into a
    // block the other's cab feeds (joint-short, two cabs).
    expect(kinds).toEqual(new Set(['block-overlap', 'cab-double-booked', 'channel-overload', 'channel-peak-overload', 'joint-short']));
    const shorts = findings.filter((f) => f.kind === 'joint-short');
    const twoCabs = shorts.filter((f) => /two cabs meet across the gap/.test(f.message));
    expect(twoCabs).toHaveLength(4);
    expect(twoCabs.every((f) => /Pick-up goods|Fernwick express/.test(f.message) && f.fromS < 40 * 60 && f.fromS > 30 * 60)).toBe(true);
    // The deliberate polarity clash: yard road 3's feeders are the wrong way round, so the stone
    // train leaving it bridges a rail gap with opposite polarity either side (NEM 631 2.3).
    const polarity = shorts.filter((f) => !twoCabs.includes(f));
    expect(polarity).toHaveLength(1);
    expect(polarity[0]!.message).toMatch(/^Double-headed stone train .* from block Larkholm yard road 3 into block Larkholm yard lead .*NEM 631 2\.3/);
    const wiring = findings.filter((f) => f.kind === 'joint-wiring');
    expect(wiring.map((f) => f.severity)).toEqual(['warning']);
    expect(wiring[0]!.message).toMatch(/Larkholm yard road 3/);
  });

  it('finds exactly the deliberate set: each finding by severity, kind and what it names (runs by train and departure)', () => {
    const session = seeded();
    const plan = planSchema.parse(toPlanJson(sessionToPlan(loadSessionRows(session.id)!)));
    const runLabel = new Map(plan.runs.map((r) => [r.id, `${plan.trains.find((tr) => tr.id === r.trainId)!.name} ${formatFast(r.departS, plan.clock)}`]));
    const names = new Map<string, string>([
      ...runLabel,
      ...[...plan.blocks, ...plan.cabs, ...plan.drivers, ...plan.locomotives, ...plan.trains].map((x): [string, string] => [x.id, x.name]),
    ]);
    // What a finding names, in its order, then the runs it names (by train and departure, sorted: a
    // finding lists its runs by id). One that names no run (the electrics, the layout) is placed by its fast time.
    const describe = (f: Finding) => {
      const others = f.ids.filter((id) => !runLabel.has(id)).map((id) => names.get(id) ?? id);
      const runs = f.ids.filter((id) => runLabel.has(id)).map((id) => runLabel.get(id)!).sort();
      const at = runs.length > 0 ? '' : ` @ ${formatFast(f.fromS, plan.clock)}`;
      return `${f.severity} ${f.kind}: ${[...others, ...runs].join(' / ')}${at}`;
    };
    const found = checkPlan(plan).findings.map(describe).sort();
    expect(found).toEqual(
      [
        // 1. The railcar shuttle is put on cab 3 while the goods is still moving on it.
        'error cab-double-booked: Cab 3 / Pick-up goods 06:56 / Railcar shuttle 06:57',
        // 2. The goods sets off from the loop while the express is still coming down Fernwick bank:
        //    three blocks shared, and at four rail gaps one train's wheels join the two cabs.
        'error block-overlap: Fernwick approach / Fernwick express 08:08 / Pick-up goods 08:08',
        'error block-overlap: Mossgate west / Fernwick express 08:08 / Pick-up goods 08:08',
        'error block-overlap: Fernwick bank / Fernwick express 08:08 / Pick-up goods 08:08',
        'error joint-short: Mossgate loop, passing road / Mossgate west / Pick-up goods 08:08',
        'error joint-short: Mossgate west / Fernwick bank / Pick-up goods 08:08',
        'error joint-short: Fernwick bank / Mossgate west / Fernwick express 08:08',
        'error joint-short: Mossgate west / Mossgate loop, main road / Fernwick express 08:08',
        // 3. The double-headed stone train overloads cab 1's 1 A-class channel on both its runs (running
        //    and starting) and heats the main line board past its package rating (SLRS007B, 2075 mW) ...
        'error channel-overload: Cab 1 @ 12:40',
        'error channel-overload: Cab 1 @ 13:52',
        'error channel-peak-overload: Cab 1 @ 12:40',
        'error channel-peak-overload: Cab 1 @ 13:52',
        'warning driver-heat: Main line board @ 12:40',
        'warning driver-heat: Main line board @ 13:52',
        //    ... and 4. leaves yard road 3, whose feeders are the wrong way round (NEM 631 2.3).
        'error joint-short: Larkholm yard road 3 / Larkholm yard lead / Double-headed stone train 12:40',
        'warning joint-wiring: Larkholm yard road 3 / Larkholm yard lead @ 06:00',
        // 5. The goods' freight diesel has no measured start voltage, so each start is judged at its full
        //    1.6 A stall current, above the 1.2 A continuous rating of cab 3's MOSFET class.
        'error channel-peak-overload: Cab 3 @ 06:56',
        'error channel-peak-overload: Cab 3 @ 08:08',
        'error channel-peak-overload: Cab 3 @ 09:28',
        'error channel-peak-overload: Cab 3 @ 15:28',
        // 6. The bipolar quad half-H class's drop spans 1 V between light and heavy load, so on the 14.6 V
        //    supply the rails see more than a 12 V motor's rating with one light train and less than NEM 630's
        //    12 V with the heaviest; the express alone brings the board to its package rating at the greatest drop.
        'warning track-voltage-high: Cab 1 / Tank engine No. 41 @ 06:20',
        'warning track-voltage-low: Cab 1 @ 06:20',
        'warning track-voltage-high: Cab 2 / Express engine No. 88 @ 06:32',
        'warning track-voltage-low: Cab 2 @ 06:32',
        'warning driver-heat: Main line board @ 06:32',
        'warning driver-heat: Main line board @ 08:08',
        'warning driver-heat: Main line board @ 09:54',
        // The MOSFET class's small drop leaves a 12.6 V supply above a 12 V motor's rating at full throttle.
        'warning track-voltage-high: Cab 3 / Open-frame freight diesel No. 205 @ 06:56',
        'warning track-voltage-high: Cab 3 / Railcar No. 12 @ 06:57',
        'warning track-voltage-high: Cab 3 / Tank engine No. 41 @ 14:56',
        'warning track-voltage-high: Cab 4 / Railcar No. 12 @ 08:40',
      ].sort(),
    );
  });

  it('the garden line has a balloon loop wired as a reversing section: no reversing-loop finding, and one without the section', () => {
    seeded();
    const garden = getDb().select().from(t.layouts).all().find((l) => l.setting === 'outdoor')!;
    const plan = layoutToPlan(loadLayoutRows(garden.id), { clock: { ratio: 1, fastStart: '00:00' }, rules: { headwayS: 0, surgeS: 0, derate: 1 } });
    const loop = plan.blocks.find((b) => b.name === 'Orchard balloon')!;
    expect(loop.reversingSection).toBe(true);
    // Longer than the longest garden train, so a train can be wholly inside while it flips.
    expect(loop.lengthMm).toBeGreaterThan(Math.max(...plan.trains.map((tr) => tr.lengthMm)));
    expect(plan.links.filter((l) => l.b === loop.id).map((l) => l.bEnd).sort()).toEqual(['a', 'b']);
    expect(checkPlan(plan).findings.filter((f) => f.kind === 'reversing-loop' || f.kind === 'joint-wiring')).toEqual([]);
    const unswitched = { ...plan, blocks: plan.blocks.map((b) => (b.id === loop.id ? { ...b, reversingSection: false } : b)) };
    expect(checkPlan(unswitched).findings.filter((f) => f.kind === 'reversing-loop')).toHaveLength(1);
  });

  it('demo sessions always start on a Saturday at least two days ahead', () => {
    for (const day of ['2026-12-01', '2026-12-04', '2026-12-05', '2026-12-06', '2027-02-28']) {
      const from = new Date(`${day}T20:00:00Z`);
      const start = demoSessionStart(from);
      expect(start.getUTCDay()).toBe(6);
      expect(start.getTime() - from.getTime()).toBeGreaterThan(2 * 86_400_000 - 2 * 3600_000);
    }
  });
});
