import { spawnSync } from 'node:child_process';
import fs from 'node:fs';

/**
 * Which of the Debian packages the control toolchain tests need are missing (`.ci/run` installs them:
 * gcc-avr, avr-libc, simavr, libsimavr-dev, avrdude, python3-gpiozero). An empty list: run the tests.
 */
export function toolchainStatus(): { missing: string[] } {
  const ok = (cmd: string, args: string[]) => spawnSync(cmd, args, { stdio: 'ignore' }).status === 0;
  const missing: string[] = [];
  if (!ok('avr-gcc', ['--version']) || !ok('avr-size', ['--version'])) missing.push('gcc-avr');
  if (!fs.existsSync('/usr/lib/avr/include/avr/io.h')) missing.push('avr-libc');
  if (!fs.existsSync('/usr/include/simavr/sim_avr.h') || !ok('gcc', ['--version'])) missing.push('libsimavr-dev');
  if (!ok('make', ['--version'])) missing.push('make');
  // avrdude answers "-c ?" with its programmers and a non-zero status; only its absence matters here.
  if (spawnSync('avrdude', ['-c', '?'], { stdio: 'ignore' }).error) missing.push('avrdude');
  if (!ok('/usr/bin/python3', ['-c', 'import gpiozero'])) missing.push('python3-gpiozero');
  return { missing };
}
