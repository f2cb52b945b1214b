// The builder page's props in a compact form: the server renders the page and React sends its props
// once more in the page's payload, so they are kept small. A run refers to its train, cab, operator
// and blocks by their place in the layout the page also sends (ids once), and its steps are one flat
// array. Each run field has a typed codec (RUN_CODECS) and a place in the tuple (RUN_ORDER); the
// compiler refuses a run or step field that has neither. Plain functions, no server imports: the page encodes, the builder decodes in the browser.
import type { Finding, LoadProfile, LoadSeries } from '@/lib/planning';
import { FINDING_KINDS } from '@/lib/planning/finding';
import type { TimetableLayout, TimetableSnapshot } from '@/lib/sessions/types';
import type { Run, Step } from '@/lib/runs/schema';

/** An id as its place in a layout list, or the id itself when the list does not hold it. */
type Ref = number | string;

type RefLists = 'trains' | 'cabs' | 'operators' | 'blocks';
type Encoders = Record<RefLists, (id: string) => Ref>;
type Decoders = Record<RefLists, (ref: Ref) => string>;

/** How one field of a run goes on the wire (`W`) and comes back. */
interface FieldCodec<T, W> {
  encode(value: T, refs: Encoders): W;
  decode(wire: W, refs: Decoders): T;
}
const codec = <T, W>(encode: FieldCodec<T, W>['encode'], decode: FieldCodec<T, W>['decode']): FieldCodec<T, W> => ({ encode, decode });
const same = <T>() => codec<T, T>((v) => v, (w) => w);
const ref = (list: RefLists) => codec<string, Ref>((id, refs) => refs[list](id), (wire, refs) => refs[list](wire));

// A step's travel direction as one number: fromEnd × 3 + toEnd, each 0 (not recorded), 1 (a) or 2 (b).
const ENDS = [undefined, 'a', 'b'] as const;
const endCode = (end: Step['fromEnd']) => ENDS.indexOf(end);
/** Step fields the flat step encoding below writes; a new one fails the check until it is written. */
type StepFieldsWritten = 'blockId' | 'enterS' | 'exitS' | 'fromEnd' | 'toEnd';
const everyStepFieldWritten: [Exclude<keyof Step, StepFieldsWritten>] extends [never] ? true : never = true;
void everyStepFieldWritten;
const STEP_CELLS = 4;

/** The steps as one flat array: block, enterS, exitS, ends, block, … */
const stepsCodec = codec<Run['steps'], (number | string)[]>(
  (steps, refs) => steps.flatMap((s) => [refs.blocks(s.blockId), s.enterS, s.exitS, endCode(s.fromEnd) * 3 + endCode(s.toEnd)]),
  (flat, refs) => {
    const steps: Run['steps'] = [];
    for (let i = 0; i + STEP_CELLS - 1 < flat.length; i += STEP_CELLS) {
      const ends = Number(flat[i + 3]);
      const fromEnd = ENDS[Math.floor(ends / 3)];
      const toEnd = ENDS[ends % 3];
      steps.push({
        blockId: refs.blocks(flat[i]!),
        enterS: Number(flat[i + 1]),
        exitS: Number(flat[i + 2]),
        ...(fromEnd ? { fromEnd } : {}),
        ...(toEnd ? { toEnd } : {}),
      });
    }
    return steps;
  },
);

/** Every field of a run with its codec: a field added to the run schema fails to compile until it has one here. */
const RUN_CODECS = {
  id: same<string>(),
  version: same<number>(),
  trainId: ref('trains'),
  cabId: ref('cabs'),
  operatorId: codec<string | null, Ref | null>(
    (id, refs) => (id === null ? null : refs.operators(id)),
    (wire, refs) => (wire === null ? null : refs.operators(wire)),
  ),
  departS: same<number>(),
  arriveS: same<number>(),
  speedKmh: same<number | null>(),
  note: same<string>(),
  steps: stepsCodec,
} satisfies { [K in keyof Run]-?: { encode(value: Run[K], refs: Encoders): unknown; decode(wire: never, refs: Decoders): Run[K] } };

