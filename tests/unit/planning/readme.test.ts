import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { FINDING_KINDS } from '@/lib/planning';

describe('lib/planning/README.md', () => {
  it('describes every finding kind checkPlan reports, once, and no kind it does not', () => {
    const text = readFileSync(path.join(process.cwd(), 'lib/planning/README.md'), 'utf8');
    const table = text.slice(text.indexOf('## Finding kinds'), text.indexOf('\n## ', text.indexOf('## Finding kinds') + 1));
    // The first cell of each row names one or more kinds in backticks; the second is its severity.
    const rows = table.split('\n').filter((line) => /^\| `/.test(line));
    const described = rows.flatMap((row) => {
      const [kinds, severity] = row.split('|').slice(1, 3).map((cell) => cell.trim());
      expect(['error', 'warning']).toContain(severity);
      return [...kinds!.matchAll(/`([a-z-]+)`/g)].map((m) => m[1]!);
    });
    expect([...described].sort()).toEqual([...FINDING_KINDS].sort());
  });
});
