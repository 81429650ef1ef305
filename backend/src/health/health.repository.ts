import type { Database } from '../db/database';

/** The PostGIS library version, which also proves the database answers and has the extension. */
export async function readPostgisVersion(db: Database): Promise<string> {
  const result = await db.raw<{ rows: Array<{ version: string }> }>('select postgis_lib_version() as version');
  const row = result.rows[0];
  if (!row) throw new Error('postgis_lib_version() returned no row');
  return row.version;
}
