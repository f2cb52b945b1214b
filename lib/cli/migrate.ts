// npm run db:migrate — applies the migrations in drizzle/ to the database DATABASE_URL names.
import { closeDb, databasePath, openDatabase } from '@/db';

const db = openDatabase(databasePath());
db.$client.close();
closeDb();
console.log(`Migrations applied to ${databasePath()}.`);
