/**
 * Track plan image types by their signatures (lib/layouts/image-type.ts), at the edge lengths:
 * PNG's 8-byte signature 89 50 4E 47 0D 0A 1A 0A (PNG specification, 2nd ed., 5.2; RFC 2083 3.1),
 * JPEG's SOI marker FF D8 then the next marker's FF (ISO/IEC 10918-1 B.1.1.3, B.2.1), WebP's RIFF
 * header: "RIFF", a 4-byte size, then "WEBP" at bytes 8–11 (RFC 9649, 2.1 and 2.5). GIF ("GIF87a",
 * "GIF89a", GIF89a specification 17) is not a track plan type.
 */
import { describe, expect, it } from 'vitest';
import { sniffImageType } from '@/lib/layouts/image-type';

const bytes = (...parts: (number[] | string)[]) => Uint8Array.from(parts.flatMap((p) => (typeof p === 'string' ? [...p].map((c) => c.charCodeAt(0)) : p)));
const PNG = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];

describe('sniffImageType at the signatures’ lengths', () => {
  it('knows a PNG by exactly its 8 signature bytes, and not by 7 of them or one byte changed', () => {
    expect(sniffImageType(bytes(PNG))).toBe('image/png');
    expect(sniffImageType(bytes(PNG.slice(0, 7)))).toBeNull();
    expect(sniffImageType(bytes(PNG.slice(0, 7), [0x0b]))).toBeNull();
  });

  it('knows a JPEG by its 3 first bytes FF D8 FF, and not by FF D8 alone', () => {
    expect(sniffImageType(bytes([0xff, 0xd8, 0xff]))).toBe('image/jpeg');
    expect(sniffImageType(bytes([0xff, 0xd8]))).toBeNull();
    expect(sniffImageType(bytes([0xff, 0xd8, 0x00, 0xff]))).toBeNull();
  });

  it('knows a WebP by RIFF, a size and WEBP in exactly 12 bytes; WEBP without RIFF, or RIFF of another form, is not one', () => {
    expect(sniffImageType(bytes('RIFF', [0x1a, 0, 0, 0], 'WEBP'))).toBe('image/webp');
    expect(sniffImageType(bytes('RIFF', [0x1a, 0, 0, 0], 'WEB'))).toBeNull();
    expect(sniffImageType(bytes('RIFX', [0x1a, 0, 0, 0], 'WEBP'))).toBeNull();
    expect(sniffImageType(bytes([0, 0, 0, 0, 0x1a, 0, 0, 0], 'WEBP'))).toBeNull();
    expect(sniffImageType(bytes('RIFF', [0x1a, 0, 0, 0], 'AVI LIST'))).toBeNull();
  });

  it('does not take a GIF, either version', () => {
    expect(sniffImageType(bytes('GIF87a', [1, 0, 1, 0, 0, 0]))).toBeNull();
    expect(sniffImageType(bytes('GIF89a', [1, 0, 1, 0, 0, 0]))).toBeNull();
  });
});
