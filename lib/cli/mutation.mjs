// npm run test:mutation [-- folder …] — Stryker over lib/, one folder at a time (stryker.config.mjs),
// then the score of every folder that has a report. Folders: the sub-folders of lib/ and "root" for
// the files directly in lib/. Each folder keeps its own incremental file in reports/mutation/, so a
// second run re-tests only mutants whose code or tests changed.
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
const asked = process.argv.slice(2).filter((a) => !a.startsWith('-'));
const unknown = asked.filter((f) => !all.includes(f));
if (unknown.length) {
  console.error(`Unknown folder ${unknown.join(', ')}; one of: ${all.join(', ')}`);
  process.exit(2);
}
// The engine last: it is the largest and is often the one being changed.
const folders = asked.length ? asked : [...all.filter((f) => f !== 'planning'), 'planning'];
fs.mkdirSync(OUT, { recursive: true });

for (const folder of folders) {
  const mutate = folder === 'root' ? ['lib/*.ts', '!lib/*.d.ts'] : [`lib/${folder}/**/*.ts`, '!lib/**/*.d.ts'];
  console.log(`\n== lib/${folder === 'root' ? '' : `${folder}/`} ==`);
  // The engine is pure and tested by the unit tests (see vitest.config.mts).
  if (folder === 'planning') process.env.FISHPLATE_MUTATION_UNIT_ONLY = '1';
  else delete process.env.FISHPLATE_MUTATION_UNIT_ONLY;
  await new Stryker({
    mutate,
    incrementalFile: path.join(OUT, `${folder}.incremental.json`),
    jsonReporter: { fileName: path.join(OUT, `${folder}.json`) },
    htmlReporter: { fileName: path.join(OUT, `${folder}.html`) },
  }).runMutationTest();
}

// Score = (killed + timed out) / (everything except compile errors and ignored), as Stryker counts it.
const rows = [];
for (const folder of all) {
  const file = path.join(OUT, `${folder}.json`);
  if (!fs.existsSync(file)) continue;
  const report = JSON.parse(fs.readFileSync(file, 'utf8'));
  const count = { Killed: 0, Timeout: 0, Survived: 0, NoCoverage: 0 };
  for (const f of Object.values(report.files)) for (const m of f.mutants) if (m.status in count) count[m.status] += 1;
  const valid = count.Killed + count.Timeout + count.Survived + count.NoCoverage;
  const score = valid ? (100 * (count.Killed + count.Timeout)) / valid : 100;
  rows.push(`| \`lib/${folder === 'root' ? '' : `${folder}/`}\` | ${valid} | ${count.Killed + count.Timeout} | ${count.Survived} | ${count.NoCoverage} | ${score.toFixed(1)} % |`);
}
console.log('\n| Folder | Mutants | Killed | Survived | No coverage | Score |\n|---|---|---|---|---|---|');
console.log(rows.join('\n'));
