import type { TimetableLayout } from '@/lib/sessions/types';
import type { Run } from '@/lib/runs/schema';

/** `First block → last block` with the blocks between when there are few, else `via N blocks`. */
export function routeSummary(run: Run, layout: TimetableLayout): string {
  const names = run.steps.map((s) => layout.blocks.find((b) => b.id === s.blockId)?.name ?? '?');
  if (names.length <= 2) return names.join(' → ');
  return `${names[0]} → ${names[names.length - 1]} (via ${names.length - 2} block${names.length === 3 ? '' : 's'})`;
}

/**
 * Fishplate's own cab colours, drawn from the workshop: verdigris and brass from the brand, then paint
 * and metal tones. Deep enough for white text; no pure red, which marks clashes.
 */
export const CAB_COLOURS = [
  { name: 'verdigris', hex: '#1d6f63' },
  { name: 'brass', hex: '#8a6212' },
  { name: 'slate blue', hex: '#3d5a80' },
  { name: 'heather', hex: '#7b4f8e' },
  { name: 'moss', hex: '#4f6b22' },
  { name: 'rust', hex: '#8a5a2b' },
  { name: 'lamp teal', hex: '#1f6f86' },
  { name: 'claret', hex: '#8a2846' },
  { name: 'iron grey', hex: '#55606a' },
  { name: 'night blue', hex: '#283f73' },
] as const;

export const PALETTE: readonly string[] = CAB_COLOURS.map((c) => c.hex);
