/** `npm run migrate`: applies pending migrations to the configured database (which must be running). */
import { loadConfig } from '../backend/src/config';
import { createDatabase, migrationConfig } from '../backend/src/db/database';

async function main(): Promise<void> {
  const db = createDatabase(loadConfig().databaseUrl, { min: 0, max: 1 });
  try {
    const [, applied] = (await db.migrate.latest(migrationConfig)) as [number, string[]];
    console.log(applied.length === 0 ? 'Already up to date' : `Applied:\n  ${applied.join('\n  ')}`);
  } finally {
    await db.destroy();
  }
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
