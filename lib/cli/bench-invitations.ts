// Invitation benchmark: 200 invitations queued and delivered to the local mail server.
// Run: node --conditions=react-server --import tsx lib/cli/bench-invitations.ts [count]
// (the react-server condition lets the server-only modules load outside Next).
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

const count = Number(process.argv[2] ?? 200);
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'fishplate-bench-invitations-'));
process.env.DATABASE_URL = path.join(dir, 'bench.db');
process.env.NEXTAUTH_URL ??= 'http://localhost:3000';
process.env.NEXTAUTH_SECRET ??= 'bench-secret-0123456789abcdef';
delete process.env.SMTP_URL;

const { closeDb, getDb } = await import('@/db');
const schema = await import('@/db/schema');
const { seedDemoRailway } = await import('@/lib/demo/demo-railway');
const { inviteToSession } = await import('@/lib/invitations/send');
const { startLocalMailServer } = await import('@/lib/mail/local-server');
const { deliverDueMail } = await import('@/lib/mail/outbox');
const { closeTransport } = await import('@/lib/mail/transport');
const { eq } = await import('drizzle-orm');

const db = getDb();
const { railwayId, sessionId } = seedDemoRailway(db);
const host = db.select().from(schema.users).where(eq(schema.users.email, 'host@fishplate.example')).get()!;
const server = await startLocalMailServer(0);
process.env.LOCAL_SMTP_ACTUAL_PORT = String(server.port);

const guests = Array.from({ length: count }, (_, i) => `bench-crew-${i}@example.org`);
const t0 = performance.now();
const queued = inviteToSession({ railwayId, sessionId, host: { id: host.id, name: host.name, email: host.email }, userIds: [], guestEmails: guests });
const t1 = performance.now();
let sent = 0;
let failed = 0;
while (sent < queued.queued) {
  const r = await deliverDueMail(50);
  sent += r.sent;
  failed += r.failed;
  if (r.sent === 0 && r.failed === 0) break;
}
const t2 = performance.now();
// The catcher stores each message after parsing it; wait until all are in.
const caught = () => db.select({ id: schema.caughtMail.id }).from(schema.caughtMail).all().length;
for (let i = 0; i < 200 && caught() < queued.queued; i++) await new Promise((r) => setTimeout(r, 25));
const t3 = performance.now();
const rows = db.select().from(schema.outbox).all();
const avgBytes = rows.reduce((n, m) => n + Buffer.byteLength(m.text) + Buffer.byteLength(m.html ?? '') + Buffer.byteLength(m.calendar ?? ''), 0) / rows.length;

console.log(`Invitations: ${count} guests on the demo session (${os.cpus().length} cores, Node ${process.version})`);
console.log(`  queued in the outbox (one transaction):  ${(t1 - t0).toFixed(0)} ms (${queued.queued} messages, ~${(avgBytes / 1024).toFixed(1)} KiB of text, HTML and calendar each)`);
console.log(`  delivered over SMTP to the local server: ${(t2 - t1).toFixed(0)} ms (${sent} sent, ${failed} failed, ${((sent / (t2 - t1)) * 1000).toFixed(0)} messages/s)`);
console.log(`  all stored by the mail catcher:          ${(t3 - t0).toFixed(0)} ms from the host's click (${caught()} caught)`);
console.log(`  target: ${count} within 30 s — ${t3 - t0 < 30_000 && caught() === count ? 'met' : 'NOT met'}`);

closeTransport();
await new Promise<void>((resolve) => server.close(() => resolve()));
closeDb();
fs.rmSync(dir, { recursive: true, force: true });
