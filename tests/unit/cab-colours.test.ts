import { describe, expect, it } from 'vitest';
import { CAB_COLOURS } from '@/components/timetable/run-names';

/** WCAG 2.1 relative luminance (definition "relative luminance", sRGB). */
function luminance(hex: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255).map((c) => (c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4)) as [number, number, number];
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}
const contrast = (a: string, b: string) => {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x) as [number, number];
  return (hi + 0.05) / (lo + 0.05);
};

describe('cab colours', () => {
  it('carry white text at WCAG 2.1 AA (contrast at least 4.5:1, success criterion 1.4.3)', () => {
    for (const c of CAB_COLOURS) expect(contrast(c.hex, '#ffffff'), c.name).toBeGreaterThanOrEqual(4.5);
  });

  it('are ten distinct colours, none of them the clash red', () => {
    expect(new Set(CAB_COLOURS.map((c) => c.hex)).size).toBe(10);
    for (const c of CAB_COLOURS) {
      const [r, g, b] = [1, 3, 5].map((i) => parseInt(c.hex.slice(i, i + 2), 16)) as [number, number, number];
      // "Pure red": red well above both green and blue (common practice).
      expect(r > 2 * g && r > 2 * b, c.name).toBe(false);
    }
  });
});
