import 'server-only';
import { createHash } from 'node:crypto';
import type { z } from 'zod';
import { applyCsvChanges, StaleRowError, type CsvChange, type CsvChanges } from '@/db/queries/layout-csv';
import type { LocomotiveValues } from '@/db/queries/layout-stock';
import { loadLayoutRows } from '@/db/queries/plan-data';
import { AppError, conflict } from '@/lib/errors';
import { CONSIST_SEPARATOR, readCsv, toCsv, type CsvIssue } from '@/lib/layouts/csv';
import { blockSchema, linkSchema, locomotiveSchema, trainSchema, type CsvTable } from '@/lib/validations/layout';

type LayoutRows = ReturnType<typeof loadLayoutRows>;

/** One row of the preview: what importing it would do. */
export type CsvPreviewRow = { row: number; label: string; action: 'create' | 'update' | 'unchanged' | 'error' };

export type CsvPreview = {
  table: CsvTable;
  rows: CsvPreviewRow[];
  issues: CsvIssue[];
  counts: { create: number; update: number; unchanged: number; error: number };
  /** Identifies the table's rows the preview was made against; a commit with another basis is stale. */
  basis: string;
};

const lower = (s: string) => s.trim().toLowerCase();

/** The layout's rows of one table as CSV, in the form the import reads back. */
export function exportCsv(table: CsvTable, rows: LayoutRows): string {
  const blockName = new Map(rows.blocks.map((b) => [b.id, b.name]));
  const locomotiveName = new Map(rows.locomotives.map((l) => [l.id, l.name]));
  switch (table) {
    case 'blocks':
      return toCsv(table, rows.blocks.map((b) => ({ name: b.name, length: b.lengthMm, unit: 'mm', position: b.positionMm })));
    case 'links':
      return toCsv(
        table,
        rows.links.map((l) => ({
          block_a: blockName.get(l.blockAId) ?? '',
          block_b: blockName.get(l.blockBId) ?? '',
          block_a_end: l.blockAEnd,
          block_b_end: l.blockBEnd,
        })),
      );
    case 'locomotives':
      return toCsv(
        table,
        rows.locomotives.map((l) => ({
          name: l.name,
          running_amps: l.runningAmps,
          stall_amps: l.stallAmps,
          rated_volts: l.ratedVolts,
          top_speed_kmh: l.topSpeedKmh,
          start_volts: l.startVolts ?? '',
        })),
      );
    case 'trains': {
      const consist = new Map<string, string[]>();
      for (const c of rows.consists) consist.set(c.trainId, [...(consist.get(c.trainId) ?? []), locomotiveName.get(c.locomotiveId) ?? '']);
      return toCsv(
        table,
        rows.trains.map((tr) => ({
          name: tr.name,
          locomotives: (consist.get(tr.id) ?? []).join(`${CONSIST_SEPARATOR} `),
          lighting_amps: tr.lightingAmps,
          length: tr.lengthMm,
          unit: 'mm',
          accel_kmh_per_s: tr.accelKmhPerS ?? '',
          braking_kmh_per_s: tr.brakingKmhPerS ?? '',
        })),
      );
    }
  }
}

function basisOf(table: CsvTable, rows: LayoutRows): string {
  const list =
    table === 'links'
      ? [...rows.links.map((l) => l.id), ...rows.blocks.map((b) => `${b.id}:${b.version}`)]
      : table === 'trains'
        ? [...rows.trains.map((r) => `${r.id}:${r.version}`), ...rows.locomotives.map((l) => `${l.id}:${l.version}`)]
        : rows[table].map((r) => `${r.id}:${r.version}`);
  return createHash('sha256').update(list.sort().join('|')).digest('hex').slice(0, 20);
}

/** zod issues of one row as CSV issues, named by the CSV column. */
function cellIssues(row: number, error: z.ZodError, columnOf: Record<string, string>): CsvIssue[] {
  return error.issues.map((issue) => {
    const key = String(issue.path[0] ?? '');
    return { row, column: columnOf[key] ?? key, message: issue.message };
  });
}

