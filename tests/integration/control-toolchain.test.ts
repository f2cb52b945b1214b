import { execFileSync, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { getDb } from '@/db';
import * as t from '@/db/schema';
import { BOARDS, boardProgram, compileSchedule, generateAvrFirmware, generatePythonController, estimateFirmwareSize, type BoardProgram, type WiringSheet } from '@/lib/control';
import { hasDemoData, seedDemoRailway } from '@/lib/demo/demo-railway';
import { sessionControl, type SessionControl } from '@/lib/sessions/control';
import { plan as workedPlan, wiring as workedWiring } from '../unit/control/worked-example-plan';
import { toolchainStatus } from './control/toolchain';

/*
 * The generated programs against the real toolchains (Debian's gcc-avr 5.4, avr-libc, simavr and
 * libsimavr, python3-gpiozero): compile for both AVR boards, size against the datasheet's flash and
 * RAM, run the demo session in simavr with the clock compressed, and replay the schedule independently
 * to compare every pin change.
 */
const SCALE = 1000; // FP_TIME_SCALE: the firmware's clock runs 1000 times fast in the simulator
const HZ = 16_000_000;
// Tolerance, schedule milliseconds: the compressed clock advances in ticks of 2048 cycles
// (2048 / 16 MHz × 1000 = 128 ms of schedule time), so a change may land up to two ticks late, plus the loop.
const TOLERANCE_MS = 2 * 128 + 10;
// The Python program is stepped every 10 ms of its clock: a change lands up to one step late.
const PY_STEP_MS = 10;

const tools = toolchainStatus();
const skip = tools.missing.length > 0;
if (skip) console.warn(`SKIP control toolchain tests: ${tools.missing.join(', ')} could not be installed`);

let dir: string;
let control: SessionControl;
let sessionTitle: string;

beforeAll(() => {
  if (skip) return;
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'fishplate-avr-'));
  const db = getDb();
  if (!hasDemoData(db)) seedDemoRailway(db, { now: new Date('2026-12-01T12:00:00Z'), passwordHash: '$2a$04$demo.hash.for.tests.only.............' });
  const session = db.select().from(t.sessions).all().find((s) => s.title === 'December running evening')!;
  sessionTitle = session.title;
  control = sessionControl(session);
  execFileSync('gcc', ['-O2', '-o', path.join(dir, 'sim-harness'), path.join(__dirname, 'control', 'sim-harness.c'), '-lsimavr']);
}, 60_000);

afterAll(() => {
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
});

function build(program: BoardProgram, flags: string): string {
  const folder = fs.mkdtempSync(path.join(dir, `${program.board.id}-`));
  for (const file of generateAvrFirmware(program, { title: sessionTitle, generatedAt: 'test' })) fs.writeFileSync(path.join(folder, file.name), file.text);
  execFileSync('make', ['-s', 'firmware.elf', `EXTRA_CFLAGS=${flags}`], { cwd: folder, stdio: 'pipe' });
  return path.join(folder, 'firmware.elf');
}

/** avr-size -A: flash is .text + .data, RAM is .data + .bss (avr-libc's own accounting). */
function sizeOf(elf: string): { flash: number; ram: number } {
  const out = execFileSync('avr-size', ['-A', elf]).toString();
  const section = (name: string) => Number(new RegExp(`^\\${name}\\s+(\\d+)`, 'm').exec(out)?.[1] ?? 0);
  return { flash: section('.text') + section('.data'), ram: section('.data') + section('.bss') };
}

const harnessPin = (name: string) => `${name[1]}:${name.slice(2)}`;

interface Trace {
  startCycle: number;
  stopCycle: number | null;
  /** schedule ms, harness pin name or OCR address, value */
  events: { ms: number; what: string; value: number }[];
  uart: string[];
  endState: number;
}

