// The CSV import's plan and commit (lib/layouts/csv-import.ts) against a layout's rows held in memory:
// which rows are created, updated or left alone, each issue with its row, column and message, the
// preview's labels and counts, the basis that makes a stale commit fail, and what each export writes.
// The database is replaced by a stand-in (applyCsvChanges is recorded, not run); the writing itself is
// tested in tests/integration/layouts-files.test.ts. The module is loaded again inside each test
// (vi.resetModules, then import): a module imported at the top of this file would be built before a
// mutation test run switches a change on (Stryker's Vitest runner does that in a beforeAll).
import { beforeEach, describe, expect, it, vi } from 'vitest';
import type { AppError } from '@/lib/errors';

vi.mock('@/db/queries/layout-csv', () => ({
  applyCsvChanges: vi.fn(),
  StaleRowError: class StaleRowError extends Error {
    constructor(readonly current: unknown) {
      super('stale row');
    }
  },
}));
vi.mock('@/db/queries/plan-data', () => ({ loadLayoutRows: vi.fn() }));

type Import = typeof import('@/lib/layouts/csv-import');
type Db = typeof import('@/db/queries/layout-csv');
type Rows = Parameters<Import['planCsvImport']>[2];
let I: Import;
let db: Db;

beforeEach(async () => {
  vi.resetModules();
  db = await import('@/db/queries/layout-csv');
  I = await import('@/lib/layouts/csv-import');
});

/** A small layout of our own: two blocks end to end, two locomotives, two trains. */
function layout() {
  return {
    blocks: [
      { id: 'b-yard', name: 'Yard', lengthMm: 1000, positionMm: 0, version: 1 },
      { id: 'b-main', name: 'Main', lengthMm: 2000, positionMm: 1000, version: 3 },
      { id: 'b-spur', name: 'Spur', lengthMm: 500, positionMm: 1000, version: 1 },
    ],
    links: [{ id: 'l-1', blockAId: 'b-yard', blockAEnd: 'b' as const, blockBId: 'b-main', blockBEnd: 'a' as const }],
    locomotives: [
      { id: 'o-heron', name: 'Heron', runningAmps: 0.3, stallAmps: 0.9, ratedVolts: 12, topSpeedKmh: 80, startVolts: 2, version: 1 },
      { id: 'o-kestrel', name: 'Kestrel', runningAmps: 0.5, stallAmps: 1.2, ratedVolts: 12, topSpeedKmh: 100, startVolts: null, version: 2 },
    ],
    trains: [
      { id: 't-goods', name: 'Goods', lightingAmps: 0, lengthMm: 500, accelKmhPerS: null, brakingKmhPerS: null, version: 1 },
      { id: 't-stopper', name: 'Stopper', lightingAmps: 0.1, lengthMm: 300, accelKmhPerS: 2, brakingKmhPerS: 3, version: 4 },
    ],
    consists: [
      { trainId: 't-goods', locomotiveId: 'o-heron' },
      { trainId: 't-goods', locomotiveId: 'o-kestrel' },
      { trainId: 't-stopper', locomotiveId: 'o-kestrel' },
    ],
  };
}
const rows = (l = layout()) => l as unknown as Rows;

const plan = (table: Parameters<Import['planCsvImport']>[0], text: string, l = layout()) => I.planCsvImport(table, text, rows(l));

/** The error a call throws; fails when it does not throw. */
function thrown(call: () => unknown): AppError {
  try {
    call();
  } catch (error) {
    return error as AppError;
  }
  throw new Error('expected the call to throw');
}

