import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { GET as getCsv, POST as postCsv } from '@/app/api/layouts/[layoutId]/csv/[table]/route';
import { GET as getPlan } from '@/app/api/layouts/[layoutId]/plan/route';
import { POST as importPlan } from '@/app/api/layouts/import/route';
import { DELETE as deleteImage, GET as getImage, POST as postImage } from '@/app/api/layouts/[layoutId]/track-plan/route';
import { getLayout, insertLayout } from '@/db/queries/layouts';
import { loadLayoutRows } from '@/db/queries/plan-data';
import { resetEnvCache } from '@/lib/env';
import { planSchema } from '@/lib/planning';
import { signInAs } from './caller';
import { seedLayout, TINY_PNG } from './authz/layouts';
import { makeWorld } from './world';

const ctx = <P>(params: P) => ({ params: Promise.resolve(params) });
let uploads: string;

beforeAll(() => {
  uploads = fs.mkdtempSync(path.join(os.tmpdir(), 'fishplate-uploads-'));
  process.env.UPLOADS_DIR = uploads;
  resetEnvCache();
});
afterAll(() => fs.rmSync(uploads, { recursive: true, force: true }));

const JSON_TYPE = { 'content-type': 'application/json' };

async function csv(layoutId: string, table: string, body: string, query = 'mode=preview') {
  const res = await postCsv(new Request(`http://t/api?${query}`, { method: 'POST', body, headers: { 'content-type': 'text/csv' } }), ctx({ layoutId, table }));
  return { status: res.status, body: await res.json() };
}

async function exportCsv(layoutId: string, table: string) {
  const res = await getCsv(new Request('http://t/api'), ctx({ layoutId, table }));
  expect(res.status).toBe(200);
  return res.text();
}

/** Rows as comparable values, without ids and versions. */
function snapshot(layoutId: string) {
  const rows = loadLayoutRows(layoutId);
  const block = new Map(rows.blocks.map((b) => [b.id, b.name]));
  const locomotive = new Map(rows.locomotives.map((l) => [l.id, l.name]));
  return {
    blocks: rows.blocks.map(({ name, lengthMm, positionMm }) => ({ name, lengthMm, positionMm })).sort((a, b) => a.name.localeCompare(b.name)),
    links: rows.links.map((l) => [`${block.get(l.blockAId)}:${l.blockAEnd}`, `${block.get(l.blockBId)}:${l.blockBEnd}`].sort().join('|')).sort(),
    supplies: rows.supplies.map(({ name, volts, amps }) => ({ name, volts, amps })),
    drivers: rows.drivers.map(({ name, presetId, partNumber, channels, channelAmps, channelPeakAmps, totalAmps, dropVolts }) => ({ name, presetId, partNumber, channels, channelAmps, channelPeakAmps, totalAmps, dropVolts })),
    cabs: rows.cabs.map(({ name, channel }) => ({ name, channel })),
    locomotives: rows.locomotives.map(({ name, runningAmps, stallAmps, ratedVolts, topSpeedKmh }) => ({ name, runningAmps, stallAmps, ratedVolts, topSpeedKmh })),
    trains: rows.trains.map((t) => ({ name: t.name, lightingAmps: t.lightingAmps, lengthMm: t.lengthMm, consist: rows.consists.filter((c) => c.trainId === t.id).map((c) => locomotive.get(c.locomotiveId)) })),
  };
}