function simulate(program: BoardProgram, elf: string, estopAtMs: number | null, scale = SCALE): Trace {
  const startCycle = 1_000_000;
  const toCycle = (ms: number) => Math.round(startCycle + (ms / scale) * (HZ / 1000));
  const pins = [...program.cabs.flatMap((c) => [c.forward, c.reverse]), ...program.blocks.flatMap((b) => [...b.feeds.map((f) => f.pin), ...(b.polarity ? [b.polarity] : [])])];
  const ocrs = program.cabs.map((c) => `0x${c.pwm.pwm!.ocrAddress.toString(16)}`);
  const args = [
    elf,
    BOARDS[program.kind].mcu!,
    String(HZ),
    program.start ? program.start.name[1]! : '-',
    program.start ? program.start.name.slice(2) : '0',
    program.emergencyStop.name[1]!,
    program.emergencyStop.name.slice(2),
    String(startCycle),
    String(estopAtMs === null ? 0 : toCycle(estopAtMs)),
    // Room after the last change for the status lines to drain (the firmware then sleeps and simavr exits).
    String(toCycle(Math.min(program.endMs, estopAtMs ?? Infinity) + 200_000)),
    'pin',
    ...pins.map((p) => harnessPin(p.name)),
    'ocr',
    ...ocrs,
  ];
  const run = spawnSync(path.join(dir, 'sim-harness'), args, { maxBuffer: 64 * 1024 * 1024 });
  expect(run.status, run.stderr.toString()).toBe(0);
  const trace: Trace = { startCycle, stopCycle: null, events: [], uart: [], endState: -1 };
  for (const line of run.stdout.toString().split('\n')) {
    const m = /^(\d+) (\S+) ?(.*)$/.exec(line);
    if (!m) continue;
    const cycle = Number(m[1]);
    const ms = ((cycle - startCycle) / (HZ / 1000)) * scale;
    const [kind, rest] = [m[2]!, m[3]!];
    if (kind === 'uart') trace.uart.push(rest);
    else if (kind === 'press' && rest === 'stop') trace.stopCycle = cycle;
    else if (kind === 'end') trace.endState = Number(rest);
    else if (kind === 'pin' || kind === 'ocr') {
      const [what, value] = rest.split(' ');
      if (cycle >= startCycle) trace.events.push({ ms, what: what!, value: Number(value) });
    }
  }
  return trace;
}

/** The expected level of every pin over time, replayed from the board's entries (not from the firmware). */
function expectedPinChanges(program: BoardProgram, pinKey: (name: string) => string) {
  const changes: { ms: number; what: string; value: number }[] = [];
  const level = new Map<string, number>();
  const set = (ms: number, name: string, value: number) => {
    const key = pinKey(name);
    if ((level.get(key) ?? 0) !== value) changes.push({ ms, what: key, value });
    level.set(key, value);
  };
  for (const e of program.entries) {
    if (e.kind === 'direction') {
      const cab = program.cabs[e.cab]!;
      set(e.atMs, cab.forward.name, e.direction === 1 ? 1 : 0);
      set(e.atMs, cab.reverse.name, e.direction === 2 ? 1 : 0);
    } else if (e.kind === 'feed') {
      program.blocks[e.block]!.feeds.forEach((f, i) => set(e.atMs, f.pin.name, e.relay === i ? 1 : 0));
    } else if (e.kind === 'polarity') {
      const pol = program.blocks[e.block]!.polarity;
      if (pol) set(e.atMs, pol.name, e.swapped ? 1 : 0);
    }
  }
  return changes;
}

/** PWM value of each cab at a time, from the speed entries. */
function expectedPwm(program: BoardProgram, cab: number, ms: number): number {
  let value = 0;
  for (const e of program.entries) {
    if (e.atMs > ms) break;
    if (e.kind !== 'speed' || e.cab !== cab) continue;
    value = e.rampMs === 0 || ms >= e.atMs + e.rampMs ? e.to : e.from + ((e.to - e.from) * (ms - e.atMs)) / e.rampMs;
  }
  return value;
}

/** Every pin change in the trace matches one scheduled change within the tolerance, one for one. */
function comparePins(trace: Trace['events'], expected: { ms: number; what: string; value: number }[], tolerance: number) {
  const seen = trace.filter((e) => !e.what.startsWith('0x'));
  const pending = [...expected];
  const level = new Map<string, number>();
  for (const e of seen) {
    if ((level.get(e.what) ?? 0) === e.value) continue; // a write of the same level
    level.set(e.what, e.value);
    const i = pending.findIndex((x) => x.what === e.what && x.value === e.value);
    expect(i, `unexpected ${e.what} → ${e.value} at ${e.ms} ms`).toBeGreaterThanOrEqual(0);
    expect(Math.abs(pending[i]!.ms - e.ms), `${e.what} → ${e.value}: scheduled ${pending[i]!.ms} ms, seen ${e.ms} ms`).toBeLessThanOrEqual(tolerance);
    pending.splice(i, 1);
  }
  expect(pending).toEqual([]);
}

