import type { LibraryItemSummary, RatingPolicy, SignedInUser, VehicleDefinition } from '../../../shared/src';
import { recordAuditEvent } from '../audit/audit-events';
import { withTransaction, type Database } from '../db/database';
import { AppError } from '../http/app-error';
import { findLatestVehicleVersion, findLibraryItems, insertLibraryItem, libraryItemExists, type LibraryRow, type LibraryTable } from './library.repository';

function toSummary(row: LibraryRow): LibraryItemSummary {
  return {
    id: row.id,
    version: row.version,
    name: row.definition.name ?? row.id,
    category: row.definition.category ?? null,
    source: row.source,
    createdAt: row.created_at.toISOString(),
  };
}

export async function listLibrary({ db }: { db: Database }, table: LibraryTable): Promise<LibraryItemSummary[]> {
  return (await findLibraryItems(db, table)).map(toSummary);
}

/** Adds a vehicle as the next version of its id (a new id starts at 1); earlier versions stay for the ratings that used them. */
export async function addVehicleVersion({ db, user }: { db: Database; user: SignedInUser }, vehicle: VehicleDefinition): Promise<LibraryItemSummary> {
  return withTransaction(db, async (trx) => {
    await trx.raw('lock table vehicles in share row exclusive mode');
    const latest = await findLatestVehicleVersion(trx, vehicle.id);
    const version = String(latest === undefined ? 1 : Number(latest) + 1);
    await insertLibraryItem(trx, 'vehicles', { id: vehicle.id, version, definition: vehicle, source: vehicle.source, createdBy: user.id });
    await recordAuditEvent({ db: trx, user, action: 'vehicle.added', entity: { type: 'vehicle', id: `${vehicle.id}@${version}` }, after: vehicle });
    return (await findLibraryItems(trx, 'vehicles')).map(toSummary).find((item) => item.id === vehicle.id && item.version === version)!;
  });
}

/** Adds a rating policy under the version it names; a version already stored is never overwritten. */
export async function addPolicyVersion({ db, user }: { db: Database; user: SignedInUser }, policy: RatingPolicy): Promise<LibraryItemSummary> {
  return withTransaction(db, async (trx) => {
    if (await libraryItemExists(trx, 'rating_policies', policy.id, policy.version)) {
      throw AppError.alreadyExists(`Rating policy ${policy.id}@${policy.version} already exists; give the changed policy a new version`, 'version');
    }
    await insertLibraryItem(trx, 'rating_policies', { id: policy.id, version: policy.version, definition: policy, source: policy.source, createdBy: user.id });
    await recordAuditEvent({ db: trx, user, action: 'rating-policy.added', entity: { type: 'rating-policy', id: `${policy.id}@${policy.version}` }, after: policy });
    return (await findLibraryItems(trx, 'rating_policies')).map(toSummary).find((item) => item.id === policy.id && item.version === policy.version)!;
  });
}
