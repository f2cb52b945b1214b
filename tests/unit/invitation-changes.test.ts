import { describe, expect, it, vi } from 'vitest';
import type { RunAssignment } from '@/lib/invitations/assignments';
import { sampleRun } from '../shared/run-assignment';
import { changesBetween, summariseChanges, toldOf, type Change, type Told } from '@/lib/invitations/changes';

/**
 * The module imported afresh inside a test: its schema and its run wording are module-level values,
 * and a mutation test switches its change on only after the test file's own imports have run.
 */
async function freshChanges() {
  vi.resetModules();
  return import('@/lib/invitations/changes');
}

// What an invitee was told, and what changed for them since (lib/invitations/changes.ts). No
// published source defines this comparison: the checks follow common practice for calendar updates
// (RFC 5546 2.1.4 leaves what counts as a significant change to the organizer), and the wording is
// the one the update e-mail and the host's tracker use.

// Europe/Berlin is UTC+1 in December (CET, IANA tz database, europe file): 17:00Z is 18:00 there.
const session = {
  title: 'Winter running',
  place: 'Club room',
  startsAt: new Date('2026-12-12T17:00:00Z'),
  endsAt: new Date('2026-12-12T20:00:00Z'),
  timeZone: 'Europe/Berlin',
};

const assignment = (over: Partial<RunAssignment> = {}): RunAssignment => ({ ...sampleRun, ...over });

type RunTold = Told['runs'][number];
const runTold = (over: Partial<RunTold> = {}): RunTold => ({
  runId: 'r1',
  trainName: 'Goods',
  cabName: 'Cab 1',
  departS: 600,
  arriveS: 720,
  fastDepart: '06:40',
  fastArrive: '06:48',
  realDepart: '18:10',
  realArrive: '18:12',
  route: ['Yard', 'Main', 'Halt'],
  ...over,
});
const told = (runs: RunTold[], over: Partial<Told['session']> = {}): Told => ({
  v: 1,
  session: { title: 'Winter running', place: 'Club room', startsAt: Date.parse('2026-12-12T17:00:00Z'), endsAt: Date.parse('2026-12-12T20:00:00Z'), timeZone: 'Europe/Berlin', ...over },
  runs,
});

// CLDR 42 and later write "Sat, 12 Dec 2026" in en-GB, earlier ICU data "Sat 12 Dec 2026"; either is right.
const norm = (text: string) => text.replace(/\b(Mon|Tue|Wed|Thu|Fri|Sat|Sun), /g, '$1 ');

describe('what an invitation told a person (the stored snapshot)', () => {
  it('keeps the session’s when and where and each run as the e-mail listed it, nothing more', () => {
    expect(toldOf(session, [assignment()])).toEqual(told([runTold()]));
    expect(toldOf(session, [])).toEqual(told([]));
  });

  it('reads back what it stored, and takes a missing, unreadable or oversized snapshot as none', async () => {
    const { parseTold } = await freshChanges();
    const snapshot = toldOf(session, [assignment(), assignment({ runId: 'r2', route: [] })]);
    expect(parseTold(JSON.stringify(snapshot))).toEqual(snapshot);
    expect(parseTold(JSON.stringify(told([])))).toEqual(told([]));
    expect(parseTold(null)).toBeNull();
    expect(parseTold('')).toBeNull();
    expect(parseTold('{"v":1,')).toBeNull(); // not JSON
    expect(parseTold(JSON.stringify({ ...snapshot, v: 2 }))).toBeNull(); // a format this code does not know
    // The bounds of toldSchema (a snapshot is read back from the database: a bounded read, common practice).
    expect(parseTold(JSON.stringify(told([runTold({ runId: 'r'.repeat(101) })])))).toBeNull();
    expect(parseTold(JSON.stringify(told([runTold({ runId: 'r'.repeat(100) })])))).not.toBeNull();
    expect(parseTold(JSON.stringify(told([runTold({ fastDepart: '0'.repeat(21) })])))).toBeNull();
    expect(parseTold(JSON.stringify(told([], { title: 't'.repeat(1001) })))).toBeNull();
  });
});

