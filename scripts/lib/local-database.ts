import path from 'node:path';
import { createDatabase, migrationConfig, type Database } from '../../backend/src/db/database';
import { runDataLoadOnce } from '../../backend/src/db/data-loads';
import { syncReferenceLibrary } from '../../backend/src/library/reference-library';
import { seed as seedDemoConditions } from '../../seeds/demo-conditions';
import { seed as seedDemoInspections } from '../../seeds/demo-inspections';
import { seedDemoPhotos } from '../../seeds/demo-photos';
import { seed as seedDemoRatings } from '../../seeds/demo-ratings';
import type { ObjectStorage } from '../../backend/src/photos/object-storage';
import { seed as seedDemoInventory } from '../../seeds/demo-inventory';
import { seed as seedDemoStructures } from '../../seeds/demo-structures';
import { DATA_DIR } from './project-paths';
import { connectionUrl, ensureDatabase, startCluster, waitUntilAccepting, type ClusterSettings } from './postgres-cluster';

export const DEMO_DATA_LOAD = 'demo-scenario';
export const DEMO_INVENTORY_LOAD = 'demo-inventory';
export const DEMO_CONDITIONS_LOAD = 'demo-conditions';
export const DEMO_INSPECTIONS_LOAD = 'demo-inspections';
export const DEMO_RATINGS_LOAD = 'demo-ratings';
export const DEMO_PHOTOS_LOAD = 'demo-photos';

/** The project-local cluster used by `npm start`: kept between runs, durable defaults. */
export function localClusterSettings(port: number): ClusterSettings {
  return { dataDir: path.join(DATA_DIR, 'postgres'), port, disposable: false };
}

/** Brings the schema up to date, copies in the engine's reference library, and loads the demo scenario once. */
export async function prepareDatabase(db: Database, { loadDemo }: { loadDemo: boolean }): Promise<{ migrations: string[]; demoLoaded: boolean }> {
  const [, migrations] = (await db.migrate.latest(migrationConfig)) as [number, string[]];
  await syncReferenceLibrary(db);
  const demoLoaded = loadDemo ? await runDataLoadOnce(db, DEMO_DATA_LOAD, seedDemoStructures) : false;
  // A database from before the inventory existed gets the demo girders once too.
  if (loadDemo) await runDataLoadOnce(db, DEMO_INVENTORY_LOAD, seedDemoInventory);
  if (loadDemo) await runDataLoadOnce(db, DEMO_CONDITIONS_LOAD, seedDemoConditions);
  if (loadDemo) await runDataLoadOnce(db, DEMO_INSPECTIONS_LOAD, seedDemoInspections);
  // Ratings read the inspections' accepted findings, so they load after them.
  if (loadDemo) await runDataLoadOnce(db, DEMO_RATINGS_LOAD, seedDemoRatings);
  return { migrations, demoLoaded };
}

/** The demo inspections' drawn pictures, once, into the photo store (which must be running). */
export async function loadDemoPhotos(db: Database, storage: ObjectStorage): Promise<boolean> {
  return runDataLoadOnce(db, DEMO_PHOTOS_LOAD, (trx) => seedDemoPhotos(trx, storage));
}

/** Starts (or creates) the local cluster and its database, and returns its connection string. */
export async function bringUpLocalDatabase(settings: ClusterSettings, databaseName: string): Promise<{ url: string; created: boolean; alreadyRunning: boolean }> {
  const state = await startCluster(settings);
  await waitUntilAccepting(settings.port);
  await ensureDatabase(settings.port, databaseName);
  return { url: connectionUrl(settings.port, databaseName), ...state };
}

export { createDatabase };