describe('CSV import and export', () => {
  it('previews per-row problems by row and column, and a commit of a malformed file leaves the database unchanged', async () => {
    const w = makeWorld();
    const seed = seedLayout(w.railway.id);
    signInAs(w.planner);
    const before = snapshot(seed.layout.id);
    const file = [
      'name,length,unit,position',
      'Down loop,2,m,3',
      'Up loop,abc,m,3',
      '',
      'Spur,40,yd,0',
      'down LOOP,1,m,0',
      '"Broken,1,m,0',
    ].join('\n');
    const preview = await csv(seed.layout.id, 'blocks', file);
    expect(preview.status).toBe(200);
    const issues = preview.body.issues as { row: number; column: string; message: string }[];
    // Spreadsheet rows: the header is row 1 and the blank line 4 still counts.
    expect(issues).toContainEqual({ row: 3, column: 'length', message: 'Enter a number, like 12 or 0.5.' });
    expect(issues).toContainEqual({ row: 5, column: 'unit', message: 'Choose a unit: mm, cm, m, in, ft.' });
    expect(issues).toContainEqual({ row: 6, column: 'name', message: 'The block “down LOOP” is already on row 2 of this file.' });
    expect(issues.some((i) => i.row === 7)).toBe(true);
    const commit = await csv(seed.layout.id, 'blocks', file, `mode=commit&basis=${preview.body.basis}`);
    expect(commit.status).toBe(400);
    expect(snapshot(seed.layout.id)).toEqual(before);
  });

  it('imports a valid file in one go: new rows added, matching names updated; a commit after a change is 409', async () => {
    const w = makeWorld();
    const seed = seedLayout(w.railway.id);
    signInAs(w.host);
    const file = 'name,running_amps,stall_amps,rated_volts,top_speed_kmh\r\nSeed loco,0.45,1.1,12,95\r\nNew shunter,0.25,0.7,12,50\r\n';
    const preview = await csv(seed.layout.id, 'locomotives', file);
    expect(preview.body).toMatchObject({ issues: [], counts: { create: 1, update: 1, unchanged: 0, error: 0 } });
    // Someone edits the table between preview and commit: the commit is refused and writes nothing.
    const stale = { ...preview.body };
    const { insertLocomotive } = await import('@/db/queries/layout-stock');
    insertLocomotive(seed.layout.id, { name: 'Sneaky', runningAmps: 0.1, stallAmps: 0.2, ratedVolts: 12, topSpeedKmh: 40 });
    expect((await csv(seed.layout.id, 'locomotives', file, `mode=commit&basis=${stale.basis}`)).status).toBe(409);
    expect(loadLayoutRows(seed.layout.id).locomotives.find((l) => l.name === 'Seed loco')?.runningAmps).toBe(0.4);
    const again = await csv(seed.layout.id, 'locomotives', file);
    const done = await csv(seed.layout.id, 'locomotives', file, `mode=commit&basis=${again.body.basis}`);
    expect(done.status).toBe(200);
    const locomotives = loadLayoutRows(seed.layout.id).locomotives;
    expect(locomotives.find((l) => l.name === 'Seed loco')).toMatchObject({ runningAmps: 0.45, stallAmps: 1.1, topSpeedKmh: 95, version: 2 });
    expect(locomotives.find((l) => l.name === 'New shunter')).toMatchObject({ runningAmps: 0.25 });
  });

  it('trains name their locomotives; an unknown one is a row error on the locomotives column', async () => {
    const w = makeWorld();
    const seed = seedLayout(w.railway.id);
    signInAs(w.planner);
    const file = 'name,locomotives,lighting_amps,length,unit\nPair,Seed loco; Spare loco,0.04,1.1,m\nGhost,Nobody,0,1,m\n';
    const preview = await csv(seed.layout.id, 'trains', file);
    expect(preview.body.issues).toEqual([
      { row: 3, column: 'locomotives', message: 'No locomotive named “Nobody” in this layout (import locomotives first; separate names with “;”).' },
    ]);
    const fixed = file.replace('Ghost,Nobody', 'Ghost,Spare loco');
    const ok = await csv(seed.layout.id, 'trains', fixed);
    expect(ok.body.issues).toEqual([]);
    expect((await csv(seed.layout.id, 'trains', fixed, `mode=commit&basis=${ok.body.basis}`)).status).toBe(200);
    const s = snapshot(seed.layout.id);
    expect(s.trains.find((t) => t.name === 'Pair')).toEqual({ name: 'Pair', lightingAmps: 0.04, lengthMm: 1100, consist: ['Seed loco', 'Spare loco'] });
  });

  it('refuses a header with a missing or unknown column once, at row 1', async () => {
    const w = makeWorld();
    const seed = seedLayout(w.railway.id);
    signInAs(w.planner);
    const preview = await csv(seed.layout.id, 'links', 'block_a,block_c\nSeed east,Seed west\n');
    expect(preview.body.issues).toEqual([
      { row: 1, column: 'block_b', message: 'The column “block_b” is missing (another block name).' },
      { row: 1, column: 'block_c', message: 'Unknown column “block_c”; the columns are block_a, block_b, block_a_end, block_b_end.' },
    ]);
  });

  it('refuses a file over 1 MB or over 5 000 rows with a clear message', async () => {
    const w = makeWorld();
    const seed = seedLayout(w.railway.id);
    signInAs(w.planner);
    const big = `name,length,unit,position\n${'x'.repeat(1_000_100)}`;
    const tooBig = await csv(seed.layout.id, 'blocks', big);
    expect(tooBig.status).toBe(413);
    expect(tooBig.body.error).toMatch(/limit is 1 MB/);
    const many = ['name,length,unit,position', ...Array.from({ length: 5001 }, (_, i) => `B${i},1,m,${i}`)].join('\n');
    const tooMany = await csv(seed.layout.id, 'blocks', many);
    expect(tooMany.status).toBe(413);
    expect(tooMany.body.error).toBe('The file has 5,001 rows; the limit is 5,000. Split it into smaller files.');
    const exactly = ['name,length,unit,position', ...Array.from({ length: 5000 }, (_, i) => `B${i},1,m,${i}`)].join('\n');
    expect((await csv(seed.layout.id, 'blocks', exactly)).body.counts.create).toBe(5000);
  });

  it('export → import into an empty layout gives the same rows, and importing the export again changes nothing', async () => {
    const w = makeWorld();
    const seed = seedLayout(w.railway.id);
    signInAs(w.planner);
    const empty = insertLayout(w.railway.id, { name: 'Empty', scaleName: 'H0 (NEM)', scaleRatio: 87, setting: 'indoor', notes: '' });
    for (const table of ['blocks', 'links', 'locomotives', 'trains']) {
      const text = await exportCsv(seed.layout.id, table);
      const p = await csv(empty.id, table, text);
      expect(p.body.issues).toEqual([]);
      expect((await csv(empty.id, table, text, `mode=commit&basis=${p.body.basis}`)).status).toBe(200);
      // The same file on the layout it came from: every row unchanged.
      const back = await csv(seed.layout.id, table, text);
      expect(back.body.counts).toMatchObject({ create: 0, update: 0, error: 0 });
      expect(await exportCsv(empty.id, table)).toBe(text);
    }
    const a = snapshot(seed.layout.id);
    const b = snapshot(empty.id);
    expect(b.blocks).toEqual(a.blocks);
    expect(b.links).toEqual(a.links);
    expect(b.locomotives).toEqual(a.locomotives);
    expect(b.trains).toEqual(a.trains);
  });

  it('links carry the ends of the rail joint: exported, read back, and a balloon loop is two links between one pair', async () => {
    const w = makeWorld();
    const seed = seedLayout(w.railway.id);
    signInAs(w.planner);
    // A balloon loop beyond Seed siding (position 2700): both of its ends meet the siding's b end.
    const blocks = await csv(seed.layout.id, 'blocks', 'name,length,unit,position\nBalloon,4,m,3300\n');
    expect((await csv(seed.layout.id, 'blocks', 'name,length,unit,position\nBalloon,4,m,3300\n', `mode=commit&basis=${blocks.body.basis}`)).status).toBe(200);
    const file = ['block_a,block_b,block_a_end,block_b_end', 'Seed siding,Balloon,b,a', 'Seed siding,Balloon,B,b', 'Seed west,Seed siding,,'].join('\n');
    const preview = await csv(seed.layout.id, 'links', file);
    expect(preview.body.issues).toEqual([]);
    expect(preview.body.rows.map((r: { label: string; action: string }) => `${r.label}: ${r.action}`)).toEqual([
      'Seed siding (b) — Balloon (a): create',
      'Seed siding (b) — Balloon (b): create',
      // Blank ends as the upgrade to ends gives them: Seed siding is further along, so it meets at its a end.
      'Seed west (b) — Seed siding (a): create',
    ]);
    expect((await csv(seed.layout.id, 'links', file, `mode=commit&basis=${preview.body.basis}`)).status).toBe(200);
    expect(snapshot(seed.layout.id).links).toEqual(['Balloon:a|Seed siding:b', 'Balloon:b|Seed siding:b', 'Seed east:b|Seed west:a', 'Seed siding:a|Seed west:b']);
    // The export writes every joint's ends; read back on its own layout, each joint is unchanged.
    const text = await exportCsv(seed.layout.id, 'links');
    expect(text.split('\r\n')[0]).toBe('block_a,block_b,block_a_end,block_b_end');
    expect(text).toContain('Seed siding,Balloon,b,b');
    expect((await csv(seed.layout.id, 'links', text)).body.counts).toMatchObject({ create: 0, unchanged: 4, error: 0 });
    // The same joint named from the other side is the same link; an old file without ends still imports.
    const flipped = await csv(seed.layout.id, 'links', 'block_a,block_b,block_a_end,block_b_end\nBalloon,Seed siding,b,b\n');
    expect(flipped.body.counts).toMatchObject({ create: 0, unchanged: 1 });
    const old = await csv(seed.layout.id, 'links', 'block_a,block_b\nSeed west,Seed east\n');
    // Seed west (1500) is further along than Seed east (0): its a end meets Seed east's b end, the stored joint.
    expect(old.body.counts).toMatchObject({ create: 0, unchanged: 1, error: 0 });
  });

  it('a link end that is not a or b, or a joint twice in one file, is a row problem on its column', async () => {
    const w = makeWorld();
    const seed = seedLayout(w.railway.id);
    signInAs(w.planner);
    const file = ['block_a,block_b,block_a_end,block_b_end', 'Seed west,Seed siding,c,a', 'Seed west,Seed siding,b,a', 'Seed siding,Seed west,a,b'].join('\n');
    const preview = await csv(seed.layout.id, 'links', file);
    expect(preview.body.issues).toEqual([
      { row: 2, column: 'block_a_end', message: 'must be the a end or the b end' },
      { row: 4, column: 'block_b', message: 'The link “Seed siding” (a end) — “Seed west” (b end) is already on row 3 of this file.' },
    ]);
    expect(preview.body.counts).toMatchObject({ create: 1, error: 2 });
    const before = snapshot(seed.layout.id);
    expect((await csv(seed.layout.id, 'links', file, `mode=commit&basis=${preview.body.basis}`)).status).toBe(400);
    expect(snapshot(seed.layout.id)).toEqual(before);
  });

  it('operators may export but not import; another railway’s layout is 404', async () => {
    const w = makeWorld();
    const seed = seedLayout(w.railway.id);
    signInAs(w.operator);
    expect((await getCsv(new Request('http://t/api'), ctx({ layoutId: seed.layout.id, table: 'trains' }))).status).toBe(200);
    expect((await csv(seed.layout.id, 'blocks', 'name,length,unit\nA,1,m\n')).status).toBe(403);
    signInAs(w.outsider);
    expect((await getCsv(new Request('http://t/api'), ctx({ layoutId: seed.layout.id, table: 'trains' }))).status).toBe(404);
    signInAs(w.planner);
    expect((await getCsv(new Request('http://t/api'), ctx({ layoutId: seed.layout.id, table: 'sessions' }))).status).toBe(400);
  });
});