describe('export', () => {
  it('writes each table in the columns the import reads, in mm, with CRLF line ends', () => {
    // RFC 4180 §2.1: each record ends with CRLF.
    expect(I.exportCsv('blocks', rows())).toBe('name,length,unit,position\r\nYard,1000,mm,0\r\nMain,2000,mm,1000\r\nSpur,500,mm,1000');
    expect(I.exportCsv('links', rows())).toBe('block_a,block_b,block_a_end,block_b_end\r\nYard,Main,b,a');
    expect(I.exportCsv('locomotives', rows())).toBe('name,running_amps,stall_amps,rated_volts,top_speed_kmh,start_volts\r\nHeron,0.3,0.9,12,80,2\r\nKestrel,0.5,1.2,12,100,');
    expect(I.exportCsv('trains', rows())).toBe('name,locomotives,lighting_amps,length,unit,accel_kmh_per_s,braking_kmh_per_s\r\nGoods,Heron; Kestrel,0,500,mm,,\r\nStopper,Kestrel,0.1,300,mm,2,3');
  });

  it('writes a train without a stored consist with a blank locomotives cell', () => {
    const l = layout();
    l.consists = l.consists.filter((x) => x.trainId !== 't-stopper');
    expect(I.exportCsv('trains', rows(l)).split('\r\n')[2]).toBe('Stopper,,0.1,300,mm,2,3');
  });

  it('reads back what it wrote as unchanged rows', () => {
    for (const table of ['blocks', 'links', 'locomotives', 'trains'] as const) {
      const { changes, preview } = plan(table, I.exportCsv(table, rows()));
      expect(preview.issues, table).toEqual([]);
      expect(changes.changes, table).toEqual([]);
      expect(preview.rows.every((r) => r.action === 'unchanged'), table).toBe(true);
    }
  });
});

describe('the basis of a preview', () => {
  const basis = (table: 'blocks' | 'links' | 'locomotives' | 'trains', l = layout()) => plan(table, 'x\r\n', l).preview.basis;

  it('is 20 hex digits and does not depend on the order rows come in', () => {
    expect(basis('blocks')).toMatch(/^[0-9a-f]{20}$/);
    for (const table of ['blocks', 'links', 'locomotives', 'trains'] as const) {
      const l = layout();
      const reversed = { ...l, blocks: [...l.blocks].reverse(), links: [...l.links].reverse(), locomotives: [...l.locomotives].reverse(), trains: [...l.trains].reverse() };
      expect(basis(table, reversed), table).toBe(basis(table));
    }
  });

  it('changes when a row of the table, or a row its rows name, changes version or is added', () => {
    const bump = (edit: (l: ReturnType<typeof layout>) => void) => {
      const l = layout();
      edit(l);
      return l;
    };
    const blockMoved = bump((l) => (l.blocks[1]!.version = 4));
    const linkAdded = bump((l) => l.links.push({ id: 'l-2', blockAId: 'b-main', blockAEnd: 'b', blockBId: 'b-spur', blockBEnd: 'a' }));
    const locoEdited = bump((l) => (l.locomotives[0]!.version = 2));
    const trainEdited = bump((l) => (l.trains[0]!.version = 2));
    expect(basis('blocks', blockMoved)).not.toBe(basis('blocks'));
    expect(basis('links', blockMoved)).not.toBe(basis('links'));
    expect(basis('links', linkAdded)).not.toBe(basis('links'));
    const linkReplaced = bump((l) => (l.links[0]!.id = 'l-9'));
    expect(basis('links', linkReplaced)).not.toBe(basis('links'));
    expect(basis('locomotives', locoEdited)).not.toBe(basis('locomotives'));
    expect(basis('trains', locoEdited)).not.toBe(basis('trains'));
    expect(basis('trains', trainEdited)).not.toBe(basis('trains'));
    // Rows the table does not depend on leave it alone.
    expect(basis('blocks', linkAdded)).toBe(basis('blocks'));
    expect(basis('blocks', locoEdited)).toBe(basis('blocks'));
    expect(basis('links', locoEdited)).toBe(basis('links'));
    expect(basis('locomotives', trainEdited)).toBe(basis('locomotives'));
    expect(basis('trains', blockMoved)).toBe(basis('trains'));
  });

  it('tells apart row sets whose ids and versions run together', () => {
    const two = { ...layout(), blocks: [{ id: 'p', name: 'P', lengthMm: 1, positionMm: 0, version: 1 }, { id: 'q', name: 'Q', lengthMm: 1, positionMm: 0, version: 23 }] };
    const one = { ...layout(), blocks: [{ id: 'p:1q', name: 'P', lengthMm: 1, positionMm: 0, version: 23 }] };
    expect(basis('blocks', two)).not.toBe(basis('blocks', one));
  });
});

