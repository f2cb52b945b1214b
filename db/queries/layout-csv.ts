import 'server-only';
import { writeTransaction } from '@/db';
import * as t from '@/db/schema';
import type { BlockValues } from './layout-blocks';
import { updateVersionedRow } from './layout-rows';
import type { LocomotiveValues, TrainValues } from './layout-stock';
import { setConsist } from './layout-stock';

export type CsvChange<V> = { action: 'create' } & { values: V } | { action: 'update'; id: string; version: number; values: V };

export type CsvChanges =
  | { table: 'blocks'; changes: CsvChange<BlockValues>[] }
  | { table: 'links'; changes: CsvChange<{ blockAId: string; blockBId: string; blockAEnd: 'a' | 'b'; blockBEnd: 'a' | 'b' }>[] }
  | { table: 'locomotives'; changes: CsvChange<LocomotiveValues>[] }
  | { table: 'trains'; changes: CsvChange<TrainValues & { locomotiveIds: string[] }>[] };

/** Thrown inside the transaction when a row changed under the import; nothing is kept. */
export class StaleRowError extends Error {
  constructor(readonly current: unknown) {
    super('stale row');
  }
}

/** Writes every change of one CSV import in one transaction: all of them or none. */
export function applyCsvChanges(layoutId: string, input: CsvChanges): void {
  writeTransaction((tx) => {
    const update = <T extends typeof t.blocks | typeof t.locomotives | typeof t.trains>(table: T, id: string, version: number, values: Partial<T['$inferInsert']>) => {
      const result = updateVersionedRow(table, layoutId, id, version, values, tx);
      if (!result.ok) throw new StaleRowError(result.reason === 'stale' ? result.current : null);
      return result.row;
    };
    switch (input.table) {
      case 'blocks':
        for (const c of input.changes) {
          if (c.action === 'create') tx.insert(t.blocks).values({ ...c.values, layoutId }).run();
          else update(t.blocks, c.id, c.version, c.values);
        }
        break;
      case 'links':
        for (const c of input.changes) if (c.action === 'create') tx.insert(t.links).values({ ...c.values, layoutId }).run();
        break;
      case 'locomotives':
        for (const c of input.changes) {
          if (c.action === 'create') tx.insert(t.locomotives).values({ ...c.values, layoutId }).run();
          else update(t.locomotives, c.id, c.version, c.values);
        }
        break;
      case 'trains':
        for (const c of input.changes) {
          const { locomotiveIds, ...values } = c.values;
          const id =
            c.action === 'create'
              ? tx.insert(t.trains).values({ ...values, layoutId }).returning({ id: t.trains.id }).get().id
              : update(t.trains, c.id, c.version, values).id;
          setConsist(id, locomotiveIds, tx);
        }
        break;
    }
  });
}
