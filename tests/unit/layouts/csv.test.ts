// Reading and writing the layout's CSV files (lib/layouts/csv.ts), cell by cell: RFC 4180 quoting and
// line ends, the header's columns, blank lines, a BOM, the file's limits and each issue's message and
// place. The module is loaded again inside each test (vi.resetModules, then import): its column table
// and formula pattern are built when the module is evaluated, and a module imported at the top of this
// file would be built before a mutation test run switches a change on (Stryker's Vitest runner does
// that in a beforeAll). Limits come from the tests' own table (tests/shared/expected-bounds.ts).
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { AppError } from '@/lib/errors';
import { CSV_LIMITS } from '../../shared/expected-bounds';

type Csv = typeof import('@/lib/layouts/csv');
let C: Csv;

beforeEach(async () => {
  vi.resetModules();
  C = await import('@/lib/layouts/csv');
});

/** The error a call throws; fails when it does not throw. */
function thrown(call: () => unknown): AppError {
  try {
    call();
  } catch (error) {
    expect(error).toBeInstanceOf(Error);
    return error as AppError;
  }
  throw new Error('expected the call to throw');
}

const BLOCKS = 'name,length,unit,position';

describe('the columns of each file', () => {
  it('names each table’s columns in order, which are required, and what each holds', () => {
    // The file format the import screen documents; a change here changes every exported file.
    expect(C.CSV_COLUMNS).toEqual({
      blocks: [
        { name: 'name', required: true, help: 'unique within the layout' },
        { name: 'length', required: true, help: 'in the unit of the row' },
        { name: 'unit', required: true, help: 'mm, cm, m, in or ft' },
        { name: 'position', required: false, help: 'start along the line, same unit; blank is 0' },
      ],
      links: [
        { name: 'block_a', required: true, help: 'a block name' },
        { name: 'block_b', required: true, help: 'another block name' },
        { name: 'block_a_end', required: false, help: "a or b, block_a's end at the joint; blank: by position, the block further along meets at its a end, the other at its b end" },
        { name: 'block_b_end', required: false, help: "a or b, block_b's end at the joint; blank: by position, as for block_a_end" },
      ],
      locomotives: [
        { name: 'name', required: true, help: 'unique within the layout' },
        { name: 'running_amps', required: true, help: 'A' },
        { name: 'stall_amps', required: true, help: 'A' },
        { name: 'rated_volts', required: true, help: 'V' },
        { name: 'top_speed_kmh', required: true, help: 'scale km/h at rated volts' },
        { name: 'start_volts', required: false, help: 'V at which it starts to move; blank if not measured' },
      ],
      trains: [
        { name: 'name', required: true, help: 'unique within the layout' },
        { name: 'locomotives', required: true, help: 'locomotive names separated by ;' },
        { name: 'lighting_amps', required: false, help: 'A; blank is 0' },
        { name: 'length', required: true, help: 'in the unit of the row' },
        { name: 'unit', required: true, help: 'mm, cm, m, in or ft' },
        { name: 'accel_kmh_per_s', required: false, help: 'scale km/h per second from a stand; blank is common practice for the scale' },
        { name: 'braking_kmh_per_s', required: false, help: 'scale km/h per second when stopping; blank is common practice for the scale' },
      ],
    });
    expect(C.CONSIST_SEPARATOR).toBe(';');
  });

  it('takes a header of the required columns alone, and names each missing one with its help', () => {
    const required = { blocks: ['name', 'length', 'unit'], links: ['block_a', 'block_b'], locomotives: ['name', 'running_amps', 'stall_amps', 'rated_volts', 'top_speed_kmh'], trains: ['name', 'locomotives', 'length', 'unit'] } as const;
    for (const [table, names] of Object.entries(required) as [keyof typeof required, readonly string[]][]) {
      expect(C.readCsv(table, `${names.join(',')}\r\n`).issues, table).toEqual([]);
      for (const missing of names) {
        const help = C.CSV_COLUMNS[table].find((c) => c.name === missing)!.help;
        const header = names.filter((n) => n !== missing).join(',');
        expect(C.readCsv(table, `${header}\r\n`).issues, `${table} without ${missing}`).toEqual([{ row: 1, column: missing, message: `The column “${missing}” is missing (${help}).` }]);
      }
    }
    expect(C.readCsv('blocks', 'name\nA').issues).toEqual([
      { row: 1, column: 'length', message: 'The column “length” is missing (in the unit of the row).' },
      { row: 1, column: 'unit', message: 'The column “unit” is missing (mm, cm, m, in or ft).' },
    ]);
  });

  it('reads header names whatever their case and surrounding spaces', () => {
    const { records, issues } = C.readCsv('blocks', ' Name ,LENGTH, unit\r\nA,10,mm\r\n');
    expect(issues).toEqual([]);
    expect(records).toEqual([{ row: 2, cells: { name: 'A', length: '10', unit: 'mm' } }]);
  });

  it('refuses an unknown column, a blank one by its place, and a column named twice', () => {
    const list = 'name, length, unit, position';
    expect(C.readCsv('blocks', 'name,length,unit,colour,,name\r\n').issues).toEqual([
      { row: 1, column: 'colour', message: `Unknown column “colour”; the columns are ${list}.` },
      { row: 1, column: 'column 5', message: `Unknown column “”; the columns are ${list}.` },
      { row: 1, column: 'name', message: 'The column “name” appears twice.' },
    ]);
  });

  it('an empty file, or a header of blank cells, says what the header must be and reads no rows', () => {
    for (const text of ['', '\r\n', ' , ,\r\nA,1,mm\r\n']) {
      expect(C.readCsv('blocks', text), JSON.stringify(text)).toEqual({
        records: [],
        issues: [{ row: 1, column: '', message: 'The file is empty. The first row must name the columns: name, length, unit, position.' }],
      });
    }
  });
});

