import { insertLayout } from '@/db/queries/layouts';
import { insertBlock, insertLink } from '@/db/queries/layout-blocks';
import { insertCab, insertDriver, insertSupply } from '@/db/queries/layout-power';
import { insertLocomotive, insertTrain } from '@/db/queries/layout-stock';
import { DEFAULT_TIMING } from '@/lib/control';
import type { ActionState } from '@/lib/errors';
import { formData } from '../world';
import { actionStatus, anyMember, plannerUp, type AuthzCase, type AuthzExemption, type Expect, type World } from './shared';

/** A small layout in `railwayId`: two linked blocks, a supply, a driver, a cab, a locomotive and a train. */
export function seedLayout(railwayId: string) {
  const layout = insertLayout(railwayId, { name: 'Seed layout', scaleName: 'H0 (NEM)', scaleRatio: 87, setting: 'indoor', notes: '' });
  const blockA = insertBlock(layout.id, { name: 'Seed east', lengthMm: 1500, positionMm: 0 });
  const blockB = insertBlock(layout.id, { name: 'Seed west', lengthMm: 1200, positionMm: 1500 });
  const blockC = insertBlock(layout.id, { name: 'Seed siding', lengthMm: 600, positionMm: 2700 });
  const link = insertLink(layout.id, blockA.id, blockB.id);
  const supply = insertSupply(layout.id, { name: 'Seed supply', volts: 15, amps: 3 });
  const spare = insertSupply(layout.id, { name: 'Spare supply', volts: 12, amps: 1 });
  const driver = insertDriver(layout.id, {
    name: 'Seed driver',
    supplyId: supply.id,
    presetId: null,
    partNumber: null,
    channels: 2,
    channelAmps: 1,
    channelPeakAmps: 2,
    totalAmps: null,
    dropVolts: 2.6,
  });
  const idle = insertDriver(layout.id, {
    name: 'Idle driver',
    supplyId: supply.id,
    presetId: 'bipolar-quad-half-h-1a',
    partNumber: null,
    channels: 2,
    channelAmps: 1,
    channelPeakAmps: 2,
    totalAmps: null,
    dropVolts: 2.6,
  });
  const cab = insertCab(layout.id, { name: 'Seed cab', driverId: driver.id, channel: 1 });
  const locomotive = insertLocomotive(layout.id, { name: 'Seed loco', runningAmps: 0.4, stallAmps: 0.9, ratedVolts: 12, topSpeedKmh: 80 });
  const spareLocomotive = insertLocomotive(layout.id, { name: 'Spare loco', runningAmps: 0.3, stallAmps: 0.8, ratedVolts: 12, topSpeedKmh: 60 });
  const train = insertTrain(layout.id, { name: 'Seed train', lightingAmps: 0.05, lengthMm: 900 }, [locomotive.id]);
  return { layout, blockA, blockB, blockC, link, supply, spare, driver, idle, cab, locomotive, spareLocomotive, train };
}

const ACTIONS = 'app/(app)/railways/[railwayId]/layouts/[layoutId]/actions.ts';
const LIST_ACTIONS = 'app/(app)/railways/[railwayId]/layouts/actions.ts';
type Seed = ReturnType<typeof seedLayout>;
type LayoutActions = typeof import('@/app/(app)/railways/[railwayId]/layouts/[layoutId]/actions');

/** A row per layout action: seeds a layout in our railway and calls the action with valid input. */
function actionCase(name: keyof LayoutActions, fields: (s: Seed) => Record<string, string | string[]>): AuthzCase {
  return {
    target: `${ACTIONS}#${name}`,
    call: async (w: World) => {
      const actions = await import('@/app/(app)/railways/[railwayId]/layouts/[layoutId]/actions');
      const seed = seedLayout(w.railway.id);
      const data = new FormData();
      for (const [k, v] of Object.entries(fields(seed))) for (const one of [v].flat()) data.append(k, one);
      return actionStatus(() => actions[name](w.railway.id, seed.layout.id, null, data));
    },
    expect: plannerUp,
  };
}

const ctx = <P>(params: P) => ({ params: Promise.resolve(params) });
const created: Expect = { ...plannerUp, planner: 201, host: 201 };

