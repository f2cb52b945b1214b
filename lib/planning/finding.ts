/** The kinds of finding checkPlan reports. */
export type FindingKind =
  | 'block-overlap'
  | 'block-occupied'
  | 'cab-double-booked'
  | 'operator-double-booked'
  | 'train-double-booked'
  | 'locomotive-in-two-trains'
  | 'train-continuity'
  | 'route-gap'
  | 'step-gap'
  | 'train-too-long'
  | 'route-reversal'
  | 'reversing-loop'
  | 'joint-wiring'
  | 'joint-short'
  | 'reversing-section-short'
  | 'channel-overload'
  | 'channel-peak-overload'
  | 'driver-overload'
  | 'driver-heat'
  | 'supply-overload'
  | 'supply-derate'
  | 'track-voltage-high'
  | 'track-voltage-low'
  | 'speed-not-reachable';

/** Every finding kind, in the order findings are listed when they start at the same time. */
export const FINDING_KINDS: readonly FindingKind[] = [
  'block-overlap',
  'block-occupied',
  'cab-double-booked',
  'operator-double-booked',
  'train-double-booked',
  'locomotive-in-two-trains',
  'train-continuity',
  'route-gap',
  'step-gap',
  'train-too-long',
  'route-reversal',
  'reversing-loop',
  'joint-wiring',
  'joint-short',
  'reversing-section-short',
  'channel-overload',
  'channel-peak-overload',
  'driver-overload',
  'driver-heat',
  'supply-overload',
  'supply-derate',
  'track-voltage-high',
  'track-voltage-low',
  'speed-not-reachable',
];

export interface Finding {
  kind: FindingKind;
  severity: 'error' | 'warning';
  /** What the finding is about; the order is fixed per kind (see checkPlan). */
  ids: string[];
  /** Real session seconds the finding covers, [fromS, toS). */
  fromS: number;
  toS: number;
  message: string;
  /** Power findings: the highest load in the interval, A. */
  peakAmps?: number;
  /** Power findings: the limit it exceeds, A. */
  limitAmps?: number;
  /** `driver-heat`: the highest dissipation in the interval (greatest drop), W. */
  peakWatts?: number;
  /** `driver-heat`: the package rating, W. */
  limitWatts?: number;
}

/**
 * Where a check puts its findings: a plain array, or checkPlan's list, which lists only so many of
 * each kind and counts the rest. `lists(kind)` false says a finding of that kind would only be
 * counted, so a check may leave its message empty.
 */
export interface FindingSink {
  push(finding: Finding): unknown;
  lists?(kind: FindingKind): boolean;
}

/** Whether a finding of this kind pushed to `sink` now would be listed (its message read). */
export const willList = (sink: FindingSink, kind: FindingKind): boolean => sink.lists?.(kind) !== false;

const kindRank = new Map(FINDING_KINDS.map((kind, i) => [kind, i]));

/** Orders findings by start time, then kind, then ids, so the list reads as the session unfolds. */
export function compareFindings(a: Finding, b: Finding): number {
  if (a.fromS !== b.fromS) return a.fromS - b.fromS;
  if (a.kind !== b.kind) return kindRank.get(a.kind)! - kindRank.get(b.kind)!;
  const n = Math.min(a.ids.length, b.ids.length);
  for (let i = 0; i < n; i++) {
    const x = a.ids[i]!;
    const y = b.ids[i]!;
    if (x !== y) return x < y ? -1 : 1;
  }
  return a.ids.length - b.ids.length;
}

/** Two run ids in ascending string order, as findings list them. */
export function orderedPair(a: string, b: string): [string, string] {
  return a < b ? [a, b] : [b, a];
}