describe('planning an import: the file as a whole', () => {
  it('stops at a wrong header with an empty preview', () => {
    const { changes, preview } = plan('blocks', 'name,length,colour\r\nA,1,mm\r\n');
    expect(changes).toEqual({ table: 'blocks', changes: [] });
    expect(preview).toEqual({
      table: 'blocks',
      rows: [],
      issues: [
        { row: 1, column: 'unit', message: 'The column “unit” is missing (mm, cm, m, in or ft).' },
        { row: 1, column: 'colour', message: 'Unknown column “colour”; the columns are name, length, unit, position.' },
      ],
      counts: { create: 0, update: 0, unchanged: 0, error: 0 },
      basis: plan('blocks', I.exportCsv('blocks', rows())).preview.basis,
    });
  });

  it('says a file with a header and no rows has no rows, on row 2', () => {
    expect(plan('blocks', 'name,length,unit\r\n\r\n').preview.issues).toEqual([{ row: 2, column: '', message: 'The file has a header but no rows.' }]);
    // A malformed line that reads as blank is reported once, not also as "no rows".
    expect(plan('blocks', 'name,length,unit\r\n"').preview.issues).toEqual([{ row: 2, column: '', message: 'The CSV is malformed here: Quoted field unterminated.' }]);
  });

  it('lists a row’s own issues before a later row’s reading issue', () => {
    expect(plan('blocks', 'name,length,unit\r\nA,x,mm\r\nB,1,mm,extra\r\nC,1,mm\r\n').preview.issues).toEqual([
      { row: 2, column: 'length', message: 'Enter a number, like 12 or 0.5.' },
      { row: 3, column: '', message: 'This row has 4 cells; the header has 3.' },
    ]);
  });

  it('lists issues by row and marks every row with an issue as an error, the ragged one too', () => {
    const { preview, changes } = plan('blocks', 'name,length,unit\r\nA,1,mm\r\nB,1,mm,extra\r\nC,x,mm\r\n');
    expect(preview.issues).toEqual([
      { row: 3, column: '', message: 'This row has 4 cells; the header has 3.' },
      { row: 4, column: 'length', message: 'Enter a number, like 12 or 0.5.' },
    ]);
    expect(preview.rows).toEqual([
      { row: 2, label: 'A', action: 'create' },
      { row: 3, label: 'B', action: 'error' },
      { row: 4, label: 'C', action: 'error' },
    ]);
    expect(preview.counts).toEqual({ create: 1, update: 0, unchanged: 0, error: 2 });
    expect(changes.changes).toHaveLength(2);
  });
});

