// A separate process that writes through Fishplate's own database code: one row per transaction,
// printing each id only after its commit returned (an acknowledged write).
import { getDb } from '@/db';
import { recordAudit } from '@/db/queries/railways';

const [label = 'w', countText = '1000000'] = process.argv.slice(2);
const count = Number(countText);
getDb();
for (let i = 0; i < count; i++) {
  const id = `${label}-${i}`;
  recordAudit({ railwayId: null, userId: null, action: 'write', entity: 'test', entityId: id });
  process.stdout.write(`${id}\n`);
}
