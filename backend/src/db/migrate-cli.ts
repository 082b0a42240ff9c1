// `npm run db:migrate`: applies pending migrations to DATABASE_PATH (default data/bellwether.db)
// without starting the server. The server also migrates at every start.
import { openMigratedDatabase } from './client';

const path = process.env.DATABASE_PATH ?? 'data/bellwether.db';
const db = openMigratedDatabase(path);
const applied = db.$client.prepare('select count(*) as count from __drizzle_migrations').get() as { count: number };
console.log(`Migrated ${path}: ${applied.count} migrations applied in total.`);
db.$client.close();
