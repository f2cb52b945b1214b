/** Image types a track plan may have, recognised by their first bytes (not by name or header). */
export const TRACK_PLAN_TYPES = {
  'image/png': 'png',
  'image/jpeg': 'jpg',
  'image/webp': 'webp',
} as const;
export type TrackPlanType = keyof typeof TRACK_PLAN_TYPES;

/**
 * The image type of `bytes` by its signature, or null: PNG starts 89 50 4E 47 0D 0A 1A 0A
 * (PNG specification, 5.2), JPEG FF D8 FF (JFIF/ISO 10918-1 SOI marker then a marker), WebP
 * "RIFF" size "WEBP" (RIFF container, Google WebP container specification).
 */
export function sniffImageType(bytes: Uint8Array): TrackPlanType | null {
  const starts = (sig: number[], at = 0) => sig.every((b, i) => bytes[at + i] === b);
  if (bytes.length >= 8 && starts([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return 'image/png';
  if (bytes.length >= 3 && starts([0xff, 0xd8, 0xff])) return 'image/jpeg';
  if (bytes.length >= 12 && starts([0x52, 0x49, 0x46, 0x46]) && starts([0x57, 0x45, 0x42, 0x50], 8)) return 'image/webp';
  return null;
}
