"""Runs a generated Fishplate controller under gpiozero's mock pins on a clock of its own.

Usage: /usr/bin/python3 run_controller.py PROGRAM.py STEP_MS END_MS ESTOP_AT_MS
Prints "<ms> gpio <n> <value>" for each change of an output pin (PWM as 0..255), the program's status
lines as "<ms> say <line>", and "<ms> end <stopped>". ESTOP_AT_MS < 0: never.
"""
import importlib.util
import sys

from gpiozero import Button, Device
from gpiozero.pins.mock import MockFactory, MockPWMPin

Device.pin_factory = MockFactory(pin_class=MockPWMPin)

path, step_ms, end_ms, estop_at = sys.argv[1], int(sys.argv[2]), int(sys.argv[3]), int(sys.argv[4])
spec = importlib.util.spec_from_file_location("controller", path)
program = importlib.util.module_from_spec(spec)
spec.loader.exec_module(program)

now = [0]
controller = program.Controller(out=lambda line: print("%d say %s" % (now[0], line)))
estop = Button(program.ESTOP_GPIO, pull_up=True)
stop_pin = Device.pin_factory.pin(program.ESTOP_GPIO)
stop_pin.drive_low()  # the normally closed stop contact holds the pin low
estop.when_released = controller.emergency_stop

outputs = sorted({n for _, f, r, p in program.CABS for n in (f, r, p)}
                 | {n for _, relays, pol in program.BLOCKS for n in relays + ([pol] if pol is not None else [])})
pwm_pins = {p for _, _, _, p in program.CABS}
last = {}


def sample():
    for n in outputs:
        state = Device.pin_factory.pin(n).state
        value = int(round(float(state) * 255)) if n in pwm_pins else int(bool(state))
        if last.get(n) != value:
            last[n] = value
            print("%d gpio %d %d" % (now[0], n, value))


sample()
t = 0
while t <= end_ms:
    now[0] = t
    if 0 <= estop_at <= t and not controller.stopped:
        stop_pin.drive_high()
        # gpiozero delivers the edge on its own thread: wait for the stop, not for a fixed time.
        for _ in range(2000):
            if controller.stopped:
                break
            import time
            time.sleep(0.001)
    going = controller.step(t)
    sample()
    if not going and (controller.stopped or controller.next >= len(program.ENTRIES)):
        break
    t += step_ms
    # Between settings with no ramp running nothing changes: jump to the next setting.
    if not any(c["ramping"] for c in controller.cabs) and controller.next < len(program.ENTRIES):
        due = program.ENTRIES[controller.next][0]
        if estop_at < 0 or estop_at > due or controller.stopped:
            t = max(t, due)
        else:
            t = max(t, estop_at)
print("%d end %d" % (t, 1 if controller.stopped else 0))
