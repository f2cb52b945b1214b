// npm test — every suite: Vitest (unit + integration, then unit again under TZ=Pacific/Auckland), the production build, then Playwright in
// Chromium. Ends with one line "N passed, N failed" over all of them.
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';

const env = { ...process.env, NEXT_TELEMETRY_DISABLED: '1' };
fs.mkdirSync('test-results', { recursive: true });

function run(command, args, extraEnv = {}) {
  const shown = Object.entries(extraEnv).map(([k, v]) => `${k}=${v} `).join('');
  console.log(`\n$ ${shown}${command} ${args.join(' ')}`);
  return spawnSync(command, args, { stdio: 'inherit', env: { ...env, ...extraEnv } }).status ?? 1;
}

function readJson(file) {
  try {
    return JSON.parse(fs.readFileSync(file, 'utf8'));
  } catch {
    return null;
  }
}

// Browser tests drive Debian's Chromium. On a fresh machine (where we are root) install it.
const chromium = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
if (!fs.existsSync(chromium)) {
  if (process.getuid?.() === 0) {
    run('apt-get', ['update', '-qq']);
    run('apt-get', ['install', '-y', '-qq', 'chromium']);
  }
  if (!fs.existsSync(chromium)) {
    console.error(`Chromium is missing at ${chromium}: run "sudo apt-get install -y chromium" or set CHROMIUM_PATH.`);
  }
}

// The control exports are checked with Debian's AVR toolchain, simulator and gpiozero; install them
// when missing and we may (their tests skip, counted below, only when they cannot be installed).
const CONTROL_PACKAGES = ['gcc-avr', 'avr-libc', 'simavr', 'libsimavr-dev', 'avrdude', 'python3-gpiozero', 'make', 'gcc'];
const missingPackages = CONTROL_PACKAGES.filter((name) => spawnSync('dpkg', ['-s', name], { stdio: 'ignore' }).status !== 0);
if (missingPackages.length > 0 && process.getuid?.() === 0) {
  run('apt-get', ['update', '-qq']);
  run('apt-get', ['install', '-y', '-qq', ...missingPackages]);
}

let passed = 0;
let failed = 0;
let skipped = 0;

// Static checks count as one test each.
for (const [command, args] of [
  ['npx', ['tsc', '--noEmit', '-p', '.']],
  ['npx', ['eslint', '.']],
]) {
  if (run(command, args) === 0) passed += 1;
  else failed += 1;
}

/** One Vitest run with its JSON report, added to the counts. */
function vitestRun(report, args, extraEnv) {
  const file = `test-results/${report}`;
  fs.rmSync(file, { force: true });
  const status = run('npx', ['vitest', 'run', ...args, '--reporter=default', '--reporter=json', `--outputFile.json=${file}`], extraEnv);
  const result = readJson(file);
  if (result) {
    passed += result.numPassedTests;
    failed += result.numFailedTests;
    skipped += (result.numPendingTests ?? 0) + (result.numTodoTests ?? 0);
  }
  if (status !== 0 && (!result || result.numFailedTests === 0)) failed += 1; // crashed before reporting
}

vitestRun('vitest.json', []);
// The unit tests again in a zone far from UTC that has summer time in the other half of the year
// (UTC+13 in December, +12 in July): code that reads local time where it means UTC fails here.
vitestRun('vitest-auckland.json', ['--project', 'unit'], { TZ: 'Pacific/Auckland' });

const buildStatus = run('npx', ['next', 'build']);
if (buildStatus !== 0) {
  failed += 1;
} else {
  fs.rmSync('test-results/e2e-results.json', { force: true });
  const e2eStatus = run('npx', ['playwright', 'test']);
  const e2e = readJson('test-results/e2e-results.json');
  if (e2e?.stats) {
    passed += e2e.stats.expected + (e2e.stats.flaky ?? 0);
    failed += e2e.stats.unexpected;
    skipped += e2e.stats.skipped ?? 0;
  }
  if (e2eStatus !== 0 && (!e2e?.stats || e2e.stats.unexpected === 0)) failed += 1;

  // The HTTP benchmark's short smoke version: every endpoint answers, with no errors, under load.
  if (run('npx', ['tsx', 'lib/cli/bench-http.ts', '--smoke']) === 0) passed += 1;
  else failed += 1;
}

if (skipped > 0) console.log(`\n${skipped} skipped (each skipping test says why above, e.g. a Debian package that could not be installed)`);
console.log(`\n${passed} passed, ${failed} failed`);
process.exit(failed === 0 && passed > 0 ? 0 : 1);