describe('planning blocks', () => {
  it('adds new names, updates a changed name case, length or position, leaves equal rows', () => {
    const { changes, preview } = plan('blocks', 'name,length,unit,position\r\nyard,1000,mm,0\r\nMain,2.5,m,1\r\nSpur,500,mm,2000\r\nNew,10,cm,\r\nYard2,1,mm,0\r\n');
    const l = layout();
    const spurSame = plan('blocks', 'name,length,unit,position\r\nSpur,500,mm,1000\r\n');
    expect(spurSame.preview.rows).toEqual([{ row: 2, label: 'Spur', action: 'unchanged' }]);
    expect(spurSame.changes.changes).toEqual([]);
    expect(changes).toEqual({
      table: 'blocks',
      changes: [
        { action: 'update', id: 'b-yard', version: 1, values: { name: 'yard', lengthMm: 1000, positionMm: 0 } },
        { action: 'update', id: 'b-main', version: 3, values: { name: 'Main', lengthMm: 2500, positionMm: 1000 } },
        { action: 'update', id: 'b-spur', version: 1, values: { name: 'Spur', lengthMm: 500, positionMm: 2000 } },
        { action: 'create', values: { name: 'New', lengthMm: 100, positionMm: 0 } },
        { action: 'create', values: { name: 'Yard2', lengthMm: 1, positionMm: 0 } },
      ],
    });
    expect(preview.rows.map((r) => `${r.row} ${r.label} ${r.action}`)).toEqual(['2 yard update', '3 Main update', '4 Spur update', '5 New create', '6 Yard2 create']);
    expect(preview.counts).toEqual({ create: 2, update: 3, unchanged: 0, error: 0 });
    expect(l.blocks).toEqual(layout().blocks);
  });

  it('names a bad cell by its column and labels the row with the name as typed', () => {
    const { preview, changes } = plan('blocks', 'name,length,unit\r\nHill,-1,mm\r\n');
    expect(preview.issues).toEqual([{ row: 2, column: 'length', message: 'Must be more than 0.' }]);
    expect(preview.rows).toEqual([{ row: 2, label: 'Hill', action: 'error' }]);
    expect(changes.changes).toEqual([]);
  });

  it('refuses a name twice in the file, ignoring case, naming the first row', () => {
    const { preview, changes } = plan('blocks', 'name,length,unit\r\nHill,1,mm\r\nHILL,2,mm\r\n');
    expect(preview.issues).toEqual([{ row: 3, column: 'name', message: 'The block “HILL” is already on row 2 of this file.' }]);
    expect(preview.rows).toEqual([
      { row: 2, label: 'Hill', action: 'create' },
      { row: 3, label: 'HILL', action: 'error' },
    ]);
    expect(changes.changes).toEqual([{ action: 'create', values: { name: 'Hill', lengthMm: 1, positionMm: 0 } }]);
  });
});

