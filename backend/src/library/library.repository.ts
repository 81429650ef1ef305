import type { Database, Transaction } from '../db/database';

export type LibraryTable = 'vehicles' | 'rating_policies';

export interface LibraryRow {
  id: string;
  version: string;
  definition: { name?: string; category?: string };
  source: string;
  created_at: Date;
}

/** Every version of every item, by id, newest version first. */
export async function findLibraryItems(db: Database | Transaction, table: LibraryTable): Promise<LibraryRow[]> {
  return db<LibraryRow>(table).select('id', 'version', 'definition', 'source', 'created_at').orderBy('id').orderBy('created_at', 'desc').orderBy('version', 'desc');
}

export async function findLatestVehicleVersion(trx: Transaction, id: string): Promise<string | undefined> {
  const row = await trx<LibraryRow>('vehicles').where({ id }).orderByRaw('version::int desc').first('version');
  return row?.version;
}

export async function libraryItemExists(trx: Transaction, table: LibraryTable, id: string, version: string): Promise<boolean> {
  return (await trx(table).where({ id, version }).first('id')) !== undefined;
}

export async function insertLibraryItem(trx: Transaction, table: LibraryTable, item: { id: string; version: string; definition: unknown; source: string; createdBy: number }): Promise<void> {
  await trx(table).insert({ id: item.id, version: item.version, definition: JSON.stringify(item.definition), source: item.source, created_by: item.createdBy });
}

export interface LibraryDefinitionRow {
  id: string;
  version: string;
  definition: Record<string, unknown> & { name?: string; category?: string };
}

/** The newest version of every item, with its whole definition: what a new rating uses. */
export async function findLatestLibraryDefinitions(db: Database | Transaction, table: LibraryTable): Promise<LibraryDefinitionRow[]> {
  // Vehicle versions count up (1, 2, …); policies name their own, so the newest row wins there.
  const newestFirst = table === 'vehicles' ? 'version::int desc' : 'created_at desc, version desc';
  const result = await db.raw(`select distinct on (id) id, version, definition from ?? order by id, ${newestFirst}`, [table]);
  return result.rows as LibraryDefinitionRow[];
}
