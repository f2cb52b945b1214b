import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';

// The track-plan store on a real folder: names it makes, names it refuses to read or remove, and
// that it never overwrites a file. The store's name pattern is built when its module is evaluated,
// so the module is imported again (vi.resetModules) in each test: a mutation test run switches a
// change on in a beforeAll, after a top-of-file import.

// randomUUID is real unless a test fixes the next one (to show that a name clash is refused, not overwritten).
const uuid = vi.hoisted(() => ({ next: null as string | null }));
vi.mock('node:crypto', async (importOriginal) => {
  const real = await importOriginal<typeof import('node:crypto')>();
  return { ...real, default: real, randomUUID: () => uuid.next ?? real.randomUUID() };
});

type Store = typeof import('@/lib/layouts/track-plan-store');
let store: Store;
let uploads: string;
let folder: string;
const PNG = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 1, 2, 3]);
// An RFC 9562 version-4 UUID as text: 36 characters, hex digits and hyphens.
const ID = '0f8e4c1a-2b3d-4e5f-8a9b-0c1d2e3f4a5b';

beforeAll(() => {
  uploads = fs.mkdtempSync(path.join(os.tmpdir(), 'fishplate-plans-'));
  folder = path.join(uploads, 'track-plans');
});
afterAll(() => fs.rmSync(uploads, { recursive: true, force: true }));

beforeEach(async () => {
  uuid.next = null;
  process.env.UPLOADS_DIR = uploads;
  vi.resetModules();
  (await import('@/lib/env')).resetEnvCache();
  store = await import('@/lib/layouts/track-plan-store');
});

/** Writes a file straight into the store's folder, as if something else had put it there. */
function plant(name: string, text = name): void {
  fs.mkdirSync(folder, { recursive: true });
  fs.writeFileSync(path.join(folder, name), text);
}

describe('track-plan store', () => {
  it('stores under a random UUID name with the type’s extension and reads the same bytes back', () => {
    const name = store.storeTrackPlan(PNG, 'image/png');
    expect(name).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}\.png$/);
    expect(new Uint8Array(fs.readFileSync(path.join(folder, name)))).toEqual(PNG);
    expect(new Uint8Array(store.readTrackPlan(name)!)).toEqual(PNG);
    expect(store.storeTrackPlan(PNG, 'image/jpeg')).toMatch(/\.jpg$/);
    expect(store.storeTrackPlan(PNG, 'image/webp')).toMatch(/\.webp$/);
  });

  it('never overwrites: a name that already exists is refused and the first file keeps its bytes', () => {
    uuid.next = ID;
    expect(store.storeTrackPlan(PNG, 'image/png')).toBe(`${ID}.png`);
    expect(() => store.storeTrackPlan(new Uint8Array([9, 9]), 'image/png')).toThrow(expect.objectContaining({ code: 'EEXIST' }));
    expect(new Uint8Array(fs.readFileSync(path.join(folder, `${ID}.png`)))).toEqual(PNG);
  });

  it('reads only names it could have made: anything else is null even when the file exists', () => {
    const others = ['notes.txt', `x${ID}.png`, `${ID}.png.bak`, 'a.png', `${ID.slice(1)}.png`, `${ID}.gif`];
    for (const name of others) plant(name);
    for (const name of others) expect(store.readTrackPlan(name), name).toBeNull();
    expect(store.readTrackPlan(`../${path.basename(uploads)}/track-plans/notes.txt`)).toBeNull();
  });

  it('a well-formed name whose file is gone reads as null', () => {
    expect(store.readTrackPlan('11111111-2222-4333-8444-555555555555.webp')).toBeNull();
  });

  it('removes its own files; other names, no name and a file already gone change nothing and do not throw', () => {
    const name = store.storeTrackPlan(PNG, 'image/png');
    store.removeTrackPlan(name);
    expect(fs.existsSync(path.join(folder, name))).toBe(false);
    expect(() => store.removeTrackPlan(name)).not.toThrow();
    plant('keep.txt');
    plant(`${ID}.jpg.old`);
    store.removeTrackPlan('keep.txt');
    store.removeTrackPlan(`${ID}.jpg.old`);
    store.removeTrackPlan(null);
    store.removeTrackPlan('');
    expect(fs.existsSync(path.join(folder, 'keep.txt'))).toBe(true);
    expect(fs.existsSync(path.join(folder, `${ID}.jpg.old`))).toBe(true);
  });
});
