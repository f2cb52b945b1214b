// npm run test:mutation [-- target …] [--unit] [--force] [--concurrency 1] [--property-runs 0.1] [--table] — Stryker over lib/, one folder at a time
// (stryker.config.mjs), then the score of every folder that has a report. A target is a folder (a
// sub-folder of lib/, or "root" for the files directly in lib/) or one file (lib/calendar/ics.ts), for
// a quick look while writing its tests, or files of one folder joined by + (lib/planning/track.ts+route.ts:
// the names after the first are in its folder), for a folder whose whole run outlasts an afternoon here. Each target keeps its own incremental file in reports/mutation/
// (git-ignored: it holds this machine's results, and a clean clone starts over), so a second run
// re-tests only mutants whose code or tests changed.
import fs from 'node:fs';
import path from 'node:path';
import { Stryker } from '@stryker-mutator/core';

const OUT = 'reports/mutation';
// Stryker's test runners inherit this. A zone far from UTC (as npm test's second unit run) lets the
// tests see a mutant that reads local time where the code means UTC; in UTC the two agree.
process.env.TZ ??= 'Pacific/Auckland';
const SKIPPED = new Set(['cli', 'demo']); // see stryker.config.mjs

const all = [
  'root',
  ...fs
    .readdirSync('lib', { withFileTypes: true })
    .filter((e) => e.isDirectory() && !SKIPPED.has(e.name))
    .map((e) => e.name)
    .sort(),
];
// Folders of pure code (zod schemas, the engine, chart ticks, the control exporters): their unit tests
// are the ones meant to catch a bug, and an integration test per mutant costs seconds on two cores.
// lib/control's generated programs are also compiled and run by the toolchain tests (avr-gcc + simavr,
// python3 with gpiozero's mock pins), which generate them in-process and so would see a mutant; tried on
// 3 December: under the shared machine's load they took about 15 s a mutant (239 of 1323 in 15 min, 37
// timed out), so the folder stays with its unit tests, which check the generated programs' text.
const UNIT_ONLY = new Set(['planning', 'validations', 'charts', 'control']);
const args = process.argv.slice(2);
const options = {};
const concurrencyAt = args.indexOf('--concurrency');
if (concurrencyAt >= 0) options.concurrency = Number(args[concurrencyAt + 1]);
// --force: test every mutant again, ignoring the incremental file (which does not notice a new test
// reaching a mutant that had no coverage before).
if (args.includes('--force')) options.force = true;
// --unit: only the unit tests, for a quick look at one file whose unit tests are meant to catch its bugs.
const unitFlag = args.includes('--unit');
// --property-runs 0.1: every property test runs a tenth of its cases (at least one), through
// tests/shared/fast-check-fewer-runs.ts. Each survivor of the engine runs every property test, so its
// run shrinks nearly in proportion; fewer cases can only let more mutants survive, never fewer.
const propertyRunsAt = args.indexOf('--property-runs');
if (propertyRunsAt >= 0) {
  const fraction = args[propertyRunsAt + 1];
  if (!(Number(fraction) > 0 && Number(fraction) <= 1)) {
    console.error(`--property-runs takes a fraction of each property's cases, above 0 and at most 1 (not ${fraction})`);
    process.exit(2);
  }
  process.env.FISHPLATE_MUTATION_PROPERTY_RUNS = fraction;
}
const valueOf = new Set(['--concurrency', '--property-runs']);
const asked = args.filter((a, i) => !a.startsWith('-') && !valueOf.has(args[i - 1]));
const fileTarget = (t) => /^lib\/[a-z-]+\/[a-z0-9-]+\.ts$/.test(t) && fs.existsSync(t);
// A group `runs+sessions+live`: one Stryker run over several folders that are not unit-only, sharing the
// first (coverage) run of the whole suite, which takes minutes here; the table gives each folder its row.
// Files of one folder in one run: lib/planning/track.ts+route.ts+voltage.ts.
const filesOf = (t) => {
  const [first, ...rest] = t.split('+');
  if (!fileTarget(first)) return undefined;
  const files = [first, ...rest.map((n) => path.posix.join(path.posix.dirname(first), n))];
  return files.every(fileTarget) && new Set(files).size === files.length ? files : undefined;
};
const groupTarget = (t) => t.includes('+') && t.split('+').every((f) => all.includes(f) && !UNIT_ONLY.has(f));
const unknown = asked.filter((t) => !all.includes(t) && !filesOf(t) && !groupTarget(t));
if (unknown.length) {
  console.error(`Unknown target ${unknown.join(', ')}; a file lib/<folder>/<name>.ts (more of its folder after +: lib/<folder>/a.ts+b.ts), folders joined by + (not ${[...UNIT_ONLY].join(', ')}) or one of: ${all.join(', ')}`);
  process.exit(2);
}
// The engine last: it is the largest and is often the one being changed.
// --table: print the table of the reports already written, running nothing.
const targets = args.includes('--table') ? [] : asked.length ? asked : [...all.filter((f) => f !== 'planning'), 'planning'];
fs.mkdirSync(OUT, { recursive: true });

