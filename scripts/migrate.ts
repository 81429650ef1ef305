/** `npm run migrate`: applies pending migrations to the configured database (which must be running) and copies in the engine's reference library. */
import { loadConfig } from '../backend/src/config';
import { createDatabase, migrationConfig } from '../backend/src/db/database';
import { syncReferenceLibrary } from '../backend/src/library/reference-library';

async function main(): Promise<void> {
  const db = createDatabase(loadConfig().databaseUrl, { min: 0, max: 1 });
  try {
    const [, applied] = (await db.migrate.latest(migrationConfig)) as [number, string[]];
    console.log(applied.length === 0 ? 'Already up to date' : `Applied:\n  ${applied.join('\n  ')}`);
    await syncReferenceLibrary(db);
    console.log('Vehicle library, rating policies and girder-type catalogue in step with this release');
  } finally {
    await db.destroy();
  }
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
