import fs from 'node:fs';
import path from 'node:path';
import Database from 'better-sqlite3';
import { describe, expect, it } from 'vitest';

const DIR = path.join(process.cwd(), 'drizzle');
const files = fs
  .readdirSync(DIR)
  .filter((f) => /^\d{4}_.*\.sql$/.test(f))
  .sort();
const apply = (db: Database.Database, file: string) => {
  for (const statement of fs.readFileSync(path.join(DIR, file), 'utf8').split('--> statement-breakpoint')) {
    if (statement.trim() !== '') db.exec(statement);
  }
};

describe('migration 0009: track ends along the line', () => {
  it('assigns link ends by position order, keeps every link, and lets a balloon loop join one end to both ends of a block', () => {
    const db = new Database(':memory:');
    const upgrade = files.findIndex((f) => f.startsWith('0009_'));
    expect(upgrade).toBeGreaterThan(0);
    for (const file of files.slice(0, upgrade)) apply(db, file);

    db.exec(`INSERT INTO railways (id, name, time_zone, created_at) VALUES ('r', 'R', 'UTC', 0)`);
    db.exec(`INSERT INTO layouts (id, railway_id, name, scale_name, scale_ratio, created_at) VALUES ('l', 'r', 'L', 'H0', 87, 0)`);
    for (const [id, pos] of [
      ['Y', 0],
      ['M', 1000],
      ['P1', 3000],
      ['P2', 3000],
    ] as const) {
      db.exec(`INSERT INTO blocks (id, layout_id, name, length_mm, position_mm) VALUES ('${id}', 'l', '${id}', 1000, ${pos})`);
    }
    // Written in either order, as planners did before links had ends.
    db.exec(`INSERT INTO links (id, layout_id, block_a_id, block_b_id) VALUES ('k1', 'l', 'Y', 'M'), ('k2', 'l', 'P1', 'M'), ('k3', 'l', 'M', 'P2'), ('k4', 'l', 'P1', 'P2')`);

    apply(db, files[upgrade]!);
    const links = db.prepare(`SELECT id, block_a_id a, block_a_end ae, block_b_id b, block_b_end be FROM links ORDER BY id`).all();
    expect(links).toEqual([
      { id: 'k1', a: 'Y', ae: 'b', b: 'M', be: 'a' }, // Y (0) before M (1000): Y's b end meets M's a end
      { id: 'k2', a: 'P1', ae: 'a', b: 'M', be: 'b' }, // P1 (3000) after M: M's b end meets P1's a end
      { id: 'k3', a: 'M', ae: 'b', b: 'P2', be: 'a' },
      { id: 'k4', a: 'P1', ae: 'b', b: 'P2', be: 'a' }, // equal positions: the default
    ]);
    const blocks = db.prepare(`SELECT positive_rail r, reversing_section s, reversing_place p FROM blocks`).all();
    expect(new Set(blocks.map((b) => JSON.stringify(b)))).toEqual(new Set([JSON.stringify({ r: 'right', s: 0, p: 0 })]));
    // A balloon loop: M's b end to both ends of the loop block, two links between the same pair.
    db.exec(`INSERT INTO blocks (id, layout_id, name, length_mm, position_mm) VALUES ('B', 'l', 'B', 3000, 4000)`);
    db.exec(`INSERT INTO links (id, layout_id, block_a_id, block_a_end, block_b_id, block_b_end) VALUES ('k5', 'l', 'M', 'b', 'B', 'a'), ('k6', 'l', 'M', 'b', 'B', 'b')`);
    expect(() => db.exec(`INSERT INTO links (id, layout_id, block_a_id, block_a_end, block_b_id, block_b_end) VALUES ('k7', 'l', 'M', 'b', 'B', 'b')`)).toThrow(/UNIQUE/);
    db.close();
  });
});
