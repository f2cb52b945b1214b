import type { ActionState } from '@/lib/errors';
import { CSV_TABLES, blockEditSchema, blockSchema, layoutEditSchema, layoutSchema, locomotiveEditSchema, locomotiveSchema, rowDeleteSchema, supplyEditSchema, supplySchema } from '@/lib/validations/layout';
import { wiringSheetSchema } from '@/lib/control';
import { seedLayout, TINY_PNG } from '../authz/layouts';
import { actionStatus, type World } from '../authz/shared';
import { DRIVER_BOUNDS, LOCOMOTIVE_BOUNDS, SUPPLY_BOUNDS, withinBounds } from '../../shared/expected-bounds';
import { perWorld, refused, worst, type HostileTarget } from './shared';

// Hostile id fields (`id` of a delete, `supplyId`, `driverId`, `locomotiveIds`, `blockAId`…) are
// random strings, never one of the layout's ids (random UUIDs), so those targets cannot be handed a
// valid request and need no pinning. Where every other field could by chance be valid (a name, a
// number), `refused` checks the target's own schema and pins `name` to a blank, which it refuses.

const ACTIONS = 'app/(app)/railways/[railwayId]/layouts/[layoutId]/actions.ts';
const LIST_ACTIONS = 'app/(app)/railways/[railwayId]/layouts/actions.ts';
type LayoutActions = typeof import('@/app/(app)/railways/[railwayId]/layouts/[layoutId]/actions');
type Seed = ReturnType<typeof seedLayout>;

const seed = perWorld((w) => seedLayout(w.railway.id));
const accepts = (schema: { safeParse: (v: unknown) => { success: boolean } }, extra: Record<string, unknown> = {}) =>
  (f: Record<string, string>) => schema.safeParse({ ...f, ...extra }).success && withinBounds(f, LAYOUT_BOUNDS);
const blankName = { name: ' ' };
// Limits from the tests' own table: a schema loosened by mistake no longer decides what counts as valid here.
const LAYOUT_BOUNDS = [...SUPPLY_BOUNDS, ...DRIVER_BOUNDS, ...LOCOMOTIVE_BOUNDS];

function savableSheet(text: string | undefined): boolean {
  try {
    return wiringSheetSchema.safeParse(JSON.parse(text ?? '')).success;
  } catch {
    return false;
  }
}

function formOf(fields: Record<string, string>): FormData {
  const data = new FormData();
  for (const [k, v] of Object.entries(fields)) data.append(k, v);
  return data;
}

/**
 * A layout action on the world's seeded layout. `fixed` adds real fields that are not under test
 * (the id of the row an edit names); `guard` pins fields the target would accept.
 */
function layoutAction(
  name: keyof LayoutActions,
  fields: string[],
  options: { fixed?: (s: Seed) => Record<string, string>; guard?: (f: Record<string, string>, s: Seed) => Record<string, string> } = {},
): HostileTarget {
  return {
    target: `${ACTIONS}#${name}`,
    kind: 'action',
    fields,
    setup: seed,
    send: async (w, f) => {
      const actions = await import('@/app/(app)/railways/[railwayId]/layouts/[layoutId]/actions');
      const s = seed(w);
      const all = { ...f, ...options.fixed?.(s) };
      return actionStatus(() => actions[name](w.railway.id, s.layout.id, null, formOf(options.guard ? options.guard(all, s) : all)));
    },
  };
}

const ctx = <P>(params: P) => ({ params: Promise.resolve(params) });
const url = (path: string) => `http://127.0.0.1:3999${path}`;

/** A track plan stored on the seeded layout (so that a removal has something to remove). */
const seedWithPlan = perWorld((w: World) => {
  const s = seed(w);
  return (async () => {
    const { storeTrackPlan } = await import('@/lib/layouts/track-plan-store');
    const { updateLayoutById } = await import('@/db/queries/layouts');
    const saved = updateLayoutById(w.railway.id, s.layout.id, s.layout.version, { trackPlanFile: storeTrackPlan(TINY_PNG, 'image/png'), trackPlanType: 'image/png' });
    if (!saved.ok) throw new Error('could not store the seed track plan');
    return { ...s, version: saved.row.version };
  })();
});