/** Interlocks on the pins: never both direction inputs high; direction changes only after the PWM held 0 for the dead time; one relay per block. */
function checkInterlocksOnPins(program: BoardProgram, events: Trace['events'], pinKey: (name: string) => string, ocrKey: (cab: number) => string, tolerance: number) {
  const level = new Map<string, number>();
  const zeroSince = new Map<number, number>(program.cabs.map((_, i) => [i, -Infinity]));
  for (const e of events) {
    level.set(e.what, e.value);
    program.cabs.forEach((cab, i) => {
      if (e.what === ocrKey(i)) {
        if (e.value > 0) zeroSince.set(i, Infinity);
        else if (zeroSince.get(i) === Infinity) zeroSince.set(i, e.ms);
      }
      const fwd = level.get(pinKey(cab.forward.name)) ?? 0;
      const rev = level.get(pinKey(cab.reverse.name)) ?? 0;
      // DOMAIN.md (H-bridge): both inputs of a discrete bridge high shorts the supply.
      expect(fwd && rev, `shoot-through on ${cab.name} at ${e.ms} ms`).toBeFalsy();
      if (e.what === pinKey(cab.forward.name) || e.what === pinKey(cab.reverse.name)) {
        expect(e.ms - zeroSince.get(i)!, `${cab.name} changes direction without dead time at ${e.ms} ms`).toBeGreaterThanOrEqual(program.deadTimeMs - tolerance);
      }
    });
    for (const block of program.blocks) {
      const on = block.feeds.filter((f) => level.get(pinKey(f.pin.name)) === 1).length;
      expect(on, `${block.name} fed by two cabs at ${e.ms} ms`).toBeLessThanOrEqual(1);
    }
  }
}

/**
 * The worked example (tests/unit/control/worked-example-plan.ts) with b2 a reversing section and b3 wired
 * the other way, so the cab reverses inside b2 and its polarity relay swaps (NEM 631 2.3), on one board.
 */
function workedWiringOn(kind: 'atmega328p' | 'atmega2560' | 'header40'): WiringSheet {
  const pins = {
    atmega328p: { stop: 'PD2', start: 'PD4', cab: ['PD7', 'PB0', 'PD6'], feeds: ['PC0', 'PC1', 'PC3'], polarity: 'PC2' },
    atmega2560: { stop: 'PA0', start: 'PA1', cab: ['PA2', 'PA3', 'PL3'], feeds: ['PC0', 'PC1', 'PC3'], polarity: 'PC2' },
    header40: { stop: 'GPIO4', start: null, cab: ['GPIO17', 'GPIO27', 'GPIO18'], feeds: ['GPIO5', 'GPIO6', 'GPIO13'], polarity: 'GPIO19' },
  }[kind];
  return {
    ...workedWiring,
    boards: [{ id: 'u', kind, name: 'Loop board', emergencyStopPin: pins.stop, startPin: pins.start }],
    cabs: [{ cabId: 'c1', boardId: 'u', forwardPin: pins.cab[0]!, reversePin: pins.cab[1]!, pwmPin: pins.cab[2]!, bothHighBrakes: false }],
    blocks: workedWiring.blocks.map((b, i) => ({ ...b, feeds: [{ cabId: 'c1', pin: pins.feeds[i]! }], polarityPin: b.blockId === 'b2' ? pins.polarity : null })),
  };
}
function reversingSchedule(wiring: WiringSheet) {
  const loop = workedPlan();
  loop.blocks = loop.blocks.map((b) => (b.id === 'b3' ? { ...b, positiveRail: 'right' } : b.id === 'b2' ? { ...b, reversingSection: true } : b));
  loop.runs = [loop.runs[0]!];
  const schedule = compileSchedule({ plan: loop, wiring, runSpeedKmh: { out: null }, locomotiveTopSpeedKmh: { l: 120 } });
  expect(schedule.findings.map((f) => f.kind)).toEqual(['control-reversing-stop']);
  return schedule;
}