describe('planning links', () => {
  const header = 'block_a,block_b,block_a_end,block_b_end\r\n';

  it('creates a new joint, leaves a stored one (either way round), and labels each with its ends', () => {
    const { changes, preview } = plan('links', `${header}Main,Yard,a,b\r\nmain,spur,b,a\r\n`);
    expect(changes).toEqual({ table: 'links', changes: [{ action: 'create', values: { blockAId: 'b-main', blockBId: 'b-spur', blockAEnd: 'b', blockBEnd: 'a' } }] });
    expect(preview.rows).toEqual([
      { row: 2, label: 'Main (a) — Yard (b)', action: 'unchanged' },
      { row: 3, label: 'Main (b) — Spur (a)', action: 'create' },
    ]);
    expect(preview.counts).toEqual({ create: 1, update: 0, unchanged: 1, error: 0 });
  });

  it('takes blank ends from the blocks’ positions: the block further along meets at its a end', () => {
    // drizzle/0009's rule for links stored before blocks had ends; equal positions: a's b end to b's a end.
    const ends = (text: string) => (plan('links', `${header}${text}\r\n`).changes.changes[0] as { values: { blockAEnd: string; blockBEnd: string } }).values;
    expect(ends('Spur,Yard,,')).toMatchObject({ blockAEnd: 'a', blockBEnd: 'b' });
    expect(ends('Yard,Spur,,')).toMatchObject({ blockAEnd: 'b', blockBEnd: 'a' });
    expect(ends('Spur,Main,,')).toMatchObject({ blockAEnd: 'b', blockBEnd: 'a' });
    expect(ends('Main,Spur,,')).toMatchObject({ blockAEnd: 'b', blockBEnd: 'a' });
    expect(ends('Spur,Main, B ,A')).toMatchObject({ blockAEnd: 'b', blockBEnd: 'a' });
    expect(plan('links', 'block_a,block_b\r\nSpur,Yard\r\n').changes.changes).toEqual([{ action: 'create', values: { blockAId: 'b-spur', blockBId: 'b-yard', blockAEnd: 'a', blockBEnd: 'b' } }]);
  });

  it('names a blank or unknown block in its own column, and both when both are wrong', () => {
    const { preview, changes } = plan('links', `${header},Yard,,\r\nYard,Nowhere,,\r\nGhost,,,\r\n`);
    expect(preview.issues).toEqual([
      { row: 2, column: 'block_a', message: 'Enter a block name.' },
      { row: 3, column: 'block_b', message: 'There is no block named “Nowhere” in this layout (import blocks first).' },
      { row: 4, column: 'block_a', message: 'There is no block named “Ghost” in this layout (import blocks first).' },
      { row: 4, column: 'block_b', message: 'Enter a block name.' },
    ]);
    expect(preview.rows).toEqual([
      { row: 2, label: ' — Yard', action: 'error' },
      { row: 3, label: 'Yard — Nowhere', action: 'error' },
      { row: 4, label: 'Ghost — ', action: 'error' },
    ]);
    expect(changes.changes).toEqual([]);
  });

  it('names a bad end, and a block linked to itself, by the CSV column', () => {
    const { preview } = plan('links', `${header}Yard,Main,c,a\r\nYard,Main,b,up\r\nMain,main,,\r\n`);
    expect(preview.issues).toEqual([
      { row: 2, column: 'block_a_end', message: 'must be the a end or the b end' },
      { row: 3, column: 'block_b_end', message: 'must be the a end or the b end' },
      { row: 4, column: 'block_b', message: 'A block cannot link to itself.' },
    ]);
    expect(preview.rows.map((r) => `${r.label} ${r.action}`)).toEqual(['Yard — Main error', 'Yard — Main error', 'Main — main error']);
  });

  it('names a stored block id the link refuses by the block’s column', () => {
    const l = layout();
    l.blocks[0]!.id = 'x'.repeat(101);
    expect(plan('links', `${header}Yard,Main,b,a\r\n`, l).preview.issues).toEqual([{ row: 2, column: 'block_a', message: 'That id is not valid.' }]);
  });

  it('refuses the same joint twice in the file, either way round, naming the first row', () => {
    const { preview, changes } = plan('links', `${header}Main,Spur,b,a\r\nSpur,Main,a,b\r\n`);
    expect(preview.issues).toEqual([{ row: 3, column: 'block_b', message: 'The link “Spur” (a end) — “Main” (b end) is already on row 2 of this file.' }]);
    expect(preview.rows).toEqual([
      { row: 2, label: 'Main (b) — Spur (a)', action: 'create' },
      { row: 3, label: 'Spur — Main', action: 'error' },
    ]);
    expect(changes.changes).toHaveLength(1);
  });
});