type Planned = { changes: CsvChanges; preview: CsvPreview };

/**
 * Checks every row of a CSV file against the layout and works out what importing it would do:
 * rows whose name matches an existing row (ignoring case) update it, others are added, rows equal
 * to what is stored are left alone. Nothing is written here.
 */
export function planCsvImport(table: CsvTable, text: string, rows: LayoutRows): Planned {
  const { records, issues } = readCsv(table, text);
  const previewRows: CsvPreviewRow[] = [];
  const seen = new Map<string, number>();
  const duplicate = (row: number, key: string, column: string, what: string) => {
    const first = seen.get(key);
    if (first !== undefined) {
      issues.push({ row, column, message: `${what} is already on row ${first} of this file.` });
      return true;
    }
    seen.set(key, row);
    return false;
  };
  const push = (row: number, label: string, action: CsvPreviewRow['action']) => previewRows.push({ row, label, action });
  let changes: CsvChanges;
  if (issues.some((i) => i.row === 1)) {
    // With the header wrong every row would fail for the same reason; say it once.
    return { changes: { table, changes: [] } as CsvChanges, preview: { table, rows: [], issues, counts: { create: 0, update: 0, unchanged: 0, error: 0 }, basis: basisOf(table, rows) } };
  }

  switch (table) {
    case 'blocks': {
      const existing = new Map(rows.blocks.map((b) => [lower(b.name), b]));
      const list: CsvChange<{ name: string; lengthMm: number; positionMm: number }>[] = [];
      for (const { row, cells } of records) {
        const parsed = blockSchema.safeParse({ name: cells.name, length: cells.length, unit: cells.unit, position: cells.position });
        if (!parsed.success) {
          issues.push(...cellIssues(row, parsed.error, {}));
          push(row, cells.name ?? '', 'error');
          continue;
        }
        const v = parsed.data;
        if (duplicate(row, lower(v.name), 'name', `The block “${v.name}”`)) {
          push(row, v.name, 'error');
          continue;
        }
        const old = existing.get(lower(v.name));
        if (!old) list.push({ action: 'create', values: v });
        else if (old.name !== v.name || old.lengthMm !== v.lengthMm || old.positionMm !== v.positionMm) {
          list.push({ action: 'update', id: old.id, version: old.version, values: v });
        }
        push(row, v.name, !old ? 'create' : old.name !== v.name || old.lengthMm !== v.lengthMm || old.positionMm !== v.positionMm ? 'update' : 'unchanged');
      }
      changes = { table, changes: list };
      break;
    }
    case 'links': {
      const blockByName = new Map(rows.blocks.map((b) => [lower(b.name), b]));
      // One link per rail joint: an end of one block against an end of another, either way round.
      const joint = (aId: string, aEnd: string, bId: string, bEnd: string) => [`${aId}:${aEnd}`, `${bId}:${bEnd}`].sort().join('|');
      const linked = new Set(rows.links.map((l) => joint(l.blockAId, l.blockAEnd, l.blockBId, l.blockBEnd)));
      const list: CsvChange<{ blockAId: string; blockBId: string; blockAEnd: 'a' | 'b'; blockBEnd: 'a' | 'b' }>[] = [];
      for (const { row, cells } of records) {
        const label = `${cells.block_a ?? ''} — ${cells.block_b ?? ''}`;
        const a = blockByName.get(lower(cells.block_a ?? ''));
        const b = blockByName.get(lower(cells.block_b ?? ''));
        let bad = false;
        for (const [column, name, block] of [['block_a', cells.block_a, a], ['block_b', cells.block_b, b]] as const) {
          if (!name) {
            issues.push({ row, column, message: 'Enter a block name.' });
            bad = true;
          } else if (!block) {
            issues.push({ row, column, message: `There is no block named “${name}” in this layout (import blocks first).` });
            bad = true;
          }
        }
        if (bad || !a || !b) {
          push(row, label, 'error');
          continue;
        }
        // A blank end is what the upgrade to track with ends gave an old link (drizzle/0009): along the
        // line's position order, the block further along meets the other at its a end; equal positions
        // keep block_a's b end to block_b's a end.
        const aFurther = a.positionMm > b.positionMm;
        const endCell = (cell: string | undefined, fallback: 'a' | 'b') => (cell === undefined || cell.trim() === '' ? fallback : lower(cell));
        const parsed = linkSchema.safeParse({
          blockAId: a.id,
          blockBId: b.id,
          blockAEnd: endCell(cells.block_a_end, aFurther ? 'a' : 'b'),
          blockBEnd: endCell(cells.block_b_end, aFurther ? 'b' : 'a'),
        });
        if (!parsed.success) {
          issues.push(...cellIssues(row, parsed.error, { blockBId: 'block_b', blockAId: 'block_a', blockAEnd: 'block_a_end', blockBEnd: 'block_b_end' }));
          push(row, label, 'error');
          continue;
        }
        const v = parsed.data;
        const key = joint(v.blockAId, v.blockAEnd, v.blockBId, v.blockBEnd);
        const named = `“${a.name}” (${v.blockAEnd} end) — “${b.name}” (${v.blockBEnd} end)`;
        if (duplicate(row, key, 'block_b', `The link ${named}`)) {
          push(row, label, 'error');
          continue;
        }
        const exists = linked.has(key);
        if (!exists) list.push({ action: 'create', values: v });
        push(row, `${a.name} (${v.blockAEnd}) — ${b.name} (${v.blockBEnd})`, exists ? 'unchanged' : 'create');
      }
      changes = { table, changes: list };
      break;
    }
    case 'locomotives': {
      const existing = new Map(rows.locomotives.map((l) => [lower(l.name), l]));
      const list: CsvChange<LocomotiveValues>[] = [];
      const columnOf = { runningAmps: 'running_amps', stallAmps: 'stall_amps', ratedVolts: 'rated_volts', topSpeedKmh: 'top_speed_kmh', startVolts: 'start_volts' };
      for (const { row, cells } of records) {
        const parsed = locomotiveSchema.safeParse({
          name: cells.name,
          runningAmps: cells.running_amps,
          stallAmps: cells.stall_amps,
          ratedVolts: cells.rated_volts,
          topSpeedKmh: cells.top_speed_kmh,
          startVolts: cells.start_volts,
        });
        if (!parsed.success) {
          issues.push(...cellIssues(row, parsed.error, columnOf));
          push(row, cells.name ?? '', 'error');
          continue;
        }
        const v = parsed.data;
        if (duplicate(row, lower(v.name), 'name', `The locomotive “${v.name}”`)) {
          push(row, v.name, 'error');
          continue;
        }
        const old = existing.get(lower(v.name));
        const same = old && old.name === v.name && old.runningAmps === v.runningAmps && old.stallAmps === v.stallAmps && old.ratedVolts === v.ratedVolts && old.topSpeedKmh === v.topSpeedKmh && (old.startVolts ?? null) === v.startVolts;
        if (!old) list.push({ action: 'create', values: v });
        else if (!same) list.push({ action: 'update', id: old.id, version: old.version, values: v });
        push(row, v.name, !old ? 'create' : same ? 'unchanged' : 'update');
      }
      changes = { table, changes: list };
      break;
    }
    case 'trains': {
      const existing = new Map(rows.trains.map((tr) => [lower(tr.name), tr]));
      const locomotiveByName = new Map(rows.locomotives.map((l) => [lower(l.name), l]));
      const consist = new Map<string, string[]>();
      for (const c of rows.consists) consist.set(c.trainId, [...(consist.get(c.trainId) ?? []), c.locomotiveId]);
      const list: CsvChange<{ name: string; lightingAmps: number; lengthMm: number; accelKmhPerS: number | null; brakingKmhPerS: number | null; locomotiveIds: string[] }>[] = [];
      for (const { row, cells } of records) {
        const names = (cells.locomotives ?? '').split(CONSIST_SEPARATOR).map((n) => n.trim()).filter(Boolean);
        const unknown = names.filter((n) => !locomotiveByName.has(lower(n)));
        if (unknown.length) {
          issues.push({
            row,
            column: 'locomotives',
            message: `No locomotive named ${unknown.map((n) => `“${n}”`).join(', ')} in this layout (import locomotives first; separate names with “;”).`,
          });
        }
        const parsed = trainSchema.safeParse({
          name: cells.name,
          locomotiveIds: names.map((n) => locomotiveByName.get(lower(n))?.id ?? n),
          lightingAmps: cells.lighting_amps,
          length: cells.length,
          unit: cells.unit,
          accelKmhPerS: cells.accel_kmh_per_s,
          brakingKmhPerS: cells.braking_kmh_per_s,
        });
        if (!parsed.success) {
          issues.push(...cellIssues(row, parsed.error, { locomotiveIds: 'locomotives', lightingAmps: 'lighting_amps', accelKmhPerS: 'accel_kmh_per_s', brakingKmhPerS: 'braking_kmh_per_s' }));
        }
        if (!parsed.success || unknown.length) {
          push(row, cells.name ?? '', 'error');
          continue;
        }
        const v = parsed.data;
        if (duplicate(row, lower(v.name), 'name', `The train “${v.name}”`)) {
          push(row, v.name, 'error');
          continue;
        }
        const old = existing.get(lower(v.name));
        const oldConsist = old ? (consist.get(old.id) ?? []) : [];
        const same =
          old && old.name === v.name && old.lightingAmps === v.lightingAmps && old.lengthMm === v.lengthMm &&
          old.accelKmhPerS === v.accelKmhPerS && old.brakingKmhPerS === v.brakingKmhPerS &&
          oldConsist.length === v.locomotiveIds.length && oldConsist.every((id, i) => id === v.locomotiveIds[i]);
        if (!old) list.push({ action: 'create', values: v });
        else if (!same) list.push({ action: 'update', id: old.id, version: old.version, values: v });
        push(row, v.name, !old ? 'create' : same ? 'unchanged' : 'update');
      }
      changes = { table, changes: list };
      break;
    }
  }

  issues.sort((x, y) => x.row - y.row);
  const errorRows = new Set(issues.map((i) => i.row));
  for (const r of previewRows) if (errorRows.has(r.row)) r.action = 'error';
  const counts = { create: 0, update: 0, unchanged: 0, error: 0 };
  for (const r of previewRows) counts[r.action] += 1;
  if (records.length === 0 && issues.length === 0) issues.push({ row: 2, column: '', message: 'The file has a header but no rows.' });
  return { changes, preview: { table, rows: previewRows, issues, counts, basis: basisOf(table, rows) } };
}

/**
 * Imports a CSV file if every row is valid and the table has not changed since the preview with
 * `basis` (409 otherwise); writes in one transaction. Answers the preview of what was done.
 */
export function commitCsvImport(layoutId: string, table: CsvTable, text: string, basis: string, rows: LayoutRows): CsvPreview {
  const { changes, preview } = planCsvImport(table, text, rows);
  if (preview.issues.length) {
    throw new AppError('bad_request', `Nothing was imported: ${preview.issues.length} problem${preview.issues.length === 1 ? '' : 's'} in the file (first on row ${preview.issues[0]!.row}).`, {
      issues: preview.issues.map((i) => ({ path: `row ${i.row}${i.column ? `, ${i.column}` : ''}`, message: i.message })),
    });
  }
  if (basis !== preview.basis) throw conflict({ basis: preview.basis });
  try {
    applyCsvChanges(layoutId, changes);
  } catch (error) {
    if (error instanceof StaleRowError) throw conflict(error.current);
    throw error;
  }
  return preview;
}
