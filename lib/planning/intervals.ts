/**
 * Calls `visit(earlier, later)` once for every pair of half-open intervals `[start, end)` that
 * overlap, given the interval indices in `order` sorted by start. A sweep with an active list: an
 * interval stays active while it ends after the current start, so the work is O(n + pairs) after the
 * sort. Overlap here is exactly `a.start < b.end && b.start < a.end` in floating point: when b starts
 * no earlier than a and `b.start < a.end`, then `a.start <= b.start < b.end`.
 */
export function forEachOverlap(
  order: ArrayLike<number>,
  start: ArrayLike<number>,
  end: ArrayLike<number>,
  visit: (earlier: number, later: number) => void,
): void {
  const active: number[] = [];
  for (let k = 0; k < order.length; k++) {
    const current = order[k]!;
    const from = start[current]!;
    let kept = 0;
    for (let i = 0; i < active.length; i++) {
      const other = active[i]!;
      if (end[other]! > from) active[kept++] = other;
    }
    active.length = kept;
    for (let i = 0; i < kept; i++) visit(active[i]!, current);
    active.push(current);
  }
}

/** Keeps in `list` (in place, in order) the intervals still active at `from`: those ending after it. */
function keepActive(list: number[], end: ArrayLike<number>, from: number): void {
  let kept = 0;
  for (let i = 0; i < list.length; i++) {
    const other = list[i]!;
    if (end[other]! > from) list[kept++] = other;
  }
  list.length = kept;
}

/**
 * Like forEachOverlap, but over intervals of many groups at once (only intervals of the same group
 * pair up), in one sweep in the order given (by start across all groups), and stopping as soon as
 * `visit` returns false. Pairs come out in the order of the later interval's start, so stopping
 * early keeps the earliest meetings. Work is O(n + pairs visited) after the sort.
 */
export function forEachOverlapInGroups(
  order: ArrayLike<number>,
  group: ArrayLike<number>,
  groups: number,
  start: ArrayLike<number>,
  end: ArrayLike<number>,
  visit: (earlier: number, later: number) => boolean,
): void {
  const active: (number[] | undefined)[] = new Array(groups);
  for (let k = 0; k < order.length; k++) {
    const current = order[k]!;
    const g = group[current]!;
    if (g < 0) continue;
    const from = start[current]!;
    const list = (active[g] ??= []);
    keepActive(list, end, from);
    for (let i = 0; i < list.length; i++) if (!visit(list[i]!, current)) return;
    list.push(current);
  }
}

/**
 * forEachOverlapInGroups for the pairs in which at least one interval is `marked`: an unmarked
 * interval is only compared with the marked ones active when it starts, so the work stays
 * O(n + pairs visited) however many unmarked intervals overlap each other.
 */
export function forEachMarkedOverlapInGroups(
  order: ArrayLike<number>,
  group: ArrayLike<number>,
  groups: number,
  marked: ArrayLike<number>,
  start: ArrayLike<number>,
  end: ArrayLike<number>,
  visit: (earlier: number, later: number) => boolean,
): void {
  const activeMarked: (number[] | undefined)[] = new Array(groups);
  const activePlain: (number[] | undefined)[] = new Array(groups);
  for (let k = 0; k < order.length; k++) {
    const current = order[k]!;
    const g = group[current]!;
    if (g < 0) continue;
    const from = start[current]!;
    const marks = (activeMarked[g] ??= []);
    const plain = (activePlain[g] ??= []);
    keepActive(marks, end, from);
    for (const other of marks) if (!visit(other, current)) return;
    if (marked[current]) {
      // Only now is the plain list swept: what stays in it is visited, what leaves it leaves once.
      keepActive(plain, end, from);
      for (const other of plain) if (!visit(other, current)) return;
      marks.push(current);
    } else {
      plain.push(current);
    }
  }
}

/**
 * How many pairs of the same group overlap (half-open intervals, each with start < end), without
 * listing them: O(n) after the two orders. In start order, interval i overlaps every earlier one
 * except those that ended by its start, and an interval that ended by i's start began before it;
 * so i adds `i − #{ends <= start_i}`. `orders` may pass the intervals already sorted by start and
 * by end (as orderByKey gives them); otherwise they are sorted here.
 */
