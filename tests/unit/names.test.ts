import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

// The naming convention of DEVELOPERS.md ("Names of actions, services and queries"): a server action is
// named for what the user asks (`deleteLayout`), the service in lib/ for the rule it applies
// (`removeBlock`, `queueSessionNotices`) and the query in db/queries for the data operation
// (`deleteLayoutById`, `insertRailway`). No name is two of these, so an import never needs an alias
// and a search for a name finds one function.

const root = path.resolve(__dirname, '../..');

function walk(dir: string): string[] {
  return fs.readdirSync(path.join(root, dir), { withFileTypes: true }).flatMap((entry) => {
    const rel = path.join(dir, entry.name);
    if (entry.isDirectory()) return walk(rel);
    return /\.tsx?$/.test(entry.name) && !entry.name.endsWith('.d.ts') ? [rel] : [];
  });
}

/** Names a module exports as functions or values (not types). */
function exportedValues(file: string): string[] {
  const source = fs.readFileSync(path.join(root, file), 'utf8');
  return [...source.matchAll(/^export\s+(?:async\s+)?(?:function\*?|const|let|class)\s+(\w+)/gm)].map((m) => m[1]!);
}

function owners(files: string[]): Map<string, string[]> {
  const byName = new Map<string, string[]>();
  for (const file of files) for (const name of exportedValues(file)) byName.set(name, [...(byName.get(name) ?? []), file]);
  return byName;
}

const actionFiles = walk('app').filter((f) => path.basename(f) === 'actions.ts');
const queryFiles = walk('db/queries');
const serviceFiles = walk('lib').filter((f) => !f.startsWith('lib/cli/'));

function clashes(a: Map<string, string[]>, b: Map<string, string[]>): string[] {
  return [...a.keys()].filter((name) => b.has(name)).map((name) => `${name}: ${[...a.get(name)!, ...b.get(name)!].join(', ')}`);
}

describe('one name per function (DEVELOPERS.md, names of actions, services and queries)', () => {
  it('finds the files it checks', () => {
    // Guards the walk itself: a moved folder must not turn the checks below into checks of nothing.
    expect(actionFiles.length).toBeGreaterThan(5);
    expect(queryFiles.length).toBeGreaterThan(5);
    expect(serviceFiles.length).toBeGreaterThan(20);
    expect(exportedValues('db/queries/layouts.ts')).toContain('deleteLayoutById');
    expect(exportedValues('app/(app)/railways/[railwayId]/layouts/actions.ts')).toContain('deleteLayout');
  });

  it('no server action has the name of a query or a service', () => {
    const actions = owners(actionFiles);
    expect(clashes(actions, owners(queryFiles))).toEqual([]);
    expect(clashes(actions, owners(serviceFiles))).toEqual([]);
  });

  it('no query has the name of a service', () => {
    expect(clashes(owners(queryFiles), owners(serviceFiles))).toEqual([]);
  });

  it('no two server actions, or two queries, share a name', () => {
    for (const files of [actionFiles, queryFiles]) {
      const twice = [...owners(files)].filter(([, where]) => where.length > 1).map(([name, where]) => `${name}: ${where.join(', ')}`);
      expect(twice).toEqual([]);
    }
  });
});

// One word per concept from screen to table (DEVELOPERS.md, "Words"): the screen says locomotive and
// reply, so the code does too. Names are read from the code alone: comments and string literals are
// left out, so a demo train may still be called "Loco 1" and an error may still say "answers 409".

/** The code of a file without its comments and string literals. */
function codeOf(file: string): string {
  const source = fs.readFileSync(path.join(root, file), 'utf8');
  return source.replace(/\/\*[\s\S]*?\*\/|\/\/[^\n]*|'(?:\\.|[^'\\\n])*'|"(?:\\.|[^"\\\n])*"|`(?:\\.|[^`\\])*`/g, ' ');
}

const productFiles = ['app', 'components', 'lib', 'db'].flatMap(walk);

/** `file: name` for every identifier `pattern` finds, leaving out the names `allowed` gives a file. */
function namesMatching(files: string[], pattern: RegExp, allowed: Record<string, string[]> = {}): string[] {
  return files.flatMap((file) =>
    [...new Set(codeOf(file).match(pattern) ?? [])].filter((name) => !(allowed[file] ?? []).includes(name)).map((name) => `${file}: ${name}`),
  );
}

describe('one word per concept (DEVELOPERS.md, words)', () => {
  it('reads code, not comments or strings', () => {
    expect(codeOf('tests/unit/names.test.ts')).not.toContain('Loco 1');
    expect(namesMatching(['lib/planning/schema.ts'], /\w*[Ll]oco(?!motive)\w*/g)).toEqual(
      expect.arrayContaining(['lib/planning/schema.ts: locos', 'lib/planning/schema.ts: locoIds']),
    );
  });

  it('calls the locomotive a locomotive everywhere but in version 1 of the plan interchange', () => {
    // Version 1 files say `locos` and `locoIds`: its schema and upgrade, and the layout import's extras.
    const v1 = ['locos', 'locoIds'];
    expect(namesMatching(productFiles, /\w*[Ll]oco(?!motive)\w*/g, { 'lib/planning/schema.ts': v1, 'lib/layouts/plan-io.ts': v1 })).toEqual([]);
  });

  it('calls an invitee’s accept, maybe or decline a reply', () => {
    // "answer" is left for what a server answers; in the invitation code it would be the reply's other name.
    // The reply page still reads `answer=` from links sent before the rename.
    const invitationFiles = productFiles.filter((f) => /invitation|reply|my-runs|member-offer|crew|railways\/actions\.ts$/.test(f));
    expect(invitationFiles.length).toBeGreaterThan(10);
    expect(namesMatching(invitationFiles, /\w*[Aa]nswer\w*|\w*ANSWER\w*/g, { 'app/(public)/reply/page.tsx': ['answer'] })).toEqual([]);
  });
});
