/**
 * Database chores for local and test runs.
 *   tsx scripts/db.ts migrate   create the database if needed and apply drizzle/ migrations
 *   tsx scripts/db.ts seed      add the demo shop (each seed step runs once)
 *   tsx scripts/db.ts reset     drop everything, migrate and seed (test databases only)
 */
import { loadConfig } from '../server/config';
import { createDb } from '../server/db/client';
import { dropEverything, ensureDatabase, runMigrations } from '../server/db/migrate';
import { seed } from '../server/seed/demo';

const cmd = process.argv[2];
const config = loadConfig();

if (!['migrate', 'seed', 'reset'].includes(cmd)) {
  console.error('usage: tsx scripts/db.ts migrate|seed|reset');
  process.exit(2);
}
if ((cmd === 'seed' || cmd === 'reset') && config.production) {
  console.error('db: the demo shop is never seeded with NODE_ENV=production (create the first admin with npm run setup)');
  process.exit(2);
}
if (cmd === 'reset' && config.env !== 'test') {
  console.error('db reset only runs with NODE_ENV=test');
  process.exit(2);
}

await ensureDatabase(config.databaseUrl);
const { db, pool } = createDb(config.databaseUrl, 2);
try {
  if (cmd === 'reset') await dropEverything(pool);
  if (cmd === 'migrate' || cmd === 'reset') await runMigrations(db);
  if (cmd === 'seed' || cmd === 'reset') await seed(db, (m) => console.log(`db: ${m}`));
  console.log(`db: ${cmd} done (${new URL(config.databaseUrl).pathname.slice(1)})`);
} finally {
  await pool.end();
}