for (const target of targets) {
  const files = filesOf(target);
  const file = Boolean(files);
  const folder = file ? target.split('/')[1] : target;
  // lib/planning/track.ts → planning--track; lib/planning/track.ts+route.ts → planning--track+route.
  const name = (file ? `${folder}--${files.map((f) => path.posix.basename(f, '.ts')).join('+')}` : target) + (unitFlag && !UNIT_ONLY.has(folder) ? '.unit' : '') + (propertyRunsAt >= 0 ? `.cases${Math.round(100 * Number(process.env.FISHPLATE_MUTATION_PROPERTY_RUNS))}` : '');
  const globs = (f) => (f === 'root' ? ['lib/*.ts', '!lib/*.d.ts'] : [`lib/${f}/**/*.ts`, '!lib/**/*.d.ts']);
  const mutate = file ? files : target.split('+').flatMap(globs);
  console.log(`\n== ${file ? files.join(' ') : target.split('+').map((f) => `lib/${f === 'root' ? '' : `${f}/`}`).join(' ')} ==`);
  // Read by vitest.config.mts.
  if (unitFlag || UNIT_ONLY.has(folder)) process.env.FISHPLATE_MUTATION_UNIT_ONLY = '1';
  else delete process.env.FISHPLATE_MUTATION_UNIT_ONLY;
  process.env.FISHPLATE_MUTATION_FOLDER = folder;
  await new Stryker({
    ...options,
    mutate,
    incrementalFile: path.join(OUT, `${name}.incremental.json`),
    jsonReporter: { fileName: path.join(OUT, `${name}.json`) },
    htmlReporter: { fileName: path.join(OUT, `${name}.html`) },
  }).runMutationTest();
}

// Score = (killed + timed out) / (everything except compile errors and ignored), as Stryker counts it.
// One row per report in reports/mutation/: the folders, then any single files looked at.
// How a report was run, from its name's suffixes: .unit, .cases10 (10 % of each property's cases).
const how = (name) =>
  name
    .split('.')
    .slice(1)
    .map((s) => ` (${s === 'unit' ? 'unit tests only' : `${s.slice('cases'.length)} % of property cases`})`)
    .join('');
const label = (name) => {
  const base = name.split('.')[0];
  const where = all.includes(base) ? `lib/${base === 'root' ? '' : `${base}/`}` : `lib/${base.replace('--', '/')}.ts`;
  return `\`${where}\`${how(name)}`;
};
const reports = fs
  .readdirSync(OUT)
  .filter((f) => f.endsWith('.json') && !f.endsWith('.incremental.json'))
  .map((f) => f.slice(0, -'.json'.length))
  .sort((a, b) => Number(!all.includes(a.split('.')[0])) - Number(!all.includes(b.split('.')[0])) || a.localeCompare(b));