describe.skipIf(skip)('generated AVR firmware in avr-gcc and simavr', () => {
  for (const [boardId, kind] of [['cab-board', 'atmega328p'], ['line-board', 'atmega2560']] as const) {
    it(`${BOARDS[kind].title}: compiles, fits flash and RAM (datasheet), and the estimate is not below avr-size`, () => {
      const program = boardProgram(control.schedule, control.wiring, boardId);
      const size = sizeOf(build(program, ''));
      const spec = BOARDS[kind];
      // ATmega328P: 32 KB flash less 0.5 KB boot loader, 2 KB SRAM; ATmega2560: 256 KB less 8 KB, 8 KB SRAM (datasheets).
      expect(size.flash).toBeLessThanOrEqual(spec.flashBytes!);
      expect(size.ram).toBeLessThanOrEqual(spec.ramBytes! - 256); // leave room for the stack
      const estimate = estimateFirmwareSize(program);
      expect(estimate.fits).toBe(true);
      expect(estimate.flashBytes).toBeGreaterThanOrEqual(size.flash);
      expect(estimate.flashBytes).toBeLessThanOrEqual(size.flash * 1.4);
      expect(estimate.ramBytes).toBeGreaterThanOrEqual(size.ram);
    }, 60_000);
  }

  it('ATmega328P board (the cabs): every direction and PWM change in simavr at its scheduled time, interlocks held', () => {
    const program = boardProgram(control.schedule, control.wiring, 'cab-board');
    const trace = simulate(program, build(program, `-DFP_TIME_SCALE=${SCALE} -DFP_SIM`), null);
    expect(trace.uart[0]).toBe('ready: press start or send start');
    expect(trace.uart).toContain('end of session');
    expect(trace.uart.some((l) => l.startsWith('HALT'))).toBe(false);
    const key = (name: string) => harnessPin(name);
    const ocr = (cab: number) => `0x${program.cabs[cab]!.pwm.pwm!.ocrAddress.toString(16)}`;
    comparePins(trace.events, expectedPinChanges(program, key), TOLERANCE_MS);
    // PWM: every compare-register write lies on the scheduled ramp within the time tolerance (±1 count rounding).
    for (const e of trace.events.filter((x) => x.what.startsWith('0x'))) {
      const cab = program.cabs.findIndex((_, i) => ocr(i) === e.what);
      const a = expectedPwm(program, cab, e.ms - TOLERANCE_MS);
      const b = expectedPwm(program, cab, e.ms);
      expect(e.value).toBeGreaterThanOrEqual(Math.min(a, b) - 1);
      expect(e.value).toBeLessThanOrEqual(Math.max(a, b) + 1);
    }
    // Every ramp reaches its end value.
    for (const s of program.entries) {
      if (s.kind !== 'speed') continue;
      const endMs = s.atMs + s.rampMs;
      const writes = trace.events.filter((x) => x.what === ocr(s.cab) && x.ms <= endMs + TOLERANCE_MS);
      expect(writes.at(-1)?.value ?? 0).toBe(s.to);
    }
    checkInterlocksOnPins(program, trace.events, key, ocr, TOLERANCE_MS);
  }, 150_000);

  it('ATmega2560 board (the main line relays): every relay change at its scheduled time, one cab per block', () => {
    const program = boardProgram(control.schedule, control.wiring, 'line-board');
    const trace = simulate(program, build(program, `-DFP_TIME_SCALE=${SCALE} -DFP_SIM`), null);
    expect(trace.uart).toContain('end of session');
    const key = (name: string) => harnessPin(name);
    comparePins(trace.events, expectedPinChanges(program, key), TOLERANCE_MS);
    checkInterlocksOnPins(program, trace.events, key, () => 'none', TOLERANCE_MS);
  }, 150_000);

  it('the emergency stop sets every PWM to 0, every direction input and relay low, and nothing moves after', () => {
    const program = boardProgram(control.schedule, control.wiring, 'cab-board');
    // Stop while the first train is at speed: halfway between its first ramp's end and its braking.
    const speeds = program.entries.filter((e) => e.kind === 'speed');
    const stopAt = (speeds[0]!.atMs + speeds[0]!.rampMs + speeds[1]!.atMs) / 2;
    const trace = simulate(program, build(program, `-DFP_TIME_SCALE=${SCALE} -DFP_SIM`), stopAt);
    expect(trace.stopCycle).not.toBeNull();
    expect(trace.uart).toContain('emergency stop: every PWM 0, every relay open');
    expect(expectedPwm(program, 0, stopAt)).toBeGreaterThan(0);
    const stopMs = ((trace.stopCycle! - 1_000_000) / (HZ / 1000)) * SCALE;
    const after = trace.events.filter((e) => e.ms >= stopMs);
    // Within one tick of the compressed clock everything is off, and it stays off.
    for (const e of after) {
      expect(e.value, `${e.what} at ${e.ms} ms after the stop`).toBe(0);
      expect(e.ms - stopMs).toBeLessThanOrEqual(TOLERANCE_MS);
    }
    const level = new Map<string, number>();
    for (const e of trace.events) level.set(e.what, e.value);
    for (const v of level.values()) expect(v).toBe(0);
  }, 150_000);

  it('a reversing section (the worked example): the polarity relay and the cab\'s reversal at their scheduled times, after the dead time', () => {
    const program = boardProgram(reversingSchedule(workedWiringOn('atmega328p')), workedWiringOn('atmega328p'), 'u');
    expect(program.entries.filter((e) => e.kind === 'polarity').map((e) => (e.kind === 'polarity' ? e.swapped : null))).toEqual([false, true]);
    // 100 times fast, not 1000: the status lines go out at 57 600 baud in real time, and at 1000 times
    // the schedule's three settings at 22.427 s would find the serial buffer still full.
    const scale = 100;
    const tolerance = 2 * 12.8 + 10; // two timer-0 ticks (2048 cycles = 12.8 ms of schedule at 100 times) and the loop
    const trace = simulate(program, build(program, `-DFP_TIME_SCALE=${scale} -DFP_SIM`), null, scale);
    expect(trace.uart.some((l) => l.startsWith('HALT'))).toBe(false);
    // Status lines at fast-clock time (07:00 + session seconds; origin −1 s): the section swapped at 22.427 s.
    expect(trace.uart).toEqual(expect.arrayContaining(['07:00:17 block B2 polarity normal', '07:00:22 block B2 polarity swapped', '07:00:22 cab Cab 1 forward', 'end of session']));
    const key = (name: string) => harnessPin(name);
    const ocr = () => `0x${program.cabs[0]!.pwm.pwm!.ocrAddress.toString(16)}`;
    comparePins(trace.events, expectedPinChanges(program, key), tolerance);
    // Normal is the relay at rest; it closes for the swap and stays so (the block is released, no current flows).
    expect(trace.events.filter((e) => e.what === key('PC2')).map((e) => e.value)).toEqual([1]);
    checkInterlocksOnPins(program, trace.events, key, ocr, tolerance);
  }, 150_000);

  it('the Makefile\'s upload line names a part and a programmer avrdude knows, the part being the board\'s chip', () => {
    for (const kind of ['atmega328p', 'atmega2560'] as const) {
      const program = boardProgram(reversingSchedule(workedWiringOn(kind)), workedWiringOn(kind), 'u');
      const folder = fs.mkdtempSync(path.join(dir, `upload-${kind}-`));
      for (const file of generateAvrFirmware(program, { title: 'upload', generatedAt: 'test' })) fs.writeFileSync(path.join(folder, file.name), file.text);
      // make -n prints the commands without running them (firmware.hex is made up so only the upload is listed).
      fs.writeFileSync(path.join(folder, 'firmware.hex'), '');
      const upload = execFileSync('make', ['-n', '-o', 'firmware.hex', 'upload'], { cwd: folder }).toString().trim();
      const part = /-p (\S+)/.exec(upload)![1]!;
      const programmer = /-c (\S+)/.exec(upload)![1]!;
      // avrdude lists its parts for "-p ?" and its programmers for "-c ?" (on stderr).
      const parts = spawnSync('avrdude', ['-c', programmer, '-p', '?']).stderr.toString();
      expect(parts).toMatch(new RegExp(`^\\s+${part}\\s+= ${kind === 'atmega328p' ? 'ATmega328P' : 'ATmega2560'}\\b`, 'm'));
      const programmers = spawnSync('avrdude', ['-c', '?']).stderr.toString();
      expect(programmers).toMatch(new RegExp(`^\\s+${programmer}\\s+=`, 'm'));
    }
  }, 60_000);
});

