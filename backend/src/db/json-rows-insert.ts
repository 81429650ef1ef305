import type { Database, Transaction } from './database';

/**
 * Inserts many rows in one statement that takes a single parameter: the rows as one JSON array,
 * spread into the table's columns by PostgreSQL's `json_populate_recordset`. A statement with a
 * parameter per value makes the driver build, and the server bind, tens of thousands of values
 * one by one — most of a bulk import's database time; one text is parsed once. A JSON object or
 * array given for a `jsonb` column is stored as that value, a JSON `null` as SQL null. Columns no
 * row names take their defaults; a column some rows name is null in the rows that leave it out
 * (not its default), so a NOT NULL column left out is refused rather than filled in.
 *
 * `parsedAs: 'jsonb'` has the server parse the array as `jsonb` once and hand each `jsonb` column
 * its value as it is: faster for a table of many `jsonb` columns (girders), slower for one of
 * plain values or `json` columns (strand rows, history), which the default `json` suits.
 */
export async function insertJsonRows<Returned extends Record<string, unknown>>(
  db: Database | Transaction,
  table: string,
  rows: readonly Record<string, unknown>[],
  { returning = [], parsedAs = 'json' }: { returning?: readonly string[]; parsedAs?: 'json' | 'jsonb' } = {},
): Promise<Returned[]> {
  if (rows.length === 0) return [];
  const columns = columnsOf(rows);
  const names = columns.map(() => '??').join(', ');
  const returningSql = returning.length > 0 ? ` returning ${returning.map(() => '??').join(', ')}` : '';
  const { rows: inserted } = await db.raw<{ rows: Returned[] }>(
    `insert into ?? (${names}) select ${names} from ${parsedAs}_populate_recordset(null::??, ?::${parsedAs})${returningSql}`,
    [table, ...columns, ...columns, table, JSON.stringify(rows), ...returning],
  );
  return inserted;
}

/** Every column any row names, in the order first met. */
function columnsOf(rows: readonly Record<string, unknown>[]): string[] {
  const columns = new Set<string>();
  for (const row of rows) for (const column in row) columns.add(column);
  return [...columns];
}