describe('plan files', () => {
  it('export is a valid version-2 plan without runs, and imports back into a new layout unchanged', async () => {
    const w = makeWorld();
    const seed = seedLayout(w.railway.id);
    signInAs(w.planner);
    const res = await getPlan(new Request('http://t/api'), ctx({ layoutId: seed.layout.id }));
    expect(res.headers.get('content-disposition')).toMatch(/attachment; filename="Seed-layout-plan.json"/);
    const plan = await res.json();
    expect(planSchema.safeParse(plan).success).toBe(true);
    expect(plan.version).toBe(2); // every export writes version 2
    expect(plan.runs).toEqual([]);
    const post = await importPlan(
      new Request('http://t/api', { method: 'POST', body: JSON.stringify({ railwayId: w.railway.id, name: 'Copy', plan }), headers: JSON_TYPE }),
      ctx({}),
    );
    expect(post.status).toBe(201);
    const { id } = await post.json();
    expect(getLayout(w.railway.id, id)).toMatchObject({ name: 'Copy', scaleName: 'H0 (NEM)', scaleRatio: 87 });
    const again = await (await getPlan(new Request('http://t/api'), ctx({ layoutId: id }))).json();
    expect(snapshot(id)).toEqual(snapshot(seed.layout.id));
    // Same plan apart from the new ids.
    const strip = (p: typeof plan) => JSON.parse(JSON.stringify(p).replace(/"[0-9a-f-]{36}"/g, '"id"'));
    expect({ ...strip(again), layout: null }).toEqual({ ...strip(plan), layout: null });
  });

  it('a broken plan names the field and creates nothing', async () => {
    const w = makeWorld();
    const seed = seedLayout(w.railway.id);
    signInAs(w.planner);
    const plan = await (await getPlan(new Request('http://t/api'), ctx({ layoutId: seed.layout.id }))).json();
    plan.cabs[0].driverId = 'nope';
    expect(plan.version).toBe(2); // every export writes version 2
    delete plan.locomotives[1].topSpeedKmh;
    const res = await importPlan(new Request('http://t/api', { method: 'POST', body: JSON.stringify({ railwayId: w.railway.id, plan }), headers: JSON_TYPE }), ctx({}));
    expect(res.status).toBe(400);
    const body = await res.json();
    expect(body.issues).toContainEqual({ path: 'cabs[0].driverId', message: 'unknown driver "nope"' });
    plan.cabs[0].driverId = plan.drivers[0].id;
    const res2 = await importPlan(new Request('http://t/api', { method: 'POST', body: JSON.stringify({ railwayId: w.railway.id, plan }), headers: JSON_TYPE }), ctx({}));
    expect(res2.status).toBe(400);
    expect((await res2.json()).issues[0].path).toBe('locomotives[1].topSpeedKmh');
    const { listLayoutsWithCounts } = await import('@/db/queries/layouts');
    expect(listLayoutsWithCounts(w.railway.id)).toHaveLength(1);
    // Not JSON at all.
    expect((await importPlan(new Request('http://t/api', { method: 'POST', body: '{oops', headers: JSON_TYPE }), ctx({}))).status).toBe(400);
  });
});