export function countOverlapsInGroups(
  group: ArrayLike<number>,
  groups: number,
  start: ArrayLike<number>,
  end: ArrayLike<number>,
  orders: { byStart: Int32Array; byEnd: Int32Array } = { byStart: orderByKey(start), byEnd: orderByKey(end) },
): number[] {
  const starts = groupBy(group, groups, orders.byStart);
  const ends = groupBy(group, groups, orders.byEnd);
  const counts = new Array<number>(groups).fill(0);
  for (let g = 0; g < groups; g++) {
    const from = starts.offsets[g]!;
    const to = starts.offsets[g + 1]!;
    if (to - from < 2) continue;
    let count = 0;
    let ended = from;
    for (let i = from; i < to; i++) {
      const s = start[starts.items[i]!]!;
      while (ended < to && end[ends.items[ended]!]! <= s) ended++;
      count += i - ended;
    }
    counts[g] = count;
  }
  return counts;
}

/** orderByKey's digits, pass by pass; grown as needed and reused. */
let radixDigits = new Uint16Array(0);
const radixCounts = new Int32Array(65536);
/** From this many keys on, four passes of 16 bits beat six of 11 (whose counts are cheaper to clear). */
const WIDE_DIGITS_FROM = 16384;
const keyBits = new Float64Array(1);
const keyWords = new Uint32Array(keyBits.buffer);
/** Which of keyWords holds a double's low 32 bits on this machine. */
const LOW_WORD = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1 ? 0 : 1;

/**
 * `items` (default 0..n−1 for n = key.length) in a new array, ordered by `key[item]` ascending,
 * ties kept in the order given: with items ascending (the default) that is the order of
 * `sort((a, b) => key[a] − key[b] || a − b)` for keys without NaN (−0 ties with 0). A stable
 * least-significant-digit radix sort on the keys' IEEE 754 bits, sign-flipped so that their
 * unsigned order is the numbers' order (negatives: every bit flipped; others: the sign bit set),
 * in six passes of 11 bits (four of 16 for many keys), a pass skipped when every key has the same
 * digit there: O(n), typed arrays only, no comparator calls.
 */
export function orderByKey(key: ArrayLike<number>, items?: ArrayLike<number>): Int32Array {
  const n = items === undefined ? key.length : items.length;
  const order = new Int32Array(n);
  if (items === undefined) for (let i = 0; i < n; i++) order[i] = i;
  else order.set(items);
  if (n < 2) return order;
  const wide = n >= WIDE_DIGITS_FROM;
  const passes = wide ? 4 : 6;
  const buckets = wide ? 65536 : 2048;
  if (radixDigits.length < passes * n) radixDigits = new Uint16Array(Math.max(passes * n, 2 * radixDigits.length));
  const digits = radixDigits;
  for (let i = 0; i < n; i++) {
    keyBits[0] = key[order[i]!]! + 0; // −0 + 0 is +0
    let high = keyWords[1 - LOW_WORD]!;
    let low = keyWords[LOW_WORD]!;
    if (high >>> 31 === 1) {
      high = ~high >>> 0;
      low = ~low >>> 0;
    } else {
      high = (high | 0x80000000) >>> 0;
    }
    if (wide) {
      digits[i] = low & 0xffff;
      digits[n + i] = low >>> 16;
      digits[2 * n + i] = high & 0xffff;
      digits[3 * n + i] = high >>> 16;
    } else {
      digits[i] = low & 2047;
      digits[n + i] = (low >>> 11) & 2047;
      digits[2 * n + i] = (low >>> 22) | ((high & 1) << 10);
      digits[3 * n + i] = (high >>> 1) & 2047;
      digits[4 * n + i] = (high >>> 12) & 2047;
      digits[5 * n + i] = high >>> 23;
    }
  }
  // Sort positions 0..n−1 (the digits stay where they are), then map them back to items.
  let positions = new Int32Array(n);
  for (let i = 0; i < n; i++) positions[i] = i;
  let spare = new Int32Array(n);
  const counts = radixCounts;
  for (let pass = 0; pass < passes; pass++) {
    const base = pass * n;
    counts.fill(0, 0, buckets);
    for (let i = 0; i < n; i++) counts[digits[base + i]!]!++;
    if (counts[digits[base]!] === n) continue;
    let sum = 0;
    for (let d = 0; d < buckets; d++) {
      const c = counts[d]!;
      counts[d] = sum;
      sum += c;
    }
    for (let i = 0; i < n; i++) {
      const p = positions[i]!;
      spare[counts[digits[base + p]!]!++] = p;
    }
    const swap = positions;
    positions = spare;
    spare = swap;
  }
  for (let i = 0; i < n; i++) spare[i] = order[positions[i]!]!;
  return spare;
}

