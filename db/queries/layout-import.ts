import 'server-only';
import { writeTransaction } from '@/db';
import * as t from '@/db/schema';
import type { LayoutValues } from './layouts';
import type { BlockValues } from './layout-blocks';
import type { CabValues, DriverValues, SupplyValues } from './layout-power';
import type { LocomotiveValues, TrainValues } from './layout-stock';

/** A whole layout keyed by the ids of the file it came from; references use those ids. */
export type LayoutImport = {
  layout: LayoutValues;
  blocks: (BlockValues & { key: string; positiveRail: 'right' | 'left'; reversingSection: boolean; reversingPlace: boolean })[];
  links: { a: string; b: string; aEnd: 'a' | 'b'; bEnd: 'a' | 'b' }[];
  supplies: (SupplyValues & { key: string })[];
  drivers: (DriverValues & { key: string })[];
  cabs: (CabValues & { key: string })[];
  locomotives: (LocomotiveValues & { key: string })[];
  trains: (TrainValues & { key: string; locomotiveIds: string[] })[];
};

/** Creates a layout with everything in it in one transaction, with new ids; answers the layout. */
export function insertLayoutFromImport(railwayId: string, data: LayoutImport) {
  return writeTransaction((tx) => {
    const layout = tx.insert(t.layouts).values({ ...data.layout, railwayId }).returning().get();
    const layoutId = layout.id;
    const ids = new Map<string, string>();
    const keep = (scope: string, key: string, id: string) => ids.set(`${scope}:${key}`, id);
    const idOf = (scope: string, key: string) => {
      const id = ids.get(`${scope}:${key}`);
      if (!id) throw new Error(`import: unresolved ${scope} ${key}`);
      return id;
    };
    for (const { key, ...b } of data.blocks) keep('block', key, tx.insert(t.blocks).values({ ...b, layoutId }).returning({ id: t.blocks.id }).get().id);
    for (const l of data.links) {
      tx.insert(t.links).values({ layoutId, blockAId: idOf('block', l.a), blockBId: idOf('block', l.b), blockAEnd: l.aEnd, blockBEnd: l.bEnd }).run();
    }
    for (const { key, ...s } of data.supplies) keep('supply', key, tx.insert(t.supplies).values({ ...s, layoutId }).returning({ id: t.supplies.id }).get().id);
    for (const { key, ...d } of data.drivers) {
      keep('driver', key, tx.insert(t.drivers).values({ ...d, supplyId: idOf('supply', d.supplyId), layoutId }).returning({ id: t.drivers.id }).get().id);
    }
    for (const { key, ...c } of data.cabs) keep('cab', key, tx.insert(t.cabs).values({ ...c, driverId: idOf('driver', c.driverId), layoutId }).returning({ id: t.cabs.id }).get().id);
    for (const { key, ...l } of data.locomotives) keep('locomotive', key, tx.insert(t.locomotives).values({ ...l, layoutId }).returning({ id: t.locomotives.id }).get().id);
    for (const { key, locomotiveIds, ...tr } of data.trains) {
      const trainId = tx.insert(t.trains).values({ ...tr, layoutId }).returning({ id: t.trains.id }).get().id;
      keep('train', key, trainId);
      locomotiveIds.forEach((locomotiveKey, position) => tx.insert(t.trainLocomotives).values({ trainId, locomotiveId: idOf('locomotive', locomotiveKey), position }).run());
    }
    return layout;
  });
}