describe('rows and cells', () => {
  it('reads CRLF and LF line ends alike and numbers rows as a spreadsheet does (header row 1)', () => {
    // RFC 4180 §2.1: records end with CRLF; a file saved on Unix ends lines with LF alone.
    const crlf = C.readCsv('blocks', `${BLOCKS}\r\nA,10,mm,0\r\nB,20,cm,5\r\n`);
    const lf = C.readCsv('blocks', `${BLOCKS}\nA,10,mm,0\nB,20,cm,5\n`);
    const expected = [
      { row: 2, cells: { name: 'A', length: '10', unit: 'mm', position: '0' } },
      { row: 3, cells: { name: 'B', length: '20', unit: 'cm', position: '5' } },
    ];
    expect(crlf).toEqual({ records: expected, issues: [] });
    expect(lf).toEqual({ records: expected, issues: [] });
  });

  it('skips blank lines and lines of blank cells, keeping the numbers of the rows after them', () => {
    const { records, issues } = C.readCsv('blocks', `${BLOCKS}\r\n\r\n , , , \r\nA,10,mm,0\r\n`);
    expect(issues).toEqual([]);
    expect(records).toEqual([{ row: 4, cells: { name: 'A', length: '10', unit: 'mm', position: '0' } }]);
  });

  it('trims the spaces round each cell and gives a short row’s missing cells as blank', () => {
    const { records, issues } = C.readCsv('blocks', `${BLOCKS}\r\n  A  , 10 ,mm\r\n`);
    expect(records).toEqual([{ row: 2, cells: { name: 'A', length: '10', unit: 'mm', position: '' } }]);
    expect(issues).toEqual([{ row: 2, column: '', message: 'This row has 3 cells; the header has 4.' }]);
  });

  it('unquotes RFC 4180 fields: commas, doubled quotes and line breaks inside quotes', () => {
    // RFC 4180 §2.5–2.7: a field in double quotes may hold commas, CRLF and "" for one quote.
    const { records, issues } = C.readCsv('blocks', `${BLOCKS}\r\n"Yard, east","1""0","m\r\nm",\r\n`);
    expect(issues).toEqual([]);
    expect(records).toEqual([{ row: 2, cells: { name: 'Yard, east', length: '1"0', unit: 'm\r\nm', position: '' } }]);
  });

  it('reports an unterminated quote on its row, and no ragged-row issue for that row', () => {
    // RFC 4180 §2.5: a field that opens with a double quote must close with one.
    const { records, issues } = C.readCsv('blocks', 'name,length,unit\nA,1,mm\n"B,2,mm\n');
    expect(issues).toEqual([{ row: 3, column: '', message: 'The CSV is malformed here: Quoted field unterminated.' }]);
    expect(records.map((r) => r.row)).toEqual([2, 3]);
  });

  it('does not report the parser’s delimiter guess as a problem', () => {
    // A one-column file gives the parser nothing to guess the delimiter from; it falls back to ','.
    expect(C.readCsv('blocks', 'name,length,unit\r\nA,1,mm\r\n').issues).toEqual([]);
    expect(C.readCsv('blocks', 'name\nA').issues.some((i) => /malformed/.test(i.message))).toBe(false);
  });

  it('drops a leading BOM only, keeping one inside a cell', () => {
    // Unicode §23.8: U+FEFF at the start of a UTF-8 file is a byte order mark, inside text a character.
    expect(C.readCsv('blocks', '\uFEFFname,length,unit\r\nA,1,mm\r\n')).toEqual({ records: [{ row: 2, cells: { name: 'A', length: '1', unit: 'mm' } }], issues: [] });
    expect(C.readCsv('blocks', 'name,length,unit\r\nA\uFEFFB,1,mm\r\n').records[0]!.cells.name).toBe('A\uFEFFB');
  });
});

