import 'server-only';
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { env } from '@/lib/env';
import { TRACK_PLAN_TYPES, type TrackPlanType } from '@/lib/layouts/image-type';

// Track plans live under UPLOADS_DIR (never under public/), named at random, and are served only
// through the route that checks membership.

const STORED_NAME = /^[0-9a-f-]{36}\.(png|jpg|webp)$/;

function folder(): string {
  return path.resolve(env().UPLOADS_DIR, 'track-plans');
}

/** Stores the bytes under a new random name and answers the name. */
export function storeTrackPlan(bytes: Uint8Array, type: TrackPlanType): string {
  const name = `${randomUUID()}.${TRACK_PLAN_TYPES[type]}`;
  fs.mkdirSync(folder(), { recursive: true });
  fs.writeFileSync(path.join(folder(), name), bytes, { flag: 'wx' });
  return name;
}

/** The stored bytes, or null when the name is not one of ours or the file is gone. */
export function readTrackPlan(name: string): Buffer | null {
  if (!STORED_NAME.test(name)) return null;
  try {
    return fs.readFileSync(path.join(folder(), name));
  } catch {
    return null;
  }
}

export function removeTrackPlan(name: string | null): void {
  if (!name || !STORED_NAME.test(name)) return;
  fs.rmSync(path.join(folder(), name), { force: true });
}