describe('what changed for a person', () => {
  it('nothing changed: no change, and half a second either way is still the same time', () => {
    expect(changesBetween(told([runTold()]), told([runTold()]))).toEqual([]);
    expect(changesBetween(told([runTold()]), told([runTold({ departS: 600.4, arriveS: 719.6 })]))).toEqual([]);
  });

  it('the session’s start, end or zone alone is a change of its time, said as the spans before and after', () => {
    const later = told([], { startsAt: Date.parse('2026-12-12T18:00:00Z') });
    const [change] = changesBetween(told([]), later);
    expect(change!.kind).toBe('session-time');
    const c = change as Extract<Change, { kind: 'session-time' }>;
    // 17:00Z and 18:00Z are 18:00 and 19:00 CET (UTC+1).
    expect(norm(c.before)).toBe('Sat 12 Dec 2026, 18:00 to 21:00 (Europe/Berlin)');
    expect(norm(c.after)).toBe('Sat 12 Dec 2026, 19:00 to 21:00 (Europe/Berlin)');
    expect(changesBetween(told([]), told([], { endsAt: Date.parse('2026-12-12T21:00:00Z') })).map((x) => x.kind)).toEqual(['session-time']);
    // The same instants in Europe/London (GMT, UTC+0 in December) read an hour earlier.
    const zone = changesBetween(told([]), told([], { timeZone: 'Europe/London' }));
    expect(zone.map((x) => x.kind)).toEqual(['session-time']);
    expect(norm((zone[0] as Extract<Change, { kind: 'session-time' }>).after)).toBe('Sat 12 Dec 2026, 17:00 to 20:00 (Europe/London)');
  });

  it('the place and the title, each with its before and after', () => {
    expect(changesBetween(told([]), told([], { place: 'Back room' }))).toEqual([{ kind: 'session-place', before: 'Club room', after: 'Back room' }]);
    expect(changesBetween(told([]), told([], { title: 'Summer running' }))).toEqual([{ kind: 'session-title', before: 'Winter running', after: 'Summer running' }]);
  });

  it('a run moved: its real departure or arrival by half a second or more, or its fast times', () => {
    const moved = (over: Partial<RunTold>) => changesBetween(told([runTold()]), told([runTold(over)]));
    const expectMoved = (over: Partial<RunTold>) =>
      expect(moved(over)).toEqual([{ kind: 'run-changed', before: runTold(), after: runTold(over), moved: true, cab: false, train: false, route: false }]);
    expectMoved({ departS: 600.5 });
    expectMoved({ departS: 599.5 });
    expectMoved({ arriveS: 720.5 });
    expectMoved({ fastDepart: '06:41' });
    expectMoved({ fastArrive: '06:49' });
  });

  it('a run put on another cab or train, or routed another way, is said as that alone', () => {
    const one = (over: Partial<RunTold>) => changesBetween(told([runTold()]), told([runTold(over)]))[0];
    expect(one({ cabName: 'Cab 2' })).toMatchObject({ kind: 'run-changed', moved: false, cab: true, train: false, route: false });
    expect(one({ trainName: 'Local' })).toMatchObject({ kind: 'run-changed', moved: false, cab: false, train: true, route: false });
    expect(one({ route: ['Yard', 'Halt'] })).toMatchObject({ kind: 'run-changed', moved: false, cab: false, train: false, route: true });
  });

  it('runs added first in their order, then runs taken away', () => {
    const a = runTold();
    const b = runTold({ runId: 'r2', trainName: 'Local' });
    const c = runTold({ runId: 'r3', trainName: 'Express' });
    expect(changesBetween(told([a, b]), told([c, a]))).toEqual([
      { kind: 'run-added', run: c },
      { kind: 'run-removed', run: b },
    ]);
  });
});