/** The order of a run's fields in its tuple. */
const RUN_ORDER = ['id', 'version', 'trainId', 'cabId', 'operatorId', 'departS', 'arriveS', 'speedKmh', 'note', 'steps'] as const;
const everyRunFieldPlaced: [Exclude<keyof Run, (typeof RUN_ORDER)[number]>] extends [never] ? true : never = true;
void everyRunFieldPlaced;

type WireOf<K> = K extends keyof typeof RUN_CODECS ? ReturnType<(typeof RUN_CODECS)[K]['encode']> : never;
/** A run on the wire: each field's wire form in RUN_ORDER (derived, so the two cannot drift apart). */
export type CompactRun = { -readonly [I in keyof typeof RUN_ORDER]: WireOf<(typeof RUN_ORDER)[I]> };

export type CompactSnapshot = Omit<TimetableSnapshot, 'runs' | 'findings'> & { runs: CompactRun[]; findings: CompactFindings };

function indexer(list: readonly { id: string }[]): (id: string) => Ref {
  const at = new Map(list.map((item, i) => [item.id, i]));
  return (id) => at.get(id) ?? id;
}

function resolver(list: readonly { id: string }[]): (ref: Ref) => string {
  return (ref) => (typeof ref === 'number' ? (list[ref]?.id ?? '') : ref);
}

// The one place the per-field types meet the tuple: each codec is typed above, RUN_ORDER is checked whole.
type AnyCodec = FieldCodec<unknown, unknown>;
const codecOf = (key: (typeof RUN_ORDER)[number]) => RUN_CODECS[key] as AnyCodec;

export function encodeRun(run: Run, refs: Encoders): CompactRun {
  return RUN_ORDER.map((key) => codecOf(key).encode(run[key], refs)) as unknown as CompactRun;
}

export function decodeRun(wire: CompactRun, refs: Decoders): Run {
  return Object.fromEntries(RUN_ORDER.map((key, i) => [key, codecOf(key).decode(wire[i], refs)])) as Run;
}

export function compactSnapshot(snapshot: TimetableSnapshot, layout: TimetableLayout): CompactSnapshot {
  const refs: Encoders = { trains: indexer(layout.trains), cabs: indexer(layout.cabs), operators: indexer(layout.operators), blocks: indexer(layout.blocks) };
  return { ...snapshot, runs: snapshot.runs.map((r) => encodeRun(r, refs)), findings: compactFindings(snapshot.findings, knownIds(snapshot.runs, layout)) };
}

export function expandSnapshot(compact: CompactSnapshot, layout: TimetableLayout): TimetableSnapshot {
  const refs: Decoders = { trains: resolver(layout.trains), cabs: resolver(layout.cabs), operators: resolver(layout.operators), blocks: resolver(layout.blocks) };
  const runs = compact.runs.map((r) => decodeRun(r, refs));
  return { ...compact, runs, findings: expandFindings(compact.findings, knownIds(runs, layout)) };
}

// ---- Findings ----

/**
 * Findings on the wire: every id they name and every piece of their messages once, each finding a
 * tuple. An id the receiver already holds (a run's, or one of the layout's lists: `knownIds`) is its
 * place there; any other id is its place in `ids` after those. Messages repeat much of their wording
 * (a train's name, "fast", a standard's clause), so each is a list of places in `phrases`.
 */
export type CompactFindings = { ids: string[]; phrases: string[]; list: CompactFinding[] };

/** Power findings' figures, when the finding has them. */
type FindingFigures = Pick<Finding, 'peakAmps' | 'limitAmps' | 'peakWatts' | 'limitWatts'>;
/** [kind's place in FINDING_KINDS, 1 error / 0 warning, ids, fromS, toS, message pieces, figures?] */
export type CompactFinding =
  | [kind: number, error: 0 | 1, ids: number[], fromS: number, toS: number, message: number[]]
  | [kind: number, error: 0 | 1, ids: number[], fromS: number, toS: number, message: number[], figures: FindingFigures];

/** Finding fields the tuple above carries; a new one fails the check until it is carried. */
type FindingFieldsWritten = 'kind' | 'severity' | 'ids' | 'fromS' | 'toS' | 'message' | keyof FindingFigures;
const everyFindingFieldWritten: [Exclude<keyof Finding, FindingFieldsWritten>] extends [never] ? true : never = true;
void everyFindingFieldWritten;

