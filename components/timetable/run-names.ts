import type { BuilderLayout, BuilderRun } from '@/lib/sessions/types';

/** `First block → last block` with the blocks between when there are few, else `via N blocks`. */
export function routeSummary(run: BuilderRun, layout: BuilderLayout): string {
  const names = run.steps.map((s) => layout.blocks.find((b) => b.id === s.blockId)?.name ?? '?');
  if (names.length <= 2) return names.join(' → ');
  return `${names[0]} → ${names[names.length - 1]} (via ${names.length - 2} block${names.length === 3 ? '' : 's'})`;
}

/** Colours for cabs or operators: mid tones readable on light and dark paper, with white text. */
export const PALETTE = ['#2a7fb8', '#c0622f', '#4f8a2b', '#8e4fb0', '#b8860b', '#138a8a', '#b83a6b', '#5d6d7e', '#7a5c2e', '#3b5ba5'];