describe('track-plan images', () => {
  const upload = (layoutId: string, bytes: Uint8Array<ArrayBuffer>, name: string, version = '1') => {
    const form = new FormData();
    form.set('version', version);
    form.set('file', new File([bytes], name, { type: 'image/png' }));
    return postImage(new Request('http://t/api', { method: 'POST', body: form }), ctx({ layoutId }));
  };

  it('stores a real PNG outside public/ under a random name and serves it to members only', async () => {
    const w = makeWorld();
    const seed = seedLayout(w.railway.id);
    signInAs(w.planner);
    const res = await upload(seed.layout.id, TINY_PNG, 'plan.png');
    expect(res.status).toBe(200);
    const layout = getLayout(w.railway.id, seed.layout.id)!;
    expect(layout.trackPlanFile).toMatch(/^[0-9a-f-]{36}\.png$/);
    expect(fs.existsSync(path.join(uploads, 'track-plans', layout.trackPlanFile!))).toBe(true);
    signInAs(w.operator);
    const served = await getImage(new Request('http://t/api'), ctx({ layoutId: seed.layout.id }));
    expect(served.status).toBe(200);
    expect(served.headers.get('content-type')).toBe('image/png');
    expect(new Uint8Array(await served.arrayBuffer())).toEqual(TINY_PNG);
    signInAs(w.outsider);
    expect((await getImage(new Request('http://t/api'), ctx({ layoutId: seed.layout.id }))).status).toBe(404);
  });

  it('refuses a file named .png whose bytes are not an image, and a stale version', async () => {
    const w = makeWorld();
    const seed = seedLayout(w.railway.id);
    signInAs(w.planner);
    const stored = () => (fs.existsSync(path.join(uploads, 'track-plans')) ? fs.readdirSync(path.join(uploads, 'track-plans')).length : 0);
    const before = stored();
    const fake = new TextEncoder().encode('<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>');
    const res = await upload(seed.layout.id, fake, 'innocent.png');
    expect(res.status).toBe(400);
    expect((await res.json()).error).toBe('This file is not a PNG, JPEG or WebP image (its contents were checked, not its name).');
    expect(getLayout(w.railway.id, seed.layout.id)?.trackPlanFile).toBeNull();
    expect(stored()).toBe(before);
    expect((await upload(seed.layout.id, TINY_PNG, 'a.png')).status).toBe(200);
    const files = fs.readdirSync(path.join(uploads, 'track-plans')).length;
    expect((await upload(seed.layout.id, TINY_PNG, 'b.png', '1')).status).toBe(409);
    // The refused upload left no file behind.
    expect(fs.readdirSync(path.join(uploads, 'track-plans')).length).toBe(files);
    const big = new Uint8Array(5 * 1024 * 1024 + 1);
    big.set(TINY_PNG);
    expect((await upload(seed.layout.id, big, 'big.png', '2')).status).toBe(413);
    const del = await deleteImage(new Request('http://t/api?version=2', { method: 'DELETE' }), ctx({ layoutId: seed.layout.id }));
    expect(del.status).toBe(200);
    expect(getLayout(w.railway.id, seed.layout.id)?.trackPlanFile).toBeNull();
    expect(fs.readdirSync(path.join(uploads, 'track-plans')).length).toBe(files - 1);
  });
});
