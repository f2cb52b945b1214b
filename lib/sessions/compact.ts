// The builder page's props in a compact form: the server renders the page and React sends its props
// once more in the page's payload, so they are kept small. A run refers to its train, cab, operator
// and blocks by their place in the layout the page also sends (ids once), and its steps are one flat
// array. Plain functions, no server imports: the page encodes, the builder decodes in the browser.
import type { LoadProfile, LoadSeries } from '@/lib/planning';
import type { BuilderLayout, BuilderSnapshot } from '@/lib/sessions/types';
import type { Run } from '@/lib/runs/schema';

/** An id as its place in a layout list, or the id itself when the list does not hold it. */
type Ref = number | string;

/** [id, version, train, cab, operator (null: none), departS, arriveS, speedKmh, note, [block, enterS, exitS, …]] */
export type CompactRun = [string, number, Ref, Ref, Ref | null, number, number, number | null, string, (number | string)[]];

export type CompactSnapshot = Omit<BuilderSnapshot, 'runs'> & { runs: CompactRun[] };

function indexer(list: readonly { id: string }[]): (id: string) => Ref {
  const at = new Map(list.map((item, i) => [item.id, i]));
  return (id) => at.get(id) ?? id;
}

function resolver(list: readonly { id: string }[]): (ref: Ref) => string {
  return (ref) => (typeof ref === 'number' ? (list[ref]?.id ?? '') : ref);
}

export function compactSnapshot(snapshot: BuilderSnapshot, layout: BuilderLayout): CompactSnapshot {
  const train = indexer(layout.trains);
  const cab = indexer(layout.cabs);
  const operator = indexer(layout.operators);
  const block = indexer(layout.blocks);
  return {
    ...snapshot,
    runs: snapshot.runs.map((r) => [
      r.id,
      r.version,
      train(r.trainId),
      cab(r.cabId),
      r.operatorId === null ? null : operator(r.operatorId),
      r.departS,
      r.arriveS,
      r.speedKmh,
      r.note,
      r.steps.flatMap((s) => [block(s.blockId), s.enterS, s.exitS]),
    ]),
  };
}

export function expandSnapshot(compact: CompactSnapshot, layout: BuilderLayout): BuilderSnapshot {
  const train = resolver(layout.trains);
  const cab = resolver(layout.cabs);
  const operator = resolver(layout.operators);
  const block = resolver(layout.blocks);
  const runs: Run[] = compact.runs.map(([id, version, trainRef, cabRef, operatorRef, departS, arriveS, speedKmh, note, flat]) => {
    const steps: Run['steps'] = [];
    for (let i = 0; i + 2 < flat.length; i += 3) {
      steps.push({ blockId: block(flat[i]!), enterS: Number(flat[i + 1]), exitS: Number(flat[i + 2]) });
    }
    return {
      id,
      version,
      trainId: train(trainRef),
      cabId: cab(cabRef),
      operatorId: operatorRef === null ? null : operator(operatorRef),
      departS,
      arriveS,
      speedKmh,
      note,
      steps,
    };
  });
  return { ...compact, runs };
}

/** A load series on the wire: its id once (the name is in the layout), points as arrays. */
export type CompactSeries = Omit<LoadSeries, 'name'>;
export type CompactLoad = { supplies: CompactSeries[]; drivers: CompactSeries[]; cabs: CompactSeries[] };

export function compactLoad(load: LoadProfile): CompactLoad {
  const strip = (list: LoadSeries[]) => list.map(({ name: _name, ...rest }) => rest);
  return { supplies: strip(load.supplies), drivers: strip(load.drivers), cabs: strip(load.cabs) };
}

/** The load profile with each series' name read from the layout. */
export function expandLoad(load: CompactLoad, layout: Pick<BuilderLayout, 'supplies' | 'drivers' | 'cabs'>): LoadProfile {
  const named = (list: CompactSeries[], names: readonly { id: string; name: string }[]) => {
    const nameOf = new Map(names.map((n) => [n.id, n.name]));
    return list.map((s) => ({ ...s, name: nameOf.get(s.id) ?? 'Unnamed' }));
  };
  return { supplies: named(load.supplies, layout.supplies), drivers: named(load.drivers, layout.drivers), cabs: named(load.cabs, layout.cabs) };
}