describe('saying what changed', () => {
  it('one sentence per change, as the update e-mail writes it', async () => {
    const { describeChange } = await freshChanges();
    const before = runTold();
    const after = runTold({ fastDepart: '07:00', fastArrive: '07:08', realDepart: '18:15', realArrive: '18:17', trainName: 'Local', cabName: 'Cab 2', route: ['Yard', 'Halt'] });
    expect(describeChange({ kind: 'session-time', before: 'Sat 12 Dec, 18:00 to 21:00', after: 'Sat 12 Dec, 19:00 to 22:00' })).toBe(
      "The session's time changed: now Sat 12 Dec, 19:00 to 22:00; it was Sat 12 Dec, 18:00 to 21:00.",
    );
    expect(describeChange({ kind: 'session-place', before: 'Club room', after: 'Back room' })).toBe('The place changed: now Back room; it was Club room.');
    expect(describeChange({ kind: 'session-place', before: '', after: 'Back room' })).toBe('The place changed: now Back room; it was not given.');
    expect(describeChange({ kind: 'session-place', before: 'Club room', after: '' })).toBe('The place changed: now not given; it was Club room.');
    expect(describeChange({ kind: 'session-title', before: 'Winter running', after: 'Summer running' })).toBe('The session is now called “Summer running” (was “Winter running”).');
    expect(describeChange({ kind: 'run-added', run: before })).toBe('New run for you: Goods on Cab 1, 06:40–06:48 fast (18:10–18:12 real).');
    expect(describeChange({ kind: 'run-removed', run: before })).toBe('No longer yours: Goods on Cab 1, 06:40–06:48 fast (18:10–18:12 real).');
    expect(describeChange({ kind: 'run-changed', before, after, moved: true, cab: true, train: true, route: true })).toBe(
      'Your run with Goods at 06:40 fast: now 07:00–07:08 fast (18:15–18:17 real), was 06:40–06:48 fast; train now Local (was Goods); ' +
        'cab now Cab 2 (was Cab 1); route now Yard → Halt (was Yard → Main → Halt).',
    );
    // Only the parts that changed.
    expect(describeChange({ kind: 'run-changed', before, after, moved: false, cab: true, train: false, route: false })).toBe('Your run with Goods at 06:40 fast: cab now Cab 2 (was Cab 1).');
    expect(describeChange({ kind: 'run-changed', before, after, moved: false, cab: false, train: false, route: true })).toBe(
      'Your run with Goods at 06:40 fast: route now Yard → Halt (was Yard → Main → Halt).',
    );
  });

  it('a short tag for the tracker: each kind counted, in a fixed order, “run” or “runs” by the count', () => {
    const r = runTold();
    const changed = (flags: Partial<Record<'moved' | 'cab' | 'train' | 'route', boolean>>): Change => ({
      kind: 'run-changed',
      before: r,
      after: r,
      moved: false,
      cab: false,
      train: false,
      route: false,
      ...flags,
    });
    expect(summariseChanges([])).toBe('');
    expect(summariseChanges([{ kind: 'session-time', before: 'a', after: 'b' }])).toBe('session time changed');
    expect(summariseChanges([{ kind: 'session-place', before: 'a', after: 'b' }])).toBe('place changed');
    expect(summariseChanges([{ kind: 'session-title', before: 'a', after: 'b' }])).toBe('title changed');
    expect(summariseChanges([{ kind: 'run-added', run: r }])).toBe('1 run added');
    expect(summariseChanges([{ kind: 'run-removed', run: r }])).toBe('1 run removed');
    expect(summariseChanges([changed({ moved: true })])).toBe('1 run moved');
    expect(summariseChanges([changed({ cab: true })])).toBe('cab changed on 1 run');
    expect(summariseChanges([changed({ train: true })])).toBe('train changed on 1 run');
    expect(summariseChanges([changed({ route: true })])).toBe('route changed on 1 run');
    expect(
      summariseChanges([
        { kind: 'run-removed', run: r },
        { kind: 'run-added', run: r },
        changed({ moved: true, cab: true }),
        changed({ moved: true, train: true, route: true }),
        { kind: 'run-added', run: r },
        { kind: 'session-title', before: 'a', after: 'b' },
        { kind: 'session-place', before: 'a', after: 'b' },
        { kind: 'session-time', before: 'a', after: 'b' },
        { kind: 'run-removed', run: r },
        changed({ route: true }),
      ]),
    ).toBe(
      'session time changed, place changed, title changed, 2 runs moved, cab changed on 1 run, train changed on 1 run, route changed on 2 runs, 2 runs added, 2 runs removed',
    );
  });
});