describe('planning locomotives', () => {
  const header = 'name,running_amps,stall_amps,rated_volts,top_speed_kmh,start_volts\r\n';
  const heron = ['Heron', '0.3', '0.9', '12', '80', '2'];

  it('leaves an equal row, and updates on any one field changed', () => {
    const same = plan('locomotives', `${header}${heron.join(',')}\r\nKestrel,0.5,1.2,12,100,\r\n`);
    expect(same.preview.rows.map((r) => r.action)).toEqual(['unchanged', 'unchanged']);
    expect(same.changes.changes).toEqual([]);
    // One cell changed at a time: [its index, its new value].
    const edits: [number, string][] = [[0, 'heron'], [1, '0.4'], [2, '1'], [3, '14'], [4, '90'], [5, '3'], [5, '']];
    for (const [at, value] of edits) {
      const cells = heron.map((c, i) => (i === at ? value : c));
      const { changes, preview } = plan('locomotives', `${header}${cells.join(',')}\r\n`);
      expect(preview.rows, cells.join(',')).toEqual([{ row: 2, label: cells[0], action: 'update' }]);
      expect(changes.changes, cells.join(',')).toEqual([
        {
          action: 'update',
          id: 'o-heron',
          version: 1,
          values: { name: cells[0], runningAmps: Number(cells[1]), stallAmps: Number(cells[2]), ratedVolts: Number(cells[3]), topSpeedKmh: Number(cells[4]), startVolts: cells[5] === '' ? null : Number(cells[5]) },
        },
      ]);
    }
    const added = plan('locomotives', `${header}Plover,0.2,0.6,12,60,\r\n`);
    expect(added.changes.changes).toEqual([{ action: 'create', values: { name: 'Plover', runningAmps: 0.2, stallAmps: 0.6, ratedVolts: 12, topSpeedKmh: 60, startVolts: null } }]);
    expect(added.preview.rows).toEqual([{ row: 2, label: 'Plover', action: 'create' }]);
  });

  it('names each bad cell by its CSV column, one at a time, and labels the row with the name', () => {
    const cases: [number, string, string, string][] = [
      [1, 'x', 'running_amps', 'Enter a number, like 12 or 0.5.'],
      [2, '0.1', 'stall_amps', 'Stall current cannot be below the running current.'],
      [3, '61', 'rated_volts', 'Must be 60 V or less.'],
      [4, '0', 'top_speed_kmh', 'Must be more than 0 km/h.'],
      [5, '12', 'start_volts', 'The start voltage must be below the rated voltage.'],
    ];
    for (const [i, value, column, message] of cases) {
      const cells = heron.map((c, j) => (j === i ? value : c));
      const { preview, changes } = plan('locomotives', `${header}${cells.join(',')}\r\n`);
      expect(preview.issues, column).toEqual([{ row: 2, column, message }]);
      expect(preview.rows, column).toEqual([{ row: 2, label: 'Heron', action: 'error' }]);
      expect(changes.changes).toEqual([]);
    }
  });

  it('refuses a name twice in the file, ignoring case', () => {
    const { preview } = plan('locomotives', `${header}Plover,0.2,0.6,12,60,\r\nPLOVER,0.2,0.6,12,60,\r\n`);
    expect(preview.issues).toEqual([{ row: 3, column: 'name', message: 'The locomotive “PLOVER” is already on row 2 of this file.' }]);
    expect(preview.rows.map((r) => `${r.label} ${r.action}`)).toEqual(['Plover create', 'PLOVER error']);
    expect(plan('locomotives', `${header}Plover,0.2,0.6,12,60,\r\nPLOVER,0.2,0.6,12,60,\r\n`).changes.changes).toHaveLength(1);
  });
});

