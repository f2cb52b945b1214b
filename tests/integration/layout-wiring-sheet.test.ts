import { eq, sql } from 'drizzle-orm';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import * as actions from '@/app/(app)/railways/[railwayId]/layouts/[layoutId]/actions';
import { getDb } from '@/db';
import { getWiringSheetRow } from '@/db/queries/wiring-sheets';
import * as t from '@/db/schema';
import { DEFAULT_TIMING } from '@/lib/control';
import { signInAs } from './caller';
import { seedLayout } from './authz/layouts';
import { makeWorld } from './world';

// The wiring sheet form by value: what is stored, each refusal's message in full, and that a refused
// save leaves the stored sheet as it was. wiringFormSchema is built when its module is evaluated, so
// its checks are read from a copy imported again after vi.resetModules (a mutation test run switches
// a change on in a beforeAll, after this file's own imports).

function setup() {
  const w = makeWorld();
  const seed = seedLayout(w.railway.id);
  signInAs(w.planner);
  // A 40-pin-header board (BCM GPIO numbering): one cab on a PWM pin, one block fed by it.
  const sheet = {
    version: 1,
    boards: [{ id: 'pi', kind: 'header40', name: 'Bench board', emergencyStopPin: 'GPIO4', startPin: null }],
    cabs: [{ cabId: seed.cab.id, boardId: 'pi', forwardPin: 'GPIO5', reversePin: 'GPIO6', pwmPin: 'GPIO12', bothHighBrakes: false }],
    blocks: [{ blockId: seed.blockA.id, boardId: 'pi', feeds: [{ cabId: seed.cab.id, pin: 'GPIO17' }], polarityPin: null, forwardTowards: [] }],
    timing: DEFAULT_TIMING,
  };
  const save = (body: unknown, version = '') => {
    const data = new FormData();
    data.set('sheet', typeof body === 'string' ? body : JSON.stringify(body));
    data.set('version', version);
    return actions.saveWiring(w.railway.id, seed.layout.id, null, data);
  };
  const stored = () => {
    const row = getWiringSheetRow(seed.layout.id);
    return row ? { version: row.version, sheet: JSON.parse(row.sheet) as unknown } : undefined;
  };
  return { w, seed, sheet, save, stored };
}

describe('saving a wiring sheet', () => {
  it('stores a sheet of this layout’s cabs and blocks, audited, and replaces it at the version seen', async () => {
    const s = setup();
    expect(await s.save(s.sheet)).toEqual({ ok: true, message: 'Wiring sheet saved.' });
    expect(s.stored()).toEqual({ version: 1, sheet: s.sheet });
    const audit = getDb().select().from(t.auditLog).where(eq(t.auditLog.railwayId, s.w.railway.id)).orderBy(sql`rowid`).all().at(-1);
    expect(audit).toMatchObject({ action: 'wiring-sheet.save', entity: 'wiring-sheet', entityId: s.seed.layout.id, userId: s.w.planner.id });
    const renamed = { ...s.sheet, boards: [{ ...s.sheet.boards[0]!, name: 'Renamed board' }] };
    expect(await s.save(renamed, '1')).toEqual({ ok: true, message: 'Wiring sheet saved.' });
    expect(s.stored()).toEqual({ version: 2, sheet: renamed });
  });

  it('a save on a version that is no longer current, or a new sheet where one exists, is 409 and keeps the stored one', async () => {
    const s = setup();
    await s.save(s.sheet);
    const conflict = 'Someone else changed this since you opened it. Reload to see their version, then edit again.';
    const other = { ...s.sheet, boards: [{ ...s.sheet.boards[0]!, name: 'Other board' }] };
    expect(await s.save(other)).toEqual({ ok: false, status: 409, error: conflict, fieldErrors: {} });
    expect(await s.save(other, '7')).toEqual({ ok: false, status: 409, error: conflict, fieldErrors: {} });
    expect(s.stored()).toEqual({ version: 1, sheet: s.sheet });
  });

  it('text that is not JSON is refused by name', async () => {
    const s = setup();
    expect(await s.save('{"version": 1,')).toEqual({ ok: false, status: 400, error: 'The wiring sheet is not valid JSON.', fieldErrors: { sheet: 'not valid JSON' } });
    expect(s.stored()).toBeUndefined();
  });

  it('cabs and blocks of another layout are each named; the first is the message; nothing is stored', async () => {
    const s = setup();
    const other = seedLayout(s.w.railway.id);
    const foreign = {
      ...s.sheet,
      cabs: [...s.sheet.cabs, { cabId: other.cab.id, boardId: 'pi', forwardPin: 'GPIO20', reversePin: 'GPIO21', pwmPin: 'GPIO13', bothHighBrakes: false }],
      blocks: [...s.sheet.blocks, { blockId: other.blockA.id, boardId: 'pi', feeds: [], polarityPin: null, forwardTowards: [] }],
    };
    const cabIssue = `cab "${other.cab.id}" is not a cab of this layout`;
    expect(await s.save(foreign)).toEqual({ ok: false, status: 400, error: cabIssue, fieldErrors: { sheet: cabIssue } });
    const blockIssue = `block "${other.blockA.id}" is not a block of this layout`;
    expect(await s.save({ ...foreign, cabs: s.sheet.cabs })).toEqual({ ok: false, status: 400, error: blockIssue, fieldErrors: { sheet: blockIssue } });
    expect(s.stored()).toBeUndefined();
  });
});

describe('the wiring form', () => {
  type Module = typeof import('@/lib/layouts/wiring-sheet');
  let schema: Module['wiringFormSchema'];
  beforeEach(async () => {
    vi.resetModules();
    schema = (await import('@/lib/layouts/wiring-sheet')).wiringFormSchema;
  });
  const issues = (input: unknown) => schema.safeParse(input).error?.issues.map((i) => `${i.path.join('.')}: ${i.message}`);

  it('takes the sheet text as it is and the version as a number, blank for a new sheet', () => {
    expect(schema.parse({ sheet: '{}', version: '' })).toEqual({ sheet: '{}', version: null });
    expect(schema.parse({ sheet: '{}', version: '12' })).toEqual({ sheet: '{}', version: 12 });
    expect(schema.parse({ sheet: '{}', version: '999999999' })).toEqual({ sheet: '{}', version: 999_999_999 });
  });

  it('sheet text of 2 to 200 000 characters (200 KB, the form’s own limit)', () => {
    expect(issues({ sheet: 'x', version: '' })).toEqual(['sheet: paste the wiring sheet']);
    expect(schema.safeParse({ sheet: 'x'.repeat(200_000), version: '' }).success).toBe(true);
    expect(issues({ sheet: 'x'.repeat(200_001), version: '' })).toEqual(['sheet: must be 200 KB or less']);
  });

  it('a version of up to nine digits and nothing else', () => {
    for (const version of ['1a', 'a1', '-1', '1.5', ' 1', '1234567890']) expect(issues({ sheet: '{}', version })).toEqual(['version: must be a whole number']);
  });
});
