import { strFromU8, unzipSync } from 'fflate';
import { describe, expect, it } from 'vitest';
import { getDb } from '@/db';
import * as t from '@/db/schema';
import { GET as getControl } from '@/app/api/sessions/[sessionId]/control/route';
import { GET as getFirmware } from '@/app/api/sessions/[sessionId]/control/firmware.zip/route';
import { GET as getPython } from '@/app/api/sessions/[sessionId]/control/controller.py/route';
import { GET as getControlFindings } from '@/app/api/sessions/[sessionId]/control/findings/route';
import { eq } from 'drizzle-orm';
import { DEMO_USERS, hasDemoData, seedDemoRailway } from '@/lib/demo/demo-railway';
import { SCHEDULE_FORMAT } from '@/lib/control';
import { trainRamps } from '@/lib/sessions/to-plan';
import { signInAs } from './caller';

const ctx = (sessionId: string) => ({ params: Promise.resolve({ sessionId }) });
const url = (path: string) => `http://127.0.0.1:3999${path}`;

function demo() {
  const db = getDb();
  if (!hasDemoData(db)) seedDemoRailway(db, { now: new Date('2026-12-01T12:00:00Z'), passwordHash: '$2a$04$demo.hash.for.tests.only.............' });
  const session = db.select().from(t.sessions).all().find((s) => s.title === 'December running evening')!;
  const planner = db.select().from(t.users).all().find((u) => u.email === DEMO_USERS.find((d) => d.key === 'planner')!.email)!;
  signInAs({ id: planner.id, email: planner.email, name: planner.name });
  return session;
}

describe('control exports of the demo session', () => {
  it('GET control: the schedule as JSON, versioned, with the boards and whether their firmware fits', async () => {
    const session = demo();
    const res = await getControl(new Request(url(`/api/sessions/${session.id}/control`)), ctx(session.id));
    expect(res.status).toBe(200);
    const body = await res.json();
    expect([body.format, body.version]).toEqual([SCHEDULE_FORMAT, 1]);
    expect(body.entries.length).toBeGreaterThan(100);
    // A ramp is one entry with start value, end value and duration: the first run's start, from 0 to its
    // PWM value over its speed ÷ the train's acceleration (its own, or H0's common practice, 15 km/h per s).
    const firstRun = body.runs[0];
    const train = getDb().select().from(t.trains).where(eq(t.trains.id, firstRun.trainId)).get()!;
    const layout = getDb().select().from(t.layouts).where(eq(t.layouts.id, session.layoutId)).get()!;
    const accel = trainRamps(train, layout.scaleRatio).accelKmhPerS;
    expect(body.entries.find((e: { kind: string }) => e.kind === 'speed')).toMatchObject({
      cabId: firstRun.cabId,
      from: 0,
      to: firstRun.pwm,
      rampMs: Math.round((firstRun.speedKmh / accel) * 1000),
    });
    const cabBoard = body.boards.find((b: { id: string }) => b.id === 'cab-board');
    // The demo's firmware fits an ATmega328P board (issue: 32 KB flash less the boot loader, 2 KB RAM).
    expect(cabBoard.size.fits).toBe(true);
    expect(body.findings.filter((f: { kind: string }) => f.kind.startsWith('interlock-'))).toEqual([]);
  });

  it('GET firmware.zip?board=: C sources, header and Makefile for that board; a board that is not AVR or not there is 400', async () => {
    const session = demo();
    const res = await getFirmware(new Request(url(`/api/sessions/${session.id}/control/firmware.zip?board=cab-board`)), ctx(session.id));
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('application/zip');
    const files = unzipSync(new Uint8Array(await res.arrayBuffer()));
    expect(Object.keys(files).sort()).toEqual(['fishplate-cab-board/Makefile', 'fishplate-cab-board/README.txt', 'fishplate-cab-board/main.c', 'fishplate-cab-board/schedule.h']);
    expect(strFromU8(files['fishplate-cab-board/schedule.h']!)).toContain('PROGMEM');
    expect(strFromU8(files['fishplate-cab-board/Makefile']!)).toContain('avrdude -p m328p -c stk500v1');
    for (const board of ['yard-board', 'nowhere']) {
      const bad = await getFirmware(new Request(url(`/api/sessions/${session.id}/control/firmware.zip?board=${board}`)), ctx(session.id));
      expect(bad.status).toBe(400);
    }
    // Two AVR boards and no board named: 400 that names them.
    const unnamed = await getFirmware(new Request(url(`/api/sessions/${session.id}/control/firmware.zip`)), ctx(session.id));
    expect(unnamed.status).toBe(400);
    expect((await unnamed.json()).error).toMatch(/cab-board, line-board/);
  });

  it('GET controller.py: the gpiozero program for the only Linux board', async () => {
    const session = demo();
    const res = await getPython(new Request(url(`/api/sessions/${session.id}/control/controller.py`)), ctx(session.id));
    expect(res.status).toBe(200);
    const text = await res.text();
    expect(text).toContain('from gpiozero import');
    expect(text).toContain('Yard and terminus board');
  });

  it('GET control/findings: the schedule’s findings for the timetable’s panel, the same as the full schedule’s; a layout with no wiring sheet says so', async () => {
    const session = demo();
    const full = await (await getControl(new Request(url(`/api/sessions/${session.id}/control`)), ctx(session.id))).json();
    const res = await getControlFindings(new Request(url(`/api/sessions/${session.id}/control/findings`)), ctx(session.id));
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.wired).toBe(true);
    expect(body.findings).toEqual(full.findings);
    expect(body.errors + body.warnings).toBe(full.findings.length);
    // The demo's schedule leaves out exactly the runs of its deliberate clashes, each named with its time:
    // the shuttle on cab 3 while the goods drives it, the goods into a block the express's cab still feeds,
    // and the stone train across yard road 3's wrong-way rail gap. The other 17 of its 20 runs are scheduled.
    const leftOut = body.findings.filter((f: { kind: string }) => f.kind === 'control-left-out').map((f: { message: string }) => f.message.replace(/ is left out.*/, ''));
    expect(leftOut.sort()).toEqual(['Double-headed stone train (12:40 departure)', 'Pick-up goods (08:08 departure)', 'Railcar shuttle (06:57 departure)']);
    expect(full.runs).toHaveLength(20 - 3);

    getDb().delete(t.wiringSheets).where(eq(t.wiringSheets.layoutId, session.layoutId)).run();
    const unwired = await (await getControlFindings(new Request(url(`/api/sessions/${session.id}/control/findings`)), ctx(session.id))).json();
    expect(unwired).toEqual({ wired: false, message: expect.stringContaining('no wiring sheet') });
  });
});
