// What a finding is about, in terms every view can mark: runs, blocks and cabs. Client-safe.
import type { Finding } from '@/lib/planning';

export type Highlight = { runIds: Set<string>; blockIds: Set<string>; cabIds: Set<string>; fromS: number; toS: number };

type RunLike = { id: string; cabId: string; departS: number; arriveS: number; trainId: string };
type LayoutLike = { cabs: { id: string; driverId: string }[]; drivers: { id: string; supplyId: string }[] };

/**
 * The runs, blocks and cabs a finding names (see checkPlan for each kind's ids). Power findings
 * name a cab, driver or supply: the runs moving on it during the finding's interval are the ones
 * drawing the current.
 */
export function highlightOf(finding: Finding, runs: readonly RunLike[], layout: LayoutLike): Highlight {
  const h: Highlight = { runIds: new Set(), blockIds: new Set(), cabIds: new Set(), fromS: finding.fromS, toS: finding.toS };
  const [a, b, c] = finding.ids;
  const cabsOf = (pick: (cab: LayoutLike['cabs'][number]) => boolean) => layout.cabs.filter(pick).map((cab) => cab.id);
  const moving = (cabIds: string[]) => {
    for (const id of cabIds) h.cabIds.add(id);
    for (const run of runs) {
      // A zero-length interval (a surge instant) still names the runs moving then.
      if (cabIds.includes(run.cabId) && run.departS <= finding.toS && run.arriveS >= finding.fromS) h.runIds.add(run.id);
    }
  };
  switch (finding.kind) {
    case 'block-overlap':
    case 'block-occupied':
      if (a) h.blockIds.add(a);
      [b, c].forEach((id) => id && h.runIds.add(id));
      break;
    case 'cab-double-booked':
      if (a) h.cabIds.add(a);
      [b, c].forEach((id) => id && h.runIds.add(id));
      break;
    case 'operator-double-booked':
    case 'train-double-booked':
    case 'train-continuity':
      [b, c].forEach((id) => id && h.runIds.add(id));
      break;
    case 'locomotive-in-two-trains':
      for (const run of runs) if (run.trainId === b || run.trainId === c) h.runIds.add(run.id);
      break;
    case 'route-gap':
    case 'step-gap':
    case 'joint-short':
      if (a) h.runIds.add(a);
      [b, c].forEach((id) => id && h.blockIds.add(id));
      break;
    case 'train-too-long':
    case 'route-reversal':
    case 'reversing-section-short':
      if (a) h.runIds.add(a);
      if (b) h.blockIds.add(b);
      break;
    case 'reversing-loop':
    case 'joint-wiring':
      for (const id of finding.ids) h.blockIds.add(id);
      break;
    case 'channel-overload':
    case 'channel-peak-overload':
    case 'track-voltage-low':
      if (a) moving([a]);
      break;
    case 'track-voltage-high':
      if (a) moving([a]);
      break;
    case 'driver-overload':
    case 'driver-heat':
      moving(cabsOf((cab) => cab.driverId === a));
      break;
    case 'speed-not-reachable':
      if (a) h.runIds.add(a);
      break;
    case 'supply-overload':
    case 'supply-derate': {
      const drivers = new Set(layout.drivers.filter((d) => d.supplyId === a).map((d) => d.id));
      moving(cabsOf((cab) => drivers.has(cab.driverId)));
      break;
    }
  }
  return h;
}

/** Every run that some error finding involves: the ones every view marks as clashing. */
export function clashingRuns(findings: readonly Finding[], runs: readonly RunLike[], layout: LayoutLike): Set<string> {
  const ids = new Set<string>();
  for (const f of findings) {
    if (f.severity !== 'error') continue;
    for (const id of highlightOf(f, runs, layout).runIds) ids.add(id);
  }
  return ids;
}

/** Findings that a retime can clear: block clashes and double bookings. */
export const TIMING_KINDS: ReadonlySet<Finding['kind']> = new Set([
  'block-overlap',
  'cab-double-booked',
  'operator-double-booked',
  'train-double-booked',
]);

export const FINDING_LABELS: Record<Finding['kind'], string> = {
  'block-overlap': 'Block clash',
  'block-occupied': 'Block held by a standing train',
  'cab-double-booked': 'Cab booked twice',
  'operator-double-booked': 'Operator booked twice',
  'train-double-booked': 'Train booked twice',
  'locomotive-in-two-trains': 'Locomotive in two trains',
  'train-continuity': 'Train not where it ended',
  'route-gap': 'Route gap',
  'step-gap': 'Gap between steps',
  'train-too-long': 'Train longer than block',
  'route-reversal': 'Reverses where it may not',
  'reversing-loop': 'Reversing loop without a reversing section',
  'joint-wiring': 'Rail joint wired the other way round',
  'joint-short': 'Short across a rail gap',
  'reversing-section-short': 'Train not wholly inside the reversing section',
  'channel-overload': 'Channel overload',
  'channel-peak-overload': 'Start-up surge overload',
  'driver-overload': 'Driver overload',
  'driver-heat': 'Driver too hot',
  'supply-overload': 'Supply overload',
  'supply-derate': 'Supply above its load limit',
  'track-voltage-high': 'Track voltage high',
  'track-voltage-low': 'Track voltage low',
  'speed-not-reachable': 'Speed out of reach',
};
