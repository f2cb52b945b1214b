// npm run db:seed — adds the demo railway to the database DATABASE_URL names (once).
import { closeDb, databasePath, getDb } from '@/db';
import { DEMO_PASSWORD, DEMO_USERS, hasDemoData, seedDemoRailway } from '@/lib/demo/demo-railway';

const db = getDb();
if (hasDemoData(db)) {
  console.log(`The demo railway is already in ${databasePath()}.`);
} else {
  const { railwayId } = seedDemoRailway(db);
  console.log(`Seeded the demo railway (${railwayId}) into ${databasePath()}.`);
}
console.log(`Demo sign-ins (password "${DEMO_PASSWORD}"): ${DEMO_USERS.slice(0, 3).map((u) => u.email).join(', ')}`);
closeDb();