/**
 * Groups indices by a group number (counting sort, stable): 0..n−1 in turn, or in the order of
 * `order` (a permutation of 0..n−1), so that each group keeps that order. Indices with a negative group are left out. Returns
 * the concatenated indices and where each group starts.
 */
export function groupBy(groupOf: ArrayLike<number>, groups: number, order?: ArrayLike<number>): { items: Int32Array; offsets: Int32Array } {
  const offsets = new Int32Array(groups + 1);
  for (let i = 0; i < groupOf.length; i++) {
    const g = groupOf[i]!;
    if (g >= 0) offsets[g + 1]!++;
  }
  for (let g = 0; g < groups; g++) offsets[g + 1]! += offsets[g]!;
  const fill = offsets.slice(0, groups);
  const items = new Int32Array(offsets[groups]!);
  if (order === undefined) {
    for (let i = 0; i < groupOf.length; i++) {
      const g = groupOf[i]!;
      if (g >= 0) items[fill[g]!++] = i;
    }
  } else {
    for (let k = 0; k < order.length; k++) {
      const i = order[k]!;
      const g = groupOf[i]!;
      if (g >= 0) items[fill[g]!++] = i;
    }
  }
  return { items, offsets };
}

const scratch = new Float64Array(1);
const scratchBits = new BigInt64Array(scratch.buffer);

/** The next double above x (x finite). */
export function nextUp(x: number): number {
  if (x === 0) return Number.MIN_VALUE;
  scratch[0] = x;
  scratchBits[0] = x > 0 ? scratchBits[0]! + 1n : scratchBits[0]! - 1n;
  return scratch[0]!;
}

/**
 * The smallest shift d, no smaller than target − base, with `base + d >= target` in floating point,
 * so that a time moved by d is certain to reach the target when a checker adds them up again.
 */
export function shiftReaching(base: number, target: number): number {
  let shift = target - base;
  // The difference is off by at most a rounding or two; a few single steps settle it, and when the
  // shift is far smaller than the times, steps scaled to the times' own precision finish the job.
  for (let i = 0; i < 4 && base + shift < target && Number.isFinite(shift); i++) shift = nextUp(shift);
  let step = Number.EPSILON * Math.max(Math.abs(base), Math.abs(target));
  while (base + shift < target && Number.isFinite(shift)) {
    shift += step;
    step *= 2;
  }
  return shift;
}

/**
 * Half-open intervals kept sorted, disjoint and merged where they touch or overlap: the occupied
 * time of one block, cab or operator among runs already placed by the retimer. Because placed runs
 * never clash with each other, merging loses nothing: a window overlaps the union exactly when it
 * overlaps one of the members.
 */
export class IntervalUnion {
  private readonly starts: number[] = [];
  private readonly ends: number[] = [];

  /**
   * The latest end among intervals overlapping `[from, to)`, or -Infinity when none does. Sorted
   * and disjoint, the last interval starting before `to` is the only one to look at.
   */
  overlapEnd(from: number, to: number): number {
    const starts = this.starts;
    let lo = 0;
    let hi = starts.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (starts[mid]! < to) lo = mid + 1;
      else hi = mid;
    }
    if (lo === 0) return -Infinity;
    const end = this.ends[lo - 1]!;
    return end > from ? end : -Infinity;
  }

  /** Adds `[from, to)`, merging with any interval it touches or overlaps. */
  add(from: number, to: number): void {
    const { starts, ends } = this;
    // First interval that ends at or after `from` (ends are sorted too: the intervals are disjoint).
    let lo = 0;
    let hi = ends.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (ends[mid]! < from) lo = mid + 1;
      else hi = mid;
    }
    let last = lo;
    let start = from;
    let end = to;
    while (last < starts.length && starts[last]! <= to) {
      if (starts[last]! < start) start = starts[last]!;
      if (ends[last]! > end) end = ends[last]!;
      last++;
    }
    if (last === lo) {
      starts.splice(lo, 0, start);
      ends.splice(lo, 0, end);
    } else {
      starts.splice(lo, last - lo, start);
      ends.splice(lo, last - lo, end);
    }
  }
}
