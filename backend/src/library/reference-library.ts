import { isDeepStrictEqual } from 'node:util';
import girderTypeCatalogue from '../../../seeds/data/girder-types.json';
import { POLICY_LIBRARY, VEHICLE_LIBRARY } from '../../../shared/src';
import { withTransaction, type Database, type Transaction } from '../db/database';

/**
 * The engine's vehicle library and rating policies, and the girder-type catalogue, copied into
 * their tables so ratings can name the version they used and administrators can add versions.
 * Run at every start: a vehicle whose data file changed gets a new version; nothing is replaced.
 */
export async function syncReferenceLibrary(db: Database): Promise<void> {
  await withTransaction(db, async (trx) => {
    // One start at a time: two servers starting together must not both add version 2.
    await trx.raw('select pg_advisory_xact_lock(?)', [REFERENCE_LIBRARY_LOCK]);
    for (const vehicle of VEHICLE_LIBRARY.values()) await addVersionWhenChanged(trx, 'vehicles', vehicle.id, vehicle, vehicle.source);
    for (const policy of Object.values(POLICY_LIBRARY)) await addPolicyVersion(trx, policy.id, policy.version, policy, policy.source);
    await trx('girder_types')
      .insert(girderTypeCatalogue.types.map((type) => ({ name: type.name, section: JSON.stringify(type.section), source: type.source })))
      .onConflict('name')
      .ignore();
  });
}

/** An arbitrary constant naming this lock among the application's advisory locks. */
const REFERENCE_LIBRARY_LOCK = 7_202_612;

interface LibraryRow {
  id: string;
  version: string;
  definition: unknown;
}

async function latestVersion(trx: Transaction, table: string, id: string): Promise<LibraryRow | undefined> {
  return trx<LibraryRow>(table).where({ id }).orderByRaw('version::int desc').first();
}

async function addVersionWhenChanged(trx: Transaction, table: 'vehicles', id: string, definition: unknown, source: string): Promise<void> {
  const latest = await latestVersion(trx, table, id);
  if (latest && isDeepStrictEqual(latest.definition, JSON.parse(JSON.stringify(definition)))) return;
  const version = String(latest ? Number(latest.version) + 1 : 1);
  await trx(table).insert({ id, version, definition: JSON.stringify(definition), source });
}

/** Policies carry their own version (`lrfr-default@1`): a file with a new version number adds a row. */
async function addPolicyVersion(trx: Transaction, id: string, version: string, definition: unknown, source: string): Promise<void> {
  await trx('rating_policies').insert({ id, version, definition: JSON.stringify(definition), source }).onConflict(['id', 'version']).ignore();
}
