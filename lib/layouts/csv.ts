import Papa from 'papaparse';
import { AppError } from '@/lib/errors';
import { CSV_MAX_BYTES, CSV_MAX_ROWS, type CsvTable } from '@/lib/validations/layout';

/** The columns of each CSV file, in order; the import needs the required ones and refuses others. */
export const CSV_COLUMNS: Record<CsvTable, { name: string; required: boolean; help: string }[]> = {
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
};

/** One problem with one cell (or a whole row, column ''), by spreadsheet row: the header is row 1. */
export type CsvIssue = { row: number; column: string; message: string };

export type CsvRecord = { row: number; cells: Record<string, string> };

/** The separator of locomotives in a train's `locomotives` cell. */
export const CONSIST_SEPARATOR = ';';

/**
 * Text cells a spreadsheet would run as a formula (`=`, `+`, `-`, `@`, tab, carriage return:
 * OWASP, "CSV Injection"), also behind quotes already added, so that unescaping one quote on import
 * gives back exactly what was exported.
 */
const FORMULA_CELL = /^'*[=+\-@\t\r]/;

/** Writes rows as CSV with the table's columns, CRLF line ends (RFC 4180 §2); formula-like text gets a leading `'`. */
export function toCsv(table: CsvTable, rows: Record<string, string | number>[]): string {
  const fields = CSV_COLUMNS[table].map((c) => c.name);
  return Papa.unparse({ fields, data: rows.map((r) => fields.map((f) => r[f] ?? '')) }, { newline: '\r\n', escapeFormulae: FORMULA_CELL });
}

/** A cell as it was before toCsv escaped it (one leading `'` off a formula-like cell). */
function unescapeFormula(cell: string): string {
  return FORMULA_CELL.test(cell) && cell.startsWith("'") ? cell.slice(1) : cell;
}

/**
 * Reads CSV text into records keyed by column name. Refuses (413) a file over 1 MB or 5 000 rows
 * before looking further; answers a header that lacks a required column or has an unknown one as a
 * row-1 issue; skips blank lines (keeping every other row's number).
 */
export function readCsv(table: CsvTable, text: string): { records: CsvRecord[]; issues: CsvIssue[] } {
  const bytes = Buffer.byteLength(text, 'utf8');
  if (bytes > CSV_MAX_BYTES) {
    throw new AppError('too_large', `The file is ${formatBytes(bytes)}; the limit is 1 MB. Split it into smaller files.`);
  }
  const clean = text.replace(/^\uFEFF/, '');
  const parsed = Papa.parse<string[]>(clean, { skipEmptyLines: false });
  // Row i of `lines` is spreadsheet row i + 1 (the header is row 1); blank lines keep their number.
  const lines = parsed.data;
  const isBlank = (line: string[]) => line.every((cell) => cell.trim() === '');
  const dataRows = lines.slice(1).filter((line) => !isBlank(line)).length;
  if (dataRows > CSV_MAX_ROWS) {
    throw new AppError('too_large', `The file has ${dataRows.toLocaleString('en-GB')} rows; the limit is ${CSV_MAX_ROWS.toLocaleString('en-GB')}. Split it into smaller files.`);
  }
  const issues: CsvIssue[] = [];
  const badRows = new Set<number>();
  for (const error of parsed.errors) {
    if (error.code === 'UndetectableDelimiter') continue;
    const row = (error.row ?? 0) + 1;
    badRows.add(row);
    issues.push({ row, column: '', message: `The CSV is malformed here: ${error.message}.` });
  }
  const header = (lines[0] ?? []).map((h) => h.trim().toLowerCase());
  const columns = CSV_COLUMNS[table];
  if (header.every((h) => h === '')) {
    issues.push({ row: 1, column: '', message: `The file is empty. The first row must name the columns: ${columns.map((c) => c.name).join(', ')}.` });
    return { records: [], issues };
  }
  for (const c of columns) {
    if (c.required && !header.includes(c.name)) issues.push({ row: 1, column: c.name, message: `The column “${c.name}” is missing (${c.help}).` });
  }
  header.forEach((h, i) => {
    if (!columns.some((c) => c.name === h)) {
      issues.push({ row: 1, column: h || `column ${i + 1}`, message: `Unknown column “${h}”; the columns are ${columns.map((c) => c.name).join(', ')}.` });
    } else if (header.indexOf(h) !== i) {
      issues.push({ row: 1, column: h, message: `The column “${h}” appears twice.` });
    }
  });
  const records: CsvRecord[] = [];
  lines.forEach((line, i) => {
    const row = i + 1;
    if (i === 0 || isBlank(line)) return;
    if (line.length !== header.length && !badRows.has(row)) {
      issues.push({ row, column: '', message: `This row has ${line.length} cells; the header has ${header.length}.` });
    }
    const cells: Record<string, string> = {};
    header.forEach((h, j) => {
      cells[h] = unescapeFormula((line[j] ?? '').trim());
    });
    records.push({ row, cells });
  });
  return { records, issues };
}

function formatBytes(bytes: number): string {
  return bytes >= 1_000_000 ? `${(bytes / 1_000_000).toFixed(1)} MB` : `${Math.ceil(bytes / 1000)} kB`;
}