describe.skipIf(skip)('generated Python program under gpiozero mock pins', () => {
  const runPython = (program: BoardProgram, estopAtMs: number) => {
    const file = path.join(dir, `${program.board.id}-${estopAtMs}.py`);
    fs.writeFileSync(file, generatePythonController(program, { title: sessionTitle, generatedAt: 'test' }));
    // gpiozero imports from Debian's /usr/bin/python3, not from other Pythons on the PATH.
    const run = spawnSync('/usr/bin/python3', [path.join(__dirname, 'control', 'run_controller.py'), file, String(PY_STEP_MS), String(program.endMs + 1000), String(estopAtMs)], {
      maxBuffer: 64 * 1024 * 1024,
    });
    expect(run.status, run.stderr.toString()).toBe(0);
    const events: Trace['events'] = [];
    const said: string[] = [];
    for (const line of run.stdout.toString().split('\n')) {
      const m = /^(\d+) (gpio|say) (.*)$/.exec(line);
      if (!m) continue;
      if (m[2] === 'say') said.push(m[3]!);
      else {
        const [n, v] = m[3]!.split(' ');
        events.push({ ms: Number(m[1]), what: `GPIO${n}`, value: Number(v) });
      }
    }
    return { events, said };
  };

  // The demo's Linux board switches the yard and terminus relays; the second run moves Cab 1 onto it too,
  // so the program drives direction and PWM as well.
  const withCabOnLinux = (): WiringSheet => ({
    ...control.wiring,
    cabs: control.wiring.cabs.map((c, i) => (i === 0 ? { ...c, boardId: 'yard-board', forwardPin: 'GPIO23', reversePin: 'GPIO24', pwmPin: 'GPIO25' } : c)),
  });

  it('the yard board switches every relay at its scheduled time; Cab 1 moved onto it drives direction and PWM as scheduled', () => {
    for (const wiring of [control.wiring, withCabOnLinux()]) {
      const program = boardProgram(control.schedule, wiring, 'yard-board');
      const { events, said } = runPython(program, -1);
      expect(said.some((l) => l.startsWith('HALT'))).toBe(false);
      const key = (name: string) => name;
      const initial = new Map<string, number>();
      const changes = events.filter((e) => {
        const first = !initial.has(e.what);
        initial.set(e.what, e.value);
        return !(first && e.ms === 0 && e.value === 0);
      });
      const pinsOnly = changes.filter((e) => !program.cabs.some((c) => c.pwm.name === e.what));
      comparePins(pinsOnly, expectedPinChanges(program, key), PY_STEP_MS);
      program.cabs.forEach((cab, i) => {
        for (const e of changes.filter((x) => x.what === cab.pwm.name)) {
          const a = expectedPwm(program, i, e.ms - PY_STEP_MS);
          const b = expectedPwm(program, i, e.ms);
          expect(e.value).toBeGreaterThanOrEqual(Math.min(a, b) - 1);
          expect(e.value).toBeLessThanOrEqual(Math.max(a, b) + 1);
        }
      });
      checkInterlocksOnPins(program, changes, key, (i) => program.cabs[i]!.pwm.name, PY_STEP_MS);
      if (program.cabs.length > 0) expect(changes.filter((e) => e.what === program.cabs[0]!.pwm.name).length).toBeGreaterThan(10);
    }
  }, 120_000);

  it('the emergency stop on the Linux board turns every output off', () => {
    const program = boardProgram(control.schedule, withCabOnLinux(), 'yard-board');
    const speeds = program.entries.filter((e) => e.kind === 'speed');
    const stopAt = Math.round((speeds[0]!.atMs + speeds[0]!.rampMs + speeds[1]!.atMs) / 2);
    const { events, said } = runPython(program, stopAt);
    expect(said).toContain('emergency stop: every PWM 0, every relay open');
    const level = new Map<string, number>();
    for (const e of events) level.set(e.what, e.value);
    for (const [pin, v] of level) expect(v, pin).toBe(0);
    expect(events.filter((e) => e.ms > stopAt + PY_STEP_MS && e.value !== 0)).toEqual([]);
  }, 60_000);

  it('a reversing section (the worked example): the polarity relay and the cab\'s reversal at their scheduled times', () => {
    const wiring = workedWiringOn('header40');
    const program = boardProgram(reversingSchedule(wiring), wiring, 'u');
    const { events, said } = runPython(program, -1);
    expect(said.some((l) => l.startsWith('HALT'))).toBe(false);
    // Status lines at fast-clock time (07:00 + session seconds; origin −1 s): the section swapped at 22.427 s.
    expect(said).toEqual(expect.arrayContaining(['07:00:17 block B2 polarity normal', '07:00:22 block B2 polarity swapped', '07:00:22 cab Cab 1 forward']));
    // The runner samples the pins once per step, in GPIO order: within one step, take the falls before the
    // rises, so what is checked is the state each step leaves (reverse to forward at the flip is one step).
    const changes = events.filter((e) => !(e.ms === 0 && e.value === 0)).sort((a, b) => a.ms - b.ms || a.value - b.value);
    const pinsOnly = changes.filter((e) => e.what !== program.cabs[0]!.pwm.name);
    comparePins(pinsOnly, expectedPinChanges(program, (name) => name), PY_STEP_MS);
    expect(pinsOnly.filter((e) => e.what === 'GPIO19').map((e) => e.value)).toEqual([1]);
    checkInterlocksOnPins(program, changes, (name) => name, () => program.cabs[0]!.pwm.name, PY_STEP_MS);
  }, 60_000);
});