export const LAYOUT_CASES: AuthzCase[] = [
  {
    target: `${LIST_ACTIONS}#createLayout`,
    call: async (w) => {
      const { createLayout } = await import('@/app/(app)/railways/[railwayId]/layouts/actions');
      return actionStatus(async () =>
        (await createLayout(w.railway.id, null, formData({ name: 'New layout', scaleId: 'n-nem', customScaleName: '', customRatio: '', setting: 'indoor', notes: '' }))) as ActionState,
      );
    },
    expect: plannerUp,
  },
  {
    target: `${LIST_ACTIONS}#updateLayout`,
    call: async (w) => {
      const { updateLayout } = await import('@/app/(app)/railways/[railwayId]/layouts/actions');
      const { layout } = seedLayout(w.railway.id);
      return actionStatus(() =>
        updateLayout(w.railway.id, layout.id, null, formData({ name: 'Renamed', scaleId: 'tt-nem', customScaleName: '', customRatio: '', setting: 'outdoor', notes: 'n', version: '1' })),
      );
    },
    expect: plannerUp,
  },
  {
    target: `${LIST_ACTIONS}#deleteLayout`,
    call: async (w) => {
      const { deleteLayout } = await import('@/app/(app)/railways/[railwayId]/layouts/actions');
      const { layout } = seedLayout(w.railway.id);
      return actionStatus(() => deleteLayout(w.railway.id, layout.id, null, formData({ version: '1' })));
    },
    expect: plannerUp,
  },
  actionCase('createBlock', () => ({ name: 'New block', length: '2', unit: 'm', position: '3' })),
  actionCase('saveWiring', (s) => ({
    sheet: JSON.stringify({
      version: 1,
      boards: [{ id: 'u', kind: 'atmega328p', name: 'Board', emergencyStopPin: 'PD2', startPin: null }],
      cabs: [],
      blocks: [{ blockId: s.blockA.id, boardId: 'u', feeds: [], polarityPin: null, forwardTowards: [] }],
      timing: DEFAULT_TIMING,
    }),
    version: '',
  })),
  actionCase('updateBlock', (s) => ({ id: s.blockA.id, version: '1', name: 'Seed east', length: '60', unit: 'in', position: '0' })),
  actionCase('deleteBlock', (s) => ({ id: s.blockC.id, version: '1' })),
  actionCase('createLink', (s) => ({ blockAId: s.blockB.id, blockBId: s.blockC.id })),
  actionCase('deleteLink', (s) => ({ id: s.link.id })),
  actionCase('createSupply', () => ({ name: 'Second supply', volts: '18', amps: '5' })),
  actionCase('updateSupply', (s) => ({ id: s.supply.id, version: '1', name: 'Seed supply', volts: '16', amps: '4' })),
  actionCase('deleteSupply', (s) => ({ id: s.spare.id, version: '1' })),
  actionCase('createDriver', (s) => ({
    name: 'New driver', supplyId: s.supply.id, presetId: 'mosfet-dual-low-voltage-1-2a', partNumber: '', channels: '2',
    channelAmps: '1.2', channelPeakAmps: '3.2', totalAmps: '', dropVolts: '0.6',
  })),
  actionCase('updateDriver', (s) => ({
    id: s.driver.id, version: '1', name: 'Seed driver', supplyId: s.supply.id, presetId: '', partNumber: 'my own board', channels: '2',
    channelAmps: '1.5', channelPeakAmps: '2', totalAmps: '3', dropVolts: '1',
  })),
  actionCase('deleteDriver', (s) => ({ id: s.idle.id, version: '1' })),
  actionCase('createCab', (s) => ({ name: 'Cab two', driverId: s.driver.id, channel: '2' })),
  actionCase('updateCab', (s) => ({ id: s.cab.id, version: '1', name: 'Cab one', driverId: s.driver.id, channel: '2' })),
  actionCase('deleteCab', (s) => ({ id: s.cab.id, version: '1' })),
  actionCase('createLocomotive', () => ({ name: 'New loco', runningAmps: '0.3', stallAmps: '0.8', ratedVolts: '12', topSpeedKmh: '90' })),
  actionCase('updateLocomotive', (s) => ({ id: s.locomotive.id, version: '1', name: 'Seed loco', runningAmps: '0.35', stallAmps: '0.9', ratedVolts: '12', topSpeedKmh: '85' })),
  actionCase('deleteLocomotive', (s) => ({ id: s.spareLocomotive.id, version: '1' })),
  actionCase('createTrain', (s) => ({ name: 'New train', locomotiveIds: [s.locomotive.id, s.spareLocomotive.id], lightingAmps: '0', length: '1.2', unit: 'm' })),
  actionCase('updateTrain', (s) => ({ id: s.train.id, version: '1', name: 'Seed train', locomotiveIds: [s.spareLocomotive.id], lightingAmps: '0.02', length: '800', unit: 'mm' })),
  actionCase('deleteTrain', (s) => ({ id: s.train.id, version: '1' })),
  {
    target: 'app/api/layouts/[layoutId]/csv/[table]/route.ts#GET',
    call: async (w) => {
      const { GET } = await import('@/app/api/layouts/[layoutId]/csv/[table]/route');
      const { layout } = seedLayout(w.railway.id);
      return (await GET(new Request('http://t/api'), ctx({ layoutId: layout.id, table: 'blocks' }))).status;
    },
    expect: anyMember,
  },
  {
    target: 'app/api/layouts/[layoutId]/csv/[table]/route.ts#POST',
    call: async (w) => {
      const { POST } = await import('@/app/api/layouts/[layoutId]/csv/[table]/route');
      const { layout } = seedLayout(w.railway.id);
      const body = 'name,running_amps,stall_amps,rated_volts,top_speed_kmh\r\nCSV loco,0.3,0.8,12,70\r\n';
      return (await POST(new Request('http://t/api?mode=preview', { method: 'POST', body, headers: { 'content-type': 'text/csv' } }), ctx({ layoutId: layout.id, table: 'locomotives' }))).status;
    },
    expect: plannerUp,
  },
  {
    target: 'app/api/layouts/[layoutId]/plan/route.ts#GET',
    call: async (w) => {
      const { GET } = await import('@/app/api/layouts/[layoutId]/plan/route');
      const { layout } = seedLayout(w.railway.id);
      return (await GET(new Request('http://t/api'), ctx({ layoutId: layout.id }))).status;
    },
    expect: anyMember,
  },
  {
    target: 'app/api/layouts/import/route.ts#POST',
    call: async (w) => {
      const { POST } = await import('@/app/api/layouts/import/route');
      const { exportLayoutPlan } = await import('@/lib/layouts/plan-io');
      const { loadLayoutRows } = await import('@/db/queries/plan-data');
      const { layout } = seedLayout(w.railway.id);
      const plan = exportLayoutPlan(loadLayoutRows(layout.id));
      const body = JSON.stringify({ railwayId: w.railway.id, name: 'Imported', plan });
      return (await POST(new Request('http://t/api', { method: 'POST', body, headers: { 'content-type': 'application/json' } }), ctx({}))).status;
    },
    expect: created,
  },
  {
    target: 'app/api/layouts/[layoutId]/track-plan/route.ts#GET',
    call: async (w) => {
      const { GET } = await import('@/app/api/layouts/[layoutId]/track-plan/route');
      const { storeTrackPlan } = await import('@/lib/layouts/track-plan-store');
      const { updateLayoutById } = await import('@/db/queries/layouts');
      const { layout } = seedLayout(w.railway.id);
      updateLayoutById(w.railway.id, layout.id, 1, { trackPlanFile: storeTrackPlan(TINY_PNG, 'image/png'), trackPlanType: 'image/png' });
      return (await GET(new Request('http://t/api'), ctx({ layoutId: layout.id }))).status;
    },
    expect: anyMember,
  },
  {
    target: 'app/api/layouts/[layoutId]/track-plan/route.ts#POST',
    call: async (w) => {
      const { POST } = await import('@/app/api/layouts/[layoutId]/track-plan/route');
      const { layout } = seedLayout(w.railway.id);
      const form = new FormData();
      form.set('version', '1');
      form.set('file', new File([TINY_PNG], 'plan.png', { type: 'image/png' }));
      return (await POST(new Request('http://t/api', { method: 'POST', body: form }), ctx({ layoutId: layout.id }))).status;
    },
    expect: plannerUp,
  },
  {
    target: 'app/api/layouts/[layoutId]/track-plan/route.ts#DELETE',
    call: async (w) => {
      const { DELETE } = await import('@/app/api/layouts/[layoutId]/track-plan/route');
      const { storeTrackPlan } = await import('@/lib/layouts/track-plan-store');
      const { updateLayoutById } = await import('@/db/queries/layouts');
      const { layout } = seedLayout(w.railway.id);
      updateLayoutById(w.railway.id, layout.id, 1, { trackPlanFile: storeTrackPlan(TINY_PNG, 'image/png'), trackPlanType: 'image/png' });
      return (await DELETE(new Request('http://t/api?version=2', { method: 'DELETE' }), ctx({ layoutId: layout.id }))).status;
    },
    expect: plannerUp,
  },
];

export const LAYOUT_EXEMPTIONS: AuthzExemption[] = [];

/** A 1×1 PNG (signature, IHDR, IDAT, IEND). */
export const TINY_PNG = Uint8Array.from(
  Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==', 'base64'),
);