describe('planning trains', () => {
  const header = 'name,locomotives,lighting_amps,length,unit,accel_kmh_per_s,braking_kmh_per_s\r\n';
  const stopper = ['Stopper', 'Kestrel', '0.1', '300', 'mm', '2', '3'];

  it('leaves an equal row, and updates on any one field or the consist changed', () => {
    const same = plan('trains', `${header}Goods,heron ; KESTREL;,0,50,cm,,\r\n${stopper.join(',')}\r\n`);
    expect(same.preview.issues).toEqual([]);
    expect(same.preview.rows.map((r) => `${r.label} ${r.action}`)).toEqual(['Goods unchanged', 'Stopper unchanged']);
    expect(same.changes.changes).toEqual([]);
    const edits: [number, string][] = [[0, 'stopper'], [1, 'Heron'], [1, 'Kestrel;Heron'], [2, '0.2'], [3, '301'], [5, '2.5'], [6, '4'], [6, '']];
    for (const [at, value] of edits) {
      const cells = stopper.map((c, i) => (i === at ? value : c));
      const { changes, preview } = plan('trains', `${header}${cells.join(',')}\r\n`);
      expect(preview.rows, cells.join(',')).toEqual([{ row: 2, label: cells[0], action: 'update' }]);
      expect(changes.changes, cells.join(',')).toEqual([
        {
          action: 'update',
          id: 't-stopper',
          version: 4,
          values: {
            name: cells[0],
            locomotiveIds: cells[1]!.split(';').map((n) => (n === 'Heron' ? 'o-heron' : 'o-kestrel')),
            lightingAmps: Number(cells[2]),
            lengthMm: Number(cells[3]),
            accelKmhPerS: Number(cells[5]),
            brakingKmhPerS: cells[6] === '' ? null : Number(cells[6]),
          },
        },
      ]);
    }
    // Goods runs Heron then Kestrel: the same locomotives in another order are another consist.
    const reordered = plan('trains', `${header}Goods,Kestrel;Heron,0,500,mm,,\r\n`);
    expect(reordered.preview.rows).toEqual([{ row: 2, label: 'Goods', action: 'update' }]);
    const added = plan('trains', `${header}Mail,Heron,,1,m,,\r\n`);
    expect(added.changes.changes).toEqual([{ action: 'create', values: { name: 'Mail', locomotiveIds: ['o-heron'], lightingAmps: 0, lengthMm: 1000, accelKmhPerS: null, brakingKmhPerS: null } }]);
    expect(added.preview.rows).toEqual([{ row: 2, label: 'Mail', action: 'create' }]);
  });

  it('a consist of the same length with one locomotive changed is another consist', () => {
    const l = layout();
    l.locomotives.push({ id: 'o-plover', name: 'Plover', runningAmps: 0.2, stallAmps: 0.6, ratedVolts: 12, topSpeedKmh: 60, startVolts: null, version: 1 });
    const { preview, changes } = plan('trains', `${header}Goods,Heron;Plover,0,500,mm,,\r\n`, l);
    expect(preview.rows).toEqual([{ row: 2, label: 'Goods', action: 'update' }]);
    expect(changes.changes).toMatchObject([{ action: 'update', id: 't-goods', values: { locomotiveIds: ['o-heron', 'o-plover'] } }]);
  });

  it('a stored train without a consist is updated when the file gives it one', () => {
    const l = layout();
    l.consists = l.consists.filter((c) => c.trainId !== 't-stopper');
    expect(plan('trains', `${header}${stopper.join(',')}\r\n`, l).preview.rows).toEqual([{ row: 2, label: 'Stopper', action: 'update' }]);
  });

  it('names unknown locomotives as typed, trimmed, in one issue', () => {
    const { preview, changes } = plan('trains', `${header}Mail,Heron; Ghost ;Wraith,,1,m,,\r\n`);
    expect(preview.issues).toEqual([
      { row: 2, column: 'locomotives', message: 'No locomotive named “Ghost”, “Wraith” in this layout (import locomotives first; separate names with “;”).' },
    ]);
    expect(preview.rows).toEqual([{ row: 2, label: 'Mail', action: 'error' }]);
    expect(changes.changes).toEqual([]);
  });

  it('names each bad cell by its CSV column, one at a time', () => {
    const cases: [number, string, string, string][] = [
      [1, 'Kestrel;kestrel', 'locomotives', 'A locomotive can be in a consist once only.'],
      [1, '', 'locomotives', 'A train needs at least one locomotive.'],
      [2, '-1', 'lighting_amps', 'Must be 0 A or more.'],
      [3, '0', 'length', 'Must be more than 0.'],
      [5, '0', 'accel_kmh_per_s', 'Must be more than 0 km/h per second.'],
      [6, '101', 'braking_kmh_per_s', 'Must be 100 km/h per second or less.'],
    ];
    for (const [i, value, column, message] of cases) {
      const cells = stopper.map((c, j) => (j === i ? value : c));
      const { preview, changes } = plan('trains', `${header}${cells.join(',')}\r\n`);
      expect(preview.issues, `${column} ${value}`).toEqual([{ row: 2, column, message }]);
      expect(preview.rows, column).toEqual([{ row: 2, label: 'Stopper', action: 'error' }]);
      expect(changes.changes).toEqual([]);
    }
  });

  it('refuses a name twice in the file, ignoring case', () => {
    const { preview } = plan('trains', `${header}Mail,Heron,,1,m,,\r\nmail,Heron,,1,m,,\r\n`);
    expect(preview.issues).toEqual([{ row: 3, column: 'name', message: 'The train “mail” is already on row 2 of this file.' }]);
    expect(preview.rows.map((r) => `${r.label} ${r.action}`)).toEqual(['Mail create', 'mail error']);
    expect(plan('trains', `${header}Mail,Heron,,1,m,,\r\nmail,Heron,,1,m,,\r\n`).changes.changes).toHaveLength(1);
  });
});