const readReport = (name) => JSON.parse(fs.readFileSync(path.join(OUT, `${name}.json`), 'utf8'));
// A report's files by their path from the project root (Stryker may write them absolute).
const filesOfReport = (report) => Object.entries(report.files).map(([file, f]) => [path.relative(process.cwd(), path.resolve(file)), f.mutants]);
const countStatuses = (mutantLists) => {
  const count = { Killed: 0, Timeout: 0, Survived: 0, NoCoverage: 0 };
  for (const mutants of mutantLists) for (const m of mutants) if (m.status in count) count[m.status] += 1;
  return count;
};
// The statuses of the mutants of the report's files that `keep` accepts.
const tally = (report, keep = () => true) => countStatuses(filesOfReport(report).filter(([file]) => keep(file)).map(([, mutants]) => mutants));
const row = (what, when, count) => {
  const valid = count.Killed + count.Timeout + count.Survived + count.NoCoverage;
  const score = valid ? (100 * (count.Killed + count.Timeout)) / valid : 100;
  return `| ${what} | ${when} | ${valid} | ${count.Killed + count.Timeout} | ${count.Survived} | ${count.NoCoverage} | ${score.toFixed(1)} % |`;
};
const written = (name) => fs.statSync(path.join(OUT, `${name}.json`)).mtime.toISOString().slice(0, 16).replace('T', ' ');
const folderOf = (file) => (path.dirname(file) === 'lib' ? 'root' : path.dirname(file).split('/')[1]);
const rows = reports.flatMap((name) => {
  const base = name.split('.')[0];
  const report = readReport(name);
  if (!base.includes('+')) return [row(label(name), written(name), tally(report))];
  if (base.includes('--')) {
    // Files of one folder run together: a row per file.
    const [folder, names] = base.split('--');
    return names.split('+').map((n) => {
      const count = tally(report, (file) => file === `lib/${folder}/${n}.ts`);
      const others = names.split('+').filter((o) => o !== n).map((o) => `${o}.ts`);
      return row(`\`lib/${folder}/${n}.ts\` (run with ${others.join(', ')})${how(name)}`, written(name), count);
    });
  }
  // A group's report: a row per folder, counted from the report's files in that folder.
  return base.split('+').map((folder) => {
    const count = tally(report, (file) => folderOf(file) === folder);
    return row(`${label(folder)} (run with ${base.split('+').filter((f) => f !== folder).join(', ')})${how(name)}`, written(name), count);
  });
});
// A folder's newest figure: each of its files counted from the newest report (of any target, not
// unit-only unless the folder is) that holds it — a folder measured whole, then a file of it again after
// new tests. Only when every file of the folder has a report; the row names the span of report times.
const newest = new Map(); // file → { when, mutants, fewer }
for (const name of reports) {
  if (name.includes('.unit')) continue;
  const when = written(name);
  for (const [file, mutants] of filesOfReport(readReport(name))) {
    if (!newest.has(file) || newest.get(file).when < when) newest.set(file, { when, mutants, fewer: name.includes('.cases') });
  }
}
for (const folder of all.filter((f) => f !== 'root')) {
  const files = fs.readdirSync(`lib/${folder}`).filter((f) => f.endsWith('.ts') && !f.endsWith('.d.ts')).map((f) => `lib/${folder}/${f}`);
  // A file that a whole-folder report leaves out has no mutants (an index of re-exports).
  const whole = reports.some((n) => !n.includes('.unit') && !n.includes('--') && n.split('.')[0].split('+').includes(folder));
  const found = files.map((f) => newest.get(f) ?? (whole ? { when: '', mutants: [] } : undefined));
  const fileReports = reports.some((n) => !n.includes('.unit') && n.startsWith(`${folder}--`));
  if (!files.length || found.some((x) => !x) || !fileReports) continue;
  const count = countStatuses(found.map((x) => x.mutants));
  const times = found.map((x) => x.when).filter(Boolean).sort();
  const fewer = found.some((x) => x.fewer) ? ', some with fewer property cases' : '';
  rows.push(row(`\`lib/${folder}/\` (each of its ${files.length} files from its newest report${fewer})`, `${times[0]} – ${times.at(-1)}`, count));
}
console.log('\n| Target | Report written (UTC) | Mutants | Killed | Survived | No coverage | Score |\n|---|---|---|---|---|---|---|');
console.log(rows.join('\n'));
