// A separate process that writes through Fishplate's own database code: one row per transaction,
// printing each id only after its commit returned (an acknowledged write).
import { getDb } from '@/db';
import { recordAudit } from '@/db/queries/railways';

const [label = 'w', countText = '1000000', start = 'now'] = process.argv.slice(2);
const count = Number(countText);
getDb();
// `wait`: say "ready" over the IPC channel and start writing only when told, so that the test can
// start every writer at once however long each took to start.
if (start === 'wait' && process.send) {
  process.send('ready');
  await new Promise((resolve) => process.once('message', resolve));
}
for (let i = 0; i < count; i++) {
  const id = `${label}-${i}`;
  recordAudit({ railwayId: null, userId: null, action: 'write', entity: 'test', entityId: id });
  process.stdout.write(`${id}\n`);
}
if (start === 'wait') process.disconnect?.();
