// npm run db:seed — adds the demo railway to the database DATABASE_URL names (once).
// With --large-session it also adds a 200-run draft session for the speed benchmarks.
import { closeDb, databasePath, getDb } from '@/db';
import { DEMO_PASSWORD, DEMO_USERS, hasDemoData, seedDemoRailway, seedLargeSession } from '@/lib/demo/demo-railway';

const db = getDb();
if (hasDemoData(db)) {
  console.log(`The demo railway is already in ${databasePath()}.`);
} else {
  const { railwayId } = seedDemoRailway(db);
  console.log(`Seeded the demo railway (${railwayId}) into ${databasePath()}.`);
}
if (process.argv.includes('--large-session')) {
  const { sessionId, runCount } = seedLargeSession(db);
  console.log(`Added a ${runCount}-run draft session (${sessionId}).`);
}
console.log(`Demo sign-ins (password "${DEMO_PASSWORD}"): ${DEMO_USERS.slice(0, 3).map((u) => u.email).join(', ')}`);
closeDb();
