import { plainName, type BoardProgram } from './board-program';

const gpio = (name: string) => Number(name.replace('GPIO', ''));

/**
 * A Python program for one 40-pin-header Linux board of the wiring, on gpiozero: the same behaviour
 * as the AVR firmware (start button or a `start` line on standard input, its own clock, one status
 * line per change, the interlocks, the emergency stop). `Controller.step(now_ms)` applies everything
 * due by then, so a test can drive it with a clock of its own and gpiozero's mock pins.
 */
export function generatePythonController(program: BoardProgram, meta: { title: string; generatedAt: string }): string {
  if (program.kind !== 'header40') throw new RangeError(`${program.title} does not run the Python program`);
  const cabs = program.cabs.map((c) => `    (${JSON.stringify(plainName(c.name))}, ${gpio(c.forward.name)}, ${gpio(c.reverse.name)}, ${gpio(c.pwm.name)}),`);
  const blocks = program.blocks.map(
    (b) => `    (${JSON.stringify(plainName(b.name))}, [${b.feeds.map((f) => gpio(f.pin.name)).join(', ')}], ${b.polarity ? gpio(b.polarity.name) : 'None'}),`,
  );
  const entries = program.entries.map((e) => {
    if (e.kind === 'direction') return `    (${e.atMs}, DIRECTION, ${e.cab}, ${e.direction}, 0, 0),`;
    if (e.kind === 'speed') return `    (${e.atMs}, SPEED, ${e.cab}, ${e.from}, ${e.to}, ${e.rampMs}),`;
    if (e.kind === 'feed') return `    (${e.atMs}, FEED, ${e.block}, ${e.relay ?? -1}, 0, 0),`;
    return `    (${e.atMs}, POLARITY, ${e.block}, ${e.swapped ? 1 : 0}, 0, 0),`;
  });
  const [fastH, fastM] = program.clock.fastStart.split(':').map(Number) as [number, number];
  return `#!/usr/bin/env python3
# Fishplate controller for ${plainName(program.board.name, 60)} (${program.title}), on gpiozero.
# Session: ${plainName(meta.title, 80)}. Generated ${meta.generatedAt}.
#
# Start: press the start button (to ground) or type "start". The program then runs the session on its
# own clock and prints one line per change: fast-clock time and what changed. Opening the emergency
# stop contact (normally closed to ground) sets every PWM output to 0, clears every direction input
# and opens every relay; the program stays stopped until it is restarted.
#
# SAFETY: never switch both transistors of one side of an H-bridge on together: it shorts the supply
# (shoot-through); this program never drives both direction inputs high. Fuse or current-limit every
# supply output. Driver heat sinks can reach burn temperatures. Relays need a driver transistor and a
# flyback diode (or a relay module that has them). Mains-side work is hazardous: use enclosed,
# certified supplies and leave mains wiring to a qualified person. Outdoor layouts: low voltage only
# on the track, weatherproof connections, residual-current protection. These programs are planning
# aids, not a substitute for the manufacturer's ratings, local codes or a licensed electrician.
import sys
import threading
import time

from gpiozero import Button, DigitalOutputDevice, PWMOutputDevice

FAST_START_S = ${fastH * 3600 + fastM * 60}
CLOCK_RATIO = ${program.clock.ratio}
ORIGIN_S = ${Math.round(program.originS)}
DEAD_MS = ${program.deadTimeMs}
BREAK_MS = ${program.breakMs}
ESTOP_GPIO = ${gpio(program.emergencyStop.name)}
START_GPIO = ${program.start ? gpio(program.start.name) : 'None'}
PWM_HZ = 20000

# Cabs: name, forward input, reverse input, PWM output (GPIO numbers).
CABS = [
${cabs.join('\n')}
]
# Blocks: name, relay per cab that may feed it, polarity relay or None.
BLOCKS = [
${blocks.join('\n')}
]
DIRECTION, SPEED, FEED, POLARITY = 0, 1, 2, 3
# (ms from the schedule origin, kind, cab or block, a, b, ramp ms): direction a 0 off, 1 forward,
# 2 reverse; speed a -> b (8-bit) over ramp ms; feed a = relay within the block, -1 none; polarity a 1 swapped.
ENTRIES = [
${entries.join('\n')}
]


class Interlock(Exception):
    pass


class Controller:
    def __init__(self, out=print):
        self.out = out
        self.cabs = [
            {
                "name": name,
                "forward": DigitalOutputDevice(fwd),
                "reverse": DigitalOutputDevice(rev),
                "pwm": PWMOutputDevice(pwm, frequency=PWM_HZ),
                "value": 0, "from": 0, "to": 0, "start": 0, "ramp": 0, "ramping": False, "zero_since": 0,
            }
            for name, fwd, rev, pwm in CABS
        ]
        self.blocks = [
            {
                "name": name,
                "relays": [DigitalOutputDevice(pin) for pin in relays],
                "polarity": DigitalOutputDevice(polarity) if polarity is not None else None,
                "released_at": 0,
            }
            for name, relays, polarity in BLOCKS
        ]
        self.next = 0
        self.stopped = False
        self.halted = None

    def stamp(self, at_ms):
        fast = int(FAST_START_S + (at_ms // 1000 + ORIGIN_S) * CLOCK_RATIO) % 86400
        return "%02d:%02d:%02d" % (fast // 3600, fast // 60 % 60, fast % 60)

    def all_off(self):
        for cab in self.cabs:
            cab["pwm"].value = 0
            cab["forward"].off()
            cab["reverse"].off()
            cab["value"] = 0
            cab["ramping"] = False
        for block in self.blocks:
            for relay in block["relays"]:
                relay.off()
            if block["polarity"] is not None:
                block["polarity"].off()

    def emergency_stop(self):
        if not self.stopped:
            self.all_off()
            self.stopped = True
            self.out("emergency stop: every PWM 0, every relay open")

    def halt(self, why):
        self.all_off()
        self.stopped = True
        self.halted = why
        self.out("HALT interlock: " + why)

    def set_direction(self, c, direction, at):
        cab = self.cabs[c]
        # Dead time: PWM 0 for DEAD_MS before a direction input changes.
        if cab["value"] != 0 or cab["ramping"] or at - cab["zero_since"] < DEAD_MS:
            return self.halt("direction change without dead time, cab " + cab["name"])
        # Both inputs low first: never both high (no shoot-through).
        cab["forward"].off()
        cab["reverse"].off()
        if direction == 1:
            cab["forward"].on()
        elif direction == 2:
            cab["reverse"].on()
        self.out("%s cab %s %s" % (self.stamp(at), cab["name"], ("off", "forward", "reverse")[direction]))

    def set_feed(self, b, relay, at):
        block = self.blocks[b]
        if relay < 0:
            for r in block["relays"]:
                r.off()
            block["released_at"] = at
            self.out("%s block %s released" % (self.stamp(at), block["name"]))
            return
        # Never two cabs on a block; break before make.
        if any(r.value for i, r in enumerate(block["relays"]) if i != relay):
            return self.halt("two cabs on block " + block["name"])
        if at - block["released_at"] < BREAK_MS:
            return self.halt("relay make before break, block " + block["name"])
        block["relays"][relay].on()
        self.out("%s block %s fed by relay %d" % (self.stamp(at), block["name"], relay + 1))

    def set_polarity(self, b, swapped, at):
        block = self.blocks[b]
        if block["polarity"] is None:
            return
        block["polarity"].value = swapped
        self.out("%s block %s polarity %s" % (self.stamp(at), block["name"], "swapped" if swapped else "normal"))

    def start_speed(self, c, a, b, ramp, at):
        cab = self.cabs[c]
        cab.update({"from": a, "to": b, "ramp": ramp, "start": at, "ramping": True})
        self.out("%s cab %s pwm %d to %d over %d ms" % (self.stamp(at), cab["name"], a, b, ramp))

    def update_ramps(self, now):
        for cab in self.cabs:
            if not cab["ramping"]:
                continue
            if cab["ramp"] == 0 or now >= cab["start"] + cab["ramp"]:
                value = cab["to"]
                cab["ramping"] = False
            else:
                value = cab["from"] + (cab["to"] - cab["from"]) * (now - cab["start"]) // cab["ramp"]
            if value != cab["value"]:
                cab["value"] = value
                cab["pwm"].value = value / 255
            if not cab["ramping"] and value == 0:
                cab["zero_since"] = cab["start"] + cab["ramp"]

    def step(self, now):
        """Applies everything due at or before now (ms from the schedule origin); False when finished."""
        if self.stopped:
            return False
        self.update_ramps(now)
        while not self.stopped and self.next < len(ENTRIES) and ENTRIES[self.next][0] <= now:
            at, kind, target, a, b, ramp = ENTRIES[self.next]
            if kind == DIRECTION:
                self.set_direction(target, a, at)
            elif kind == SPEED:
                self.start_speed(target, a, b, ramp, at)
            elif kind == FEED:
                self.set_feed(target, a, at)
            elif kind == POLARITY:
                self.set_polarity(target, a, at)
            self.next += 1
        return not self.stopped and (self.next < len(ENTRIES) or any(c["ramping"] for c in self.cabs))


def main():
    controller = Controller()
    started = threading.Event()
    estop = Button(ESTOP_GPIO, pull_up=True)
    # The stop contact is normally closed (pin held low, "pressed"); opening it stops everything.
    estop.when_released = controller.emergency_stop
    if not estop.is_pressed:
        controller.emergency_stop()
        return
    if START_GPIO is not None:
        start_button = Button(START_GPIO, pull_up=True)
        start_button.when_pressed = started.set

    def read_start():
        for line in sys.stdin:
            if line.strip() == "start":
                started.set()
                return

    threading.Thread(target=read_start, daemon=True).start()
    print("ready: press start or type start", flush=True)
    started.wait()
    print("start", flush=True)
    t0 = time.monotonic()
    while controller.step(int((time.monotonic() - t0) * 1000)):
        time.sleep(0.002)
    if not controller.stopped:
        print("end of session", flush=True)


if __name__ == "__main__":
    main()
`;
}
