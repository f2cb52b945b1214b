/** A model scale: its reduction ratio (1:ratio) and its standard track gauge. */
export interface ScaleEntry {
  /** Stable key for forms and storage, e.g. `h0-nem`. */
  id: string;
  /** The scale's name as modellers write it, e.g. `H0`. */
  name: string;
  /** Name with the standard, for pickers where two standards share a name, e.g. `HO (NMRA)`. */
  label: string;
  standard: 'NEM' | 'NMRA';
  ratio: number;
  gaugeMm: number;
  source: string;
}

/** The NEM 010 and NMRA S-1.2 rows of the scale table, in decreasing ratio. */
export const SCALES: readonly ScaleEntry[] = [
  { id: 'z-nem', name: 'Z', label: 'Z (NEM)', standard: 'NEM', ratio: 220, gaugeMm: 6.5, source: 'NEM 010 (MOROP, 2011), Table 1' },
  { id: 'n-nem', name: 'N', label: 'N (NEM)', standard: 'NEM', ratio: 160, gaugeMm: 9, source: 'NEM 010 (MOROP, 2011), Table 1' },
  { id: 'n-nmra', name: 'N', label: 'N (NMRA)', standard: 'NMRA', ratio: 160, gaugeMm: 9, source: 'NMRA S-1.2' },
  { id: 'tt-nem', name: 'TT', label: 'TT (NEM)', standard: 'NEM', ratio: 120, gaugeMm: 12, source: 'NEM 010 (MOROP, 2011), Table 1' },
  { id: 'tt-nmra', name: 'TT', label: 'TT (NMRA)', standard: 'NMRA', ratio: 120, gaugeMm: 12, source: 'NMRA S-1.2' },
  { id: 'h0-nem', name: 'H0', label: 'H0 (NEM)', standard: 'NEM', ratio: 87, gaugeMm: 16.5, source: 'NEM 010 (MOROP, 2011), Table 1' },
  {
    id: 'ho-nmra',
    name: 'HO',
    label: 'HO (NMRA)',
    standard: 'NMRA',
    ratio: 87.1,
    gaugeMm: 16.5,
    source: 'NMRA S-1.2 (3.5 mm to the foot)',
  },
  {
    id: 'oo-nem',
    name: 'OO',
    label: 'OO (4 mm scale)',
    standard: 'NEM',
    ratio: 76.2,
    gaugeMm: 16.5,
    source: 'NEM 010 §3.4 names 4 mm scale 1:76; 1:76.2 (4 mm to the foot) is common practice',
  },
  { id: 's-nem', name: 'S', label: 'S (NEM)', standard: 'NEM', ratio: 64, gaugeMm: 22.5, source: 'NEM 010 (MOROP, 2011), Table 1' },
  {
    id: 's-nmra',
    name: 'S',
    label: 'S (NMRA)',
    standard: 'NMRA',
    ratio: 64,
    gaugeMm: 22.4,
    source: 'NMRA S-1.2; gauge derived: 56.5 in × 25.4 mm / 64 = 22.4 mm',
  },
  { id: '0-nem', name: '0', label: '0 (NEM)', standard: 'NEM', ratio: 45, gaugeMm: 32, source: 'NEM 010 (MOROP, 2011), Table 1' },
  { id: 'o-nmra', name: 'O', label: 'O (NMRA)', standard: 'NMRA', ratio: 48, gaugeMm: 31.75, source: 'NMRA S-1.2' },
  { id: 'i-nem', name: 'I', label: 'I (NEM)', standard: 'NEM', ratio: 32, gaugeMm: 45, source: 'NEM 010 (MOROP, 2011), Table 1' },
  {
    id: 'iim-nem',
    name: 'IIm',
    label: 'IIm (large scale, metre gauge on 45 mm track)',
    standard: 'NEM',
    ratio: 22.5,
    gaugeMm: 45,
    source: 'NEM 010 (MOROP, 2011), Table 1',
  },
];

/**
 * Finds a scale by id (`ho-nmra`) or by name (`H0`, `ho`, case-insensitive). A bare name shared by
 * two standards gives the first row, NEM before NMRA, as the table lists them.
 */
export function findScale(key: string): ScaleEntry | undefined {
  const wanted = key.trim().toLowerCase();
  return (
    SCALES.find((scale) => scale.id === wanted) ??
    SCALES.find((scale) => scale.name.toLowerCase() === wanted || scale.label.toLowerCase() === wanted)
  );
}

/**
 * The standard gauge for a plan's scale: by its name first, else by the row whose ratio lies within
 * 1 % of the plan's (so `{ name: "My H0 layout", ratio: 87 }` still finds 16.5 mm). Null when neither
 * matches; a planner's own scale has no standard gauge to judge by.
 */
export function gaugeForScale(scale: { name: string; ratio: number }): number | null {
  const byName = findScale(scale.name);
  if (byName !== undefined) return byName.gaugeMm;
  let best: ScaleEntry | undefined;
  for (const row of SCALES) {
    const off = Math.abs(row.ratio - scale.ratio) / row.ratio;
    if (off <= 0.01 && (best === undefined || off < Math.abs(best.ratio - scale.ratio) / best.ratio)) best = row;
  }
  return best?.gaugeMm ?? null;
}
