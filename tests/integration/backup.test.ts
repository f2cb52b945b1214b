import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { spawn } from 'node:child_process';
import Database from 'better-sqlite3';
import { describe, expect, it } from 'vitest';
import { openDatabase } from '@/db';
import { backupDatabase } from '@/lib/cli/backup';
import { restoreDatabase } from '@/lib/cli/restore';

function tempDir() {
  return fs.mkdtempSync(path.join(os.tmpdir(), 'fishplate-backup-'));
}

describe('backup and restore', () => {
  it('copies a database that another process is writing to, consistently (synchronised on the writer’s events, not on time)', async () => {
    const dir = tempDir();
    const live = path.join(dir, 'live.db');
    openDatabase(live).$client.close(); // migrations applied
    // A separate process keeps writing audit rows while the backup runs. It says "ready" once its
    // first rows are committed and stops when its stdin closes: the test waits for those events,
    // not for a time, so a loaded machine only makes it slower.
    const writer = spawn(
      process.execPath,
      [
        '-e',
        `const D=require('better-sqlite3');const d=new D(${JSON.stringify(live)});d.pragma('busy_timeout=5000');
         const s=d.prepare("insert into audit_log(id,action,entity,at) values(?, 'write','test',0)");
         let i=0,open=true;process.stdin.on('end',()=>{open=false;});process.stdin.resume();
         const batch=()=>{for(let k=0;k<50;k++)s.run('w'+(i++));if(i===50)process.stdout.write('ready\\n');
           if(open)setImmediate(batch);else{process.stdout.write('wrote '+i+'\\n');d.close();}};
         batch();`,
      ],
      { cwd: process.cwd(), stdio: ['pipe', 'pipe', 'inherit'] },
    );
    let written = '';
    const ready = new Promise<void>((resolve) =>
      writer.stdout.on('data', (c) => {
        written += c;
        if (written.includes('ready')) resolve();
      }),
    );
    const exited = new Promise((r) => writer.on('exit', r));
    await ready;
    const copy = path.join(dir, 'copy.db');
    await backupDatabase(live, copy);
    writer.stdin.end();
    await exited;
    written = /wrote (\d+)/.exec(written)?.[1] ?? '0';
    const backup = new Database(copy, { readonly: true });
    expect(backup.pragma('integrity_check', { simple: true })).toBe('ok'); // SQLite: PRAGMA integrity_check
    const rows = backup.prepare('select count(*) n from audit_log').get() as { n: number };
    expect(rows.n).toBeGreaterThan(0);
    expect(rows.n).toBeGreaterThanOrEqual(50); // the rows committed before "ready"
    expect(rows.n).toBeLessThanOrEqual(Number(written));
    backup.close();
    fs.rmSync(dir, { recursive: true, force: true });
  });

  it('restores a backup, keeping the replaced file, and refuses a corrupt one', async () => {
    const dir = tempDir();
    const live = path.join(dir, 'live.db');
    const db = openDatabase(live);
    db.$client.prepare("insert into railways(id,name,time_zone,created_at) values('r1','Before','UTC',0)").run();
    db.$client.close();
    const copy = path.join(dir, 'copy.db');
    await backupDatabase(live, copy);
    const again = openDatabase(live);
    again.$client.prepare("update railways set name='After' where id='r1'").run();
    again.$client.close();

    const { keptAs } = restoreDatabase(copy, live);
    expect(keptAs && fs.existsSync(keptAs)).toBe(true);
    const restored = new Database(live, { readonly: true });
    expect((restored.prepare("select name from railways where id='r1'").get() as { name: string }).name).toBe('Before');
    restored.close();

    const bad = path.join(dir, 'bad.db');
    fs.writeFileSync(bad, 'this is not a database');
    expect(() => restoreDatabase(bad, live)).toThrow();
    fs.rmSync(dir, { recursive: true, force: true });
  });
});
