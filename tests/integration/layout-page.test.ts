import { describe, expect, it } from 'vitest';
import { loadLayoutRows } from '@/db/queries/plan-data';
import { budgetInputOf, layoutForPage } from '@/lib/layouts/layout-page';
import { signInAs } from './caller';
import { NOT_FOUND, thrownDigest } from './page-digest';
import { seedLayout } from './authz/layouts';
import { makeWorld } from './world';

// The layout pages' data loader, per role on the railway (page gates answer by digest: ./page-digest).

describe('layoutForPage', () => {
  it('lets every member read; planners and hosts may edit, operators may not', async () => {
    const w = makeWorld();
    const seed = seedLayout(w.railway.id);
    for (const [who, canEdit] of [['operator', false], ['planner', true], ['host', true]] as const) {
      signInAs(w[who]);
      const page = await layoutForPage(w.railway.id, seed.layout.id);
      expect(page, who).toEqual({ member: expect.objectContaining({ railwayId: w.railway.id, role: who }), layout: seed.layout, canEdit });
    }
  });

  it('sends a visitor with no session to sign-in, coming back to the page (sub-page included) they asked for', async () => {
    const w = makeWorld();
    const seed = seedLayout(w.railway.id);
    signInAs(null);
    const back = (tail: string) => `NEXT_REDIRECT;replace;/sign-in?callbackUrl=${encodeURIComponent(`/railways/${w.railway.id}/layouts/${seed.layout.id}${tail}`)};307;`;
    expect(await thrownDigest(() => layoutForPage(w.railway.id, seed.layout.id))).toBe(back(''));
    expect(await thrownDigest(() => layoutForPage(w.railway.id, seed.layout.id, '/wiring'))).toBe(back('/wiring'));
  });

  it('another railway’s layout, an unknown layout and a non-member are 404 pages', async () => {
    const w = makeWorld();
    const ours = seedLayout(w.railway.id);
    const theirs = seedLayout(w.otherRailway.id);
    signInAs(w.host);
    expect(await thrownDigest(() => layoutForPage(w.railway.id, theirs.layout.id))).toBe(NOT_FOUND);
    expect(await thrownDigest(() => layoutForPage(w.railway.id, 'no-such-layout'))).toBe(NOT_FOUND);
    signInAs(w.outsider);
    expect(await thrownDigest(() => layoutForPage(w.railway.id, ours.layout.id))).toBe(NOT_FOUND);
  });
});

describe('budgetInputOf', () => {
  it('passes the layout’s scale and rows through and gives each train its consist in order', () => {
    const w = makeWorld();
    const seed = seedLayout(w.railway.id);
    const rows = loadLayoutRows(seed.layout.id);
    // A second locomotive on the seed train, and a train with no consist rows at all.
    const consists = [...rows.consists, { trainId: seed.train.id, locomotiveId: seed.spareLocomotive.id, position: 1 }];
    const bare = { ...rows.trains[0]!, id: 'bare-train', name: 'Bare' };
    const input = budgetInputOf({ ...rows, consists, trains: [...rows.trains, bare] });
    // NEM 010: H0 is 1:87.
    expect(input.scale).toEqual({ name: 'H0 (NEM)', ratio: 87 });
    expect(input.supplies).toBe(rows.supplies);
    expect(input.drivers).toBe(rows.drivers);
    expect(input.cabs).toBe(rows.cabs);
    expect(input.locomotives).toBe(rows.locomotives);
    expect(input.trains).toEqual([
      { ...rows.trains[0]!, locomotiveIds: [seed.locomotive.id, seed.spareLocomotive.id] },
      { ...bare, locomotiveIds: [] },
    ]);
  });

  it('a layout gone from under the page reads as an unnamed 1:1 scale, not an error', () => {
    const rows = loadLayoutRows('no-such-layout');
    expect(budgetInputOf(rows)).toEqual({ scale: { name: '', ratio: 1 }, supplies: [], drivers: [], cabs: [], locomotives: [], trains: [] });
  });
});