export const LAYOUT_HOSTILE: HostileTarget[] = [
  {
    target: `${LIST_ACTIONS}#createLayout`,
    kind: 'action',
    fields: ['name', 'scaleId', 'customScaleName', 'customRatio', 'setting', 'notes'],
    send: async (w, f) => {
      const { createLayout } = await import('@/app/(app)/railways/[railwayId]/layouts/actions');
      return actionStatus(async () => (await createLayout(w.railway.id, null, formOf(refused(f, accepts(layoutSchema), blankName)))) as ActionState);
    },
  },
  {
    target: `${LIST_ACTIONS}#updateLayout`,
    kind: 'action',
    fields: ['name', 'scaleId', 'customScaleName', 'customRatio', 'setting', 'notes', 'version'],
    setup: seed,
    send: async (w, f) => {
      const { updateLayout } = await import('@/app/(app)/railways/[railwayId]/layouts/actions');
      return actionStatus(() => updateLayout(w.railway.id, seed(w).layout.id, null, formOf(refused(f, accepts(layoutEditSchema), blankName))));
    },
  },
  {
    // The seeded layout has no sessions, so its current version alone would delete it: pinned.
    target: `${LIST_ACTIONS}#deleteLayout`,
    kind: 'action',
    fields: ['version'],
    setup: seed,
    send: async (w, f) => {
      const { deleteLayout } = await import('@/app/(app)/railways/[railwayId]/layouts/actions');
      const { layout } = seed(w);
      const current = (v: Record<string, string>) => rowDeleteSchema.pick({ version: true }).safeParse(v).data?.version === layout.version;
      return actionStatus(() => deleteLayout(w.railway.id, layout.id, null, formOf(refused(f, current, { version: '' }))));
    },
  },
  layoutAction('saveWiring', ['sheet', 'version'], {
    // A sheet that would pass every check is made invalid, so nothing is ever written.
    guard: (f) => refused(f, (v) => savableSheet(v.sheet), { sheet: '{' }),
  }),
  layoutAction('createBlock', ['name', 'length', 'unit', 'position'], { guard: (f) => refused(f, accepts(blockSchema), blankName) }),
  layoutAction('updateBlock', ['name', 'length', 'unit', 'position', 'version'], {
    fixed: (s) => ({ id: s.blockA.id }),
    guard: (f) => refused(f, accepts(blockEditSchema), blankName),
  }),
  layoutAction('deleteBlock', ['id', 'version']),
  layoutAction('createLink', ['blockAId', 'blockBId']),
  layoutAction('deleteLink', ['id']),
  layoutAction('createSupply', ['name', 'volts', 'amps'], { guard: (f) => refused(f, accepts(supplySchema), blankName) }),
  layoutAction('updateSupply', ['name', 'volts', 'amps', 'version'], {
    fixed: (s) => ({ id: s.supply.id }),
    guard: (f) => refused(f, accepts(supplyEditSchema), blankName),
  }),
  layoutAction('deleteSupply', ['id', 'version']),
  layoutAction('createDriver', ['name', 'supplyId', 'presetId', 'partNumber', 'channels', 'channelAmps', 'channelPeakAmps', 'totalAmps', 'dropVolts', 'dropOhms', 'dropMaxVolts', 'dropMaxOhms', 'peakPulseMs', 'packageWatts']),
  layoutAction('updateDriver', ['name', 'supplyId', 'presetId', 'partNumber', 'channels', 'channelAmps', 'channelPeakAmps', 'totalAmps', 'dropVolts', 'dropOhms', 'dropMaxVolts', 'dropMaxOhms', 'peakPulseMs', 'packageWatts', 'version'], {
    fixed: (s) => ({ id: s.driver.id }),
  }),
  layoutAction('deleteDriver', ['id', 'version']),
  layoutAction('createCab', ['name', 'driverId', 'channel']),
  layoutAction('updateCab', ['name', 'driverId', 'channel', 'version'], { fixed: (s) => ({ id: s.cab.id }) }),
  layoutAction('deleteCab', ['id', 'version']),
  layoutAction('createLocomotive', ['name', 'runningAmps', 'stallAmps', 'ratedVolts', 'topSpeedKmh', 'startVolts'], {
    guard: (f) => refused(f, accepts(locomotiveSchema), blankName),
  }),
  layoutAction('updateLocomotive', ['name', 'runningAmps', 'stallAmps', 'ratedVolts', 'topSpeedKmh', 'startVolts', 'version'], {
    fixed: (s) => ({ id: s.locomotive.id }),
    guard: (f) => refused(f, accepts(locomotiveEditSchema), blankName),
  }),
  layoutAction('deleteLocomotive', ['id', 'version']),
  layoutAction('createTrain', ['name', 'locomotiveIds', 'lightingAmps', 'length', 'unit']),
  layoutAction('updateTrain', ['name', 'locomotiveIds', 'lightingAmps', 'length', 'unit', 'version'], { fixed: (s) => ({ id: s.train.id }) }),
  layoutAction('deleteTrain', ['id', 'version']),
  {
    // CSV, not JSON: the hostile string is the file, committed (a preview writes nothing by
    // design) at the table's real basis — once raw, and once after each table's real header so
    // that the rows are read. A random string is never a valid row (numbers in range, known names).
    target: 'app/api/layouts/[layoutId]/csv/[table]/route.ts#POST',
    kind: 'json',
    setup: seed,
    send: async (w, body) => {
      const { POST } = await import('@/app/api/layouts/[layoutId]/csv/[table]/route');
      const { exportCsv, planCsvImport } = await import('@/lib/layouts/csv-import');
      const { loadLayoutRows } = await import('@/db/queries/plan-data');
      const { layout } = seed(w);
      const rows = loadLayoutRows(layout.id);
      const commit = async (table: (typeof CSV_TABLES)[number], text: string) => {
        const basis = planCsvImport(table, '', rows).preview.basis;
        const request = new Request(url(`/api/layouts/${layout.id}/csv/${table}?mode=commit&basis=${basis}`), { method: 'POST', body: text, headers: { 'content-type': 'text/csv' } });
        return (await POST(request, ctx({ layoutId: layout.id, table }))).status;
      };
      const statuses = [await commit('blocks', body)];
      for (const table of CSV_TABLES) statuses.push(await commit(table, `${exportCsv(table, rows).split(/\r?\n/)[0]}\r\n${body}`));
      return worst(statuses);
    },
  },
  {
    // Multipart, not JSON: the hostile string is the image file (at the layout's real version),
    // and, separately, the whole multipart body. It is never a PNG, JPEG or WebP by its bytes.
    target: 'app/api/layouts/[layoutId]/track-plan/route.ts#POST',
    kind: 'json',
    setup: seed,
    send: async (w, body) => {
      const { POST } = await import('@/app/api/layouts/[layoutId]/track-plan/route');
      const { layout } = seed(w);
      const form = new FormData();
      form.set('version', String(layout.version));
      form.set('file', new File([body], 'plan.png', { type: 'image/png' }));
      const asFile = await POST(new Request(url('/api/layouts/x/track-plan'), { method: 'POST', body: form }), ctx({ layoutId: layout.id }));
      const asBody = await POST(
        new Request(url('/api/layouts/x/track-plan'), { method: 'POST', body, headers: { 'content-type': 'multipart/form-data; boundary=hostile' } }),
        ctx({ layoutId: layout.id }),
      );
      return worst([asFile.status, asBody.status]);
    },
  },
  {
    // No body: the hostile strings are the layout id in the path and the `?version=` seen, each
    // with the other real. The current version with the real id would remove the plan: pinned.
    target: 'app/api/layouts/[layoutId]/track-plan/route.ts#DELETE',
    kind: 'action',
    fields: ['layoutId', 'version'],
    setup: seedWithPlan,
    send: async (w, f) => {
      const { DELETE } = await import('@/app/api/layouts/[layoutId]/track-plan/route');
      const { trackPlanVersionSchema } = await import('@/app/api/layouts/[layoutId]/track-plan/schema');
      const s = await seedWithPlan(w);
      const current = (v: Record<string, string>) => trackPlanVersionSchema.safeParse(v).data?.version === s.version;
      const { version } = refused(f, current, { version: '' });
      const remove = async (layoutId: string, v: string) =>
        (await DELETE(new Request(url(`/api/layouts/x/track-plan?${new URLSearchParams({ version: v })}`), { method: 'DELETE' }), ctx({ layoutId }))).status;
      return worst([await remove(s.layout.id, version!), await remove(f.layoutId!, String(s.version))]);
    },
  },
  {
    // The hostile body as sent, and as the `plan` of a request naming our railway (otherwise a
    // body without our railway id is a 404 before any of it is read). Never a valid plan file.
    target: 'app/api/layouts/import/route.ts#POST',
    kind: 'json',
    send: async (w, body) => {
      const { POST } = await import('@/app/api/layouts/import/route');
      const post = async (text: string) =>
        (await POST(new Request(url('/api/layouts/import'), { method: 'POST', body: text, headers: { 'content-type': 'application/json' } }), ctx({}))).status;
      return worst([await post(body), await post(`{"railwayId":${JSON.stringify(w.railway.id)},"plan":${body}}`)]);
    },
  },
];
