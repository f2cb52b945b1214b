/**
 * Evenly spaced axis ticks from 0 that cover `max`: the step is 1, 2, 2.5 or 5 times a power of ten
 * (the "nice numbers" rule common to chart axes, common practice), about `count` steps in all.
 */
export function niceTicks(max: number, count = 4): number[] {
  if (!Number.isFinite(max) || max <= 0) return [0, 1];
  const rough = max / Math.max(1, Math.min(count, 20));
  const power = 10 ** Math.floor(Math.log10(rough));
  const step = [1, 2, 2.5, 5, 10].map((m) => m * power).find((s) => s >= rough)!;
  const steps = Math.ceil(max / step - 1e-9);
  // Round each tick to the step's decimals so 0.1 × 3 reads 0.3, not 0.30000000000000004.
  const decimals = Math.max(0, -Math.floor(Math.log10(step)) + 1);
  return Array.from({ length: steps + 1 }, (_, i) => Number((i * step).toFixed(decimals)));
}