/** The ids a builder already holds, in an order both ends derive the same way: runs, then the layout's lists. */
export function knownIds(runs: readonly { id: string }[], layout?: TimetableLayout): string[] {
  const lists = layout ? [layout.blocks, layout.cabs, layout.drivers, layout.supplies, layout.trains, layout.operators] : [];
  return [runs, ...lists].flatMap((list) => list.map((item) => item.id));
}

// Message pieces end after "; ", ", " or ": ", or before " (" and after ") ": clauses and asides.
const PIECES = /(?<=[;,:] )|(?= \()|(?<=\) )/;
const kindIndex = new Map(FINDING_KINDS.map((kind, i) => [kind, i]));

/** Findings as CompactFindings; `known` are ids the receiver holds (see knownIds). Lossless. */
export function compactFindings(findings: readonly Finding[], known: readonly string[] = []): CompactFindings {
  const idAt = new Map<string, number>();
  known.forEach((id, i) => idAt.has(id) || idAt.set(id, i));
  const ids: string[] = [];
  const phraseAt = new Map<string, number>();
  const phrases: string[] = [];
  const idRef = (id: string) => {
    let at = idAt.get(id);
    if (at === undefined) idAt.set(id, (at = known.length + ids.push(id) - 1));
    return at;
  };
  const phraseRef = (piece: string) => {
    let at = phraseAt.get(piece);
    if (at === undefined) phraseAt.set(piece, (at = phrases.push(piece) - 1));
    return at;
  };
  const list = findings.map((f): CompactFinding => {
    const head: [number, 0 | 1, number[], number, number, number[]] = [
      kindIndex.get(f.kind) ?? -1,
      f.severity === 'error' ? 1 : 0,
      f.ids.map(idRef),
      f.fromS,
      f.toS,
      f.message.split(PIECES).map(phraseRef),
    ];
    const figures: FindingFigures = {};
    for (const key of ['peakAmps', 'limitAmps', 'peakWatts', 'limitWatts'] as const) if (f[key] !== undefined) figures[key] = f[key];
    return Object.keys(figures).length ? [...head, figures] : head;
  });
  return { ids, phrases, list };
}

/** The findings CompactFindings carries, with the same `known` ids it was made with. */
export function expandFindings(compact: CompactFindings, known: readonly string[] = []): Finding[] {
  const idOf = (ref: number) => (ref < known.length ? known[ref]! : (compact.ids[ref - known.length] ?? ''));
  return compact.list.map(([kind, error, ids, fromS, toS, message, figures]) => ({
    kind: FINDING_KINDS[kind] ?? FINDING_KINDS[0]!,
    severity: error ? 'error' : 'warning',
    ids: ids.map(idOf),
    fromS,
    toS,
    message: message.map((p) => compact.phrases[p] ?? '').join(''),
    ...figures,
  }));
}

/** A load series on the wire: its id once (the name is in the layout), points as arrays. */
export type CompactSeries = Omit<LoadSeries, 'name'>;
export type CompactLoad = { supplies: CompactSeries[]; drivers: CompactSeries[]; cabs: CompactSeries[] };

export function compactLoad(load: LoadProfile): CompactLoad {
  const strip = (list: LoadSeries[]) => list.map(({ name: _name, ...rest }) => rest);
  return { supplies: strip(load.supplies), drivers: strip(load.drivers), cabs: strip(load.cabs) };
}

/** The load profile with each series' name read from the layout. */
export function expandLoad(load: CompactLoad, layout: Pick<TimetableLayout, 'supplies' | 'drivers' | 'cabs'>): LoadProfile {
  const named = (list: CompactSeries[], names: readonly { id: string; name: string }[]) => {
    const nameOf = new Map(names.map((n) => [n.id, n.name]));
    return list.map((s) => ({ ...s, name: nameOf.get(s.id) ?? 'Unnamed' }));
  };
  return { supplies: named(load.supplies, layout.supplies), drivers: named(load.drivers, layout.drivers), cabs: named(load.cabs, layout.cabs) };
}