describe('formula-like cells', () => {
  it('prefixes a quote to text a spreadsheet would run as a formula, and takes it off again on import', () => {
    // OWASP, "CSV Injection": cells starting =, +, -, @, tab or CR are run by spreadsheets; the escaped
    // cell is quoted (RFC 4180 §2.6 allows quotes round any field).
    const rows = ['=SUM(A1)', '+1', '-2', '@x', '\tT', "'=x", 'a=b', 'Plain'].map((name) => ({ name, length: 1, unit: 'mm', position: 0 }));
    const text = C.toCsv('blocks', rows);
    expect(text.split('\r\n').map((l) => l.split(',')[0])).toEqual(['name', `"'=SUM(A1)"`, `"'+1"`, `"'-2"`, `"'@x"`, `"'\tT"`, `"''=x"`, 'a=b', 'Plain']);
    expect(C.readCsv('blocks', text).records.map((r) => r.cells.name)).toEqual(['=SUM(A1)', '+1', '-2', '@x', '\tT', "'=x", 'a=b', 'Plain']);
  });

  it('leaves a quote before ordinary text, and a formula without a quote, as typed', () => {
    const { records } = C.readCsv('blocks', "name,length,unit\r\n'Yard,1,mm\r\n=1+1,2,mm\r\n");
    expect(records.map((r) => r.cells.name)).toEqual(["'Yard", '=1+1']);
  });
});

describe('the file’s limits', () => {
  const header = 'name,length,unit\r\n';

  it(`takes a file of exactly ${CSV_LIMITS.bytes.max} bytes and refuses one byte more (413) with its size`, () => {
    const exact = header + 'x'.repeat(CSV_LIMITS.bytes.max - header.length);
    expect(() => C.readCsv('blocks', exact)).not.toThrow();
    const over = thrown(() => C.readCsv('blocks', `${exact}x`));
    expect(over).toMatchObject({ code: 'too_large', status: 413 });
    expect(over.message).toBe('The file is 1.0 MB; the limit is 1 MB. Split it into smaller files.');
    const larger = thrown(() => C.readCsv('blocks', header + 'x'.repeat(1_240_000)));
    expect(larger.message).toBe('The file is 1.2 MB; the limit is 1 MB. Split it into smaller files.');
  });

  it('counts bytes in UTF-8, not characters', () => {
    // RFC 3629 §3: U+00E9 takes two bytes in UTF-8.
    const chars = header + 'é'.repeat((CSV_LIMITS.bytes.max - header.length) / 2 + 1);
    expect(chars.length).toBeLessThan(CSV_LIMITS.bytes.max);
    expect(thrown(() => C.readCsv('blocks', chars)).message).toBe('The file is 1.0 MB; the limit is 1 MB. Split it into smaller files.');
  });

  it(`takes ${CSV_LIMITS.rows.max} data rows and refuses one more (413), blank lines not counted`, () => {
    const rows = (n: number) => header + Array.from({ length: n }, (_, i) => `B${i},1,mm`).join('\r\n') + '\r\n\r\n\r\n';
    const taken = C.readCsv('blocks', rows(CSV_LIMITS.rows.max));
    expect(taken.records).toHaveLength(CSV_LIMITS.rows.max);
    expect(taken.issues).toEqual([]);
    const over = thrown(() => C.readCsv('blocks', rows(CSV_LIMITS.rows.max + 1)));
    expect(over).toMatchObject({ code: 'too_large', status: 413 });
    expect(over.message).toBe('The file has 5,001 rows; the limit is 5,000. Split it into smaller files.');
  });
});
