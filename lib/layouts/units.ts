/** Length units a planner may type; every length is stored in millimetres. */
export const LENGTH_UNITS = ['mm', 'cm', 'm', 'in', 'ft'] as const;
export type LengthUnit = (typeof LENGTH_UNITS)[number];

/**
 * Millimetres per unit. The inch is exactly 25.4 mm and the foot 12 inches = 304.8 mm (the
 * international yard and pound agreement, 1959); cm and m are SI.
 */
export const MM_PER_UNIT: Record<LengthUnit, number> = { mm: 1, cm: 10, m: 1000, in: 25.4, ft: 304.8 };

export const LENGTH_UNIT_LABELS: Record<LengthUnit, string> = {
  mm: 'millimetres (mm)',
  cm: 'centimetres (cm)',
  m: 'metres (m)',
  in: 'inches (in)',
  ft: 'feet (ft)',
};

/** A length in `unit` as millimetres, rounded to a thousandth of a millimetre. */
export function toMm(value: number, unit: LengthUnit): number {
  return roundTo(value * MM_PER_UNIT[unit], 3);
}

/** Millimetres in `unit`, rounded so that typing the shown figure back gives the same millimetres. */
export function fromMm(mm: number, unit: LengthUnit): number {
  const decimals = { mm: 3, cm: 5, m: 7, in: 5, ft: 7 }[unit];
  return roundTo(mm / MM_PER_UNIT[unit], decimals);
}

/** `1 234.5 mm`-style text for a stored length, in the unit asked for. */
export function formatLength(mm: number, unit: LengthUnit = 'mm'): string {
  return `${fromMm(mm, unit).toLocaleString('en-GB', { maximumFractionDigits: 4 })} ${unit}`;
}

export function isLengthUnit(value: unknown): value is LengthUnit {
  return typeof value === 'string' && (LENGTH_UNITS as readonly string[]).includes(value);
}

function roundTo(value: number, decimals: number): number {
  const f = 10 ** decimals;
  return Math.round(value * f) / f;
}