describe('committing an import', () => {
  const header = 'name,length,unit\r\n';

  it('imports nothing when the file has problems, counting them and giving each one’s place', () => {
    const one = thrown(() => I.commitCsvImport('lay-1', 'blocks', `${header}A,1,mm\r\nB,x,mm\r\n`, 'any', rows()));
    expect(one.message).toBe('Nothing was imported: 1 problem in the file (first on row 3).');
    expect(one).toMatchObject({
      code: 'bad_request',
      status: 400,
      extra: { issues: [{ path: 'row 3, length', message: 'Enter a number, like 12 or 0.5.' }] },
    });
    const two = thrown(() => I.commitCsvImport('lay-1', 'blocks', `${header}A,1,mm,9\r\nB,x,mm\r\n`, 'any', rows()));
    expect(two.message).toBe('Nothing was imported: 2 problems in the file (first on row 2).');
    expect(two).toMatchObject({
      extra: { issues: [{ path: 'row 2', message: 'This row has 4 cells; the header has 3.' }, { path: 'row 3, length', message: 'Enter a number, like 12 or 0.5.' }] },
    });
    expect(db.applyCsvChanges).not.toHaveBeenCalled();
  });

  it('refuses (409) a basis other than the preview’s, giving the current one', () => {
    const { basis } = plan('blocks', `${header}A,1,mm\r\n`).preview;
    const stale = thrown(() => I.commitCsvImport('lay-1', 'blocks', `${header}A,1,mm\r\n`, `${basis}0`, rows()));
    expect(stale).toMatchObject({ code: 'conflict', status: 409, extra: { current: { basis } } });
    expect(stale.message).toBe('Someone else changed this since you opened it. Reload to see their version, then edit again.');
    expect(db.applyCsvChanges).not.toHaveBeenCalled();
  });

  it('writes the planned changes and answers the preview', () => {
    const text = `${header}A,1,mm\r\n`;
    const { changes, preview } = plan('blocks', text);
    expect(I.commitCsvImport('lay-1', 'blocks', text, preview.basis, rows())).toEqual(preview);
    expect(db.applyCsvChanges).toHaveBeenCalledExactlyOnceWith('lay-1', changes);
  });

  it('answers a row changed under the import as a conflict with that row, and passes other failures on', () => {
    const text = `${header}A,1,mm\r\n`;
    const { basis } = plan('blocks', text).preview;
    vi.mocked(db.applyCsvChanges).mockImplementationOnce(() => {
      throw new db.StaleRowError({ id: 'b-yard', version: 2 });
    });
    expect(thrown(() => I.commitCsvImport('lay-1', 'blocks', text, basis, rows()))).toMatchObject({ code: 'conflict', extra: { current: { id: 'b-yard', version: 2 } } });
    const disk = new Error('disk full');
    vi.mocked(db.applyCsvChanges).mockImplementationOnce(() => {
      throw disk;
    });
    expect(thrown(() => I.commitCsvImport('lay-1', 'blocks', text, basis, rows()))).toBe(disk);
  });
});
