import type { StoredGirder } from './girder-calc-file';
import type { Database, Transaction } from '../db/database';
import { insertJsonRows } from '../db/json-rows-insert';
import { inChunks } from '../db/many-created';

/** A girder of a span with what its list shows: its type's name and its strand rows counted. */
export interface GirderListRow {
  id: number;
  span_id: number;
  girder_number: number;
  position: 'interior' | 'exterior';
  girder_type_name: string | null;
  strand_row_count: string;
  strand_count: string | null;
  harped: boolean;
  debonded: boolean;
  concrete_strength_mpa: number;
  tensioning: 'pre' | 'post';
  version: number;
}

export async function findGirdersOfSpan(db: Database | Transaction, spanId: number): Promise<GirderListRow[]> {
  return db({ g: 'girders' })
    .leftJoin({ t: 'girder_types' }, 't.id', 'g.girder_type_id')
    .leftJoin({ r: 'strand_rows' }, 'r.girder_id', 'g.id')
    .where('g.span_id', spanId)
    .groupBy('g.id', 't.name')
    .orderBy('g.girder_number')
    .select(
      'g.id',
      'g.span_id',
      'g.girder_number',
      'g.position',
      't.name as girder_type_name',
      db.raw('count(r.id) as strand_row_count'),
      db.raw('sum(r.strand_count) as strand_count'),
      db.raw("jsonb_array_length(g.profiles) > 0 as harped"),
      db.raw("jsonb_array_length(g.debonding) > 0 as debonded"),
      db.raw("(g.concrete->>'strengthMpa')::double precision as concrete_strength_mpa"),
      'g.tensioning',
      'g.version',
    );
}

export interface GirderTypeRow {
  id: number;
  name: string;
  section: Record<string, unknown> & { shape: string; depthMm?: number };
  source: string;
  version: number;
  girder_count: string;
}

function girderTypesWithUse(db: Database | Transaction) {
  return db({ t: 'girder_types' })
    .leftJoin({ g: 'girders' }, 'g.girder_type_id', 't.id')
    .groupBy('t.id')
    .select('t.id', 't.name', 't.section', 't.source', 't.version', db.raw('count(g.id) as girder_count'));
}

export async function findGirderTypes(db: Database | Transaction): Promise<GirderTypeRow[]> {
  return girderTypesWithUse(db).orderBy('t.name');
}

export async function findGirderTypeById(db: Database | Transaction, id: number, { forUpdate = false } = {}): Promise<GirderTypeRow | undefined> {
  if (forUpdate) await db('girder_types').where({ id }).forUpdate().first('id');
  return girderTypesWithUse(db).where('t.id', id).first();
}

/** The districts whose girders use a type: changing its shape changes theirs. */
export async function findDistrictsUsingGirderType(db: Database | Transaction, typeId: number): Promise<string[]> {
  return db({ g: 'girders' })
    .join({ sp: 'spans' }, 'sp.id', 'g.span_id')
    .join({ s: 'structures' }, 's.id', 'sp.structure_id')
    .where('g.girder_type_id', typeId)
    .distinct('s.district')
    .orderBy('s.district')
    .pluck('s.district');
}

export async function girderTypeNameTaken(db: Database | Transaction, name: string, exceptId?: number): Promise<boolean> {
  const query = db('girder_types').whereRaw('lower(name) = lower(?)', [name]).first('id');
  if (exceptId !== undefined) query.whereNot({ id: exceptId });
  return (await query) !== undefined;
}

export async function insertGirderType(trx: Transaction, type: { name: string; section: unknown; source: string }, userId: number): Promise<number> {
  const [row] = await trx('girder_types').insert({ name: type.name, section: JSON.stringify(type.section), source: type.source, created_by: userId, updated_by: userId }).returning('id');
  return (row as { id: number }).id;
}

export async function updateGirderType(trx: Transaction, id: number, expectedVersion: number, changes: { name?: string; section?: unknown; source?: string }, userId: number): Promise<boolean> {
  const values: Record<string, unknown> = { ...changes };
  if (changes.section !== undefined) values['section'] = JSON.stringify(changes.section);
  const updated = await trx('girder_types')
    .where({ id, version: expectedVersion })
    .update({ ...values, version: trx.raw('version + 1'), updated_by: userId, updated_at: trx.fn.now() });
  return updated === 1;
}

/** One girder row with where it sits, its type and the name of whoever changed it last. */
export interface GirderRow {
  id: number;
  span_id: number;
  span_index: number;
  structure_id: number;
  structure_number: string;
  district: string;
  girder_number: number;
  position: 'interior' | 'exterior';
  girder_type_id: number | null;
  girder_type_name: string | null;
  type_section: Record<string, unknown> | null;
  section: Record<string, unknown> | null;
  section_overrides: Record<string, number>;
  concrete: StoredGirder['girder']['concrete'];
  deck_concrete: StoredGirder['girder']['deck_concrete'];
  tensioning: 'pre' | 'post';
  losses: Record<string, unknown>;
  profiles: unknown[];
  debonding: unknown[];
  bars: StoredGirder['girder']['bars'];
  version: number;
  updated_at: Date;
  updated_by_name: string | null;
}

export type StrandRowRecord = StoredGirder['strandRows'][number];

const STRAND_ROW_COLUMNS = ['row_key', 'y_mm', 'strand_count', 'x_mm', 'strand_area_mm2', 'strand_diameter_mm', 'fpu_mpa', 'fpy_mpa', 'eps_mpa', 'fpe_mpa', 'bonded', 'unbonded_length_mm'] as const;

/** Every girder of a span as a rating reads it: its row, its type's section and its strand rows in order. */
export async function findStoredGirdersOfSpan(db: Database | Transaction, spanId: number): Promise<(StoredGirder & { id: number })[]> {
  const girders: (GirderRow & { type_section: Record<string, unknown> | null })[] = await db({ g: 'girders' })
    .leftJoin({ t: 'girder_types' }, 't.id', 'g.girder_type_id')
    .where('g.span_id', spanId)
    .orderBy('g.girder_number')
    .select('g.*', 't.section as type_section');
  const rows: (StrandRowRecord & { girder_id: number })[] = await db('strand_rows')
    .whereIn('girder_id', girders.map((girder) => girder.id))
    .orderBy(['girder_id', 'row_order'])
    .select('girder_id', ...STRAND_ROW_COLUMNS);
  return girders.map((girder) => ({
    id: girder.id,
    girder,
    typeSection: girder.type_section,
    strandRows: rows.filter((row) => row.girder_id === girder.id).map(({ girder_id: _girderId, ...row }) => row),
  }));
}

function girdersWithPlace(db: Database | Transaction) {
  return db({ g: 'girders' })
    .join({ sp: 'spans' }, 'sp.id', 'g.span_id')
    .join({ s: 'structures' }, 's.id', 'sp.structure_id')
    .leftJoin({ t: 'girder_types' }, 't.id', 'g.girder_type_id')
    .leftJoin({ u: 'users' }, 'u.id', 'g.updated_by')
    .select(
      'g.*',
      'sp.span_index',
      'sp.structure_id',
      's.structure_number',
      's.district',
      't.name as girder_type_name',
      't.section as type_section',
      'u.display_name as updated_by_name',
    );
}

export async function findGirderById(db: Database | Transaction, id: number, { forUpdate = false } = {}): Promise<GirderRow | undefined> {
  const query = girdersWithPlace(db).where('g.id', id).first();
  if (forUpdate) query.forUpdate('g');
  return query;
}

/** The girders of these spans, by span and number. */
export async function findGirdersOfSpans(db: Database | Transaction, spanIds: readonly number[]): Promise<GirderRow[]> {
  if (spanIds.length === 0) return [];
  return girdersWithPlace(db).whereRaw('g.span_id = any(?)', [[...spanIds]]).orderBy(['g.span_id', 'g.girder_number']);
}

/** Which girder numbers these spans have already: a light read for telling new girders from stored ones. */
export async function findGirderNumbersOfSpans(db: Database | Transaction, spanIds: readonly number[]): Promise<{ span_id: number; girder_number: number }[]> {
  if (spanIds.length === 0) return [];
  return db('girders').whereRaw('span_id = any(?)', [[...spanIds]]).select('span_id', 'girder_number');
}

/** The strand rows of these girders in order, by girder id. */
export async function findStrandRowsOfGirders(db: Database | Transaction, girderIds: readonly number[]): Promise<Map<number, StrandRowRecord[]>> {
  const byGirder = new Map<number, StrandRowRecord[]>(girderIds.map((id) => [id, []]));
  if (girderIds.length === 0) return byGirder;
  const rows: (StrandRowRecord & { girder_id: number })[] = await db('strand_rows').whereRaw('girder_id = any(?)', [[...girderIds]]).orderBy(['girder_id', 'row_order']).select('girder_id', ...STRAND_ROW_COLUMNS);
  for (const { girder_id: girderId, ...row } of rows) byGirder.get(girderId)!.push(row);
  return byGirder;
}

export async function findStrandRows(db: Database | Transaction, girderId: number): Promise<StrandRowRecord[]> {
  return db('strand_rows')
    .where({ girder_id: girderId })
    .orderBy('row_order')
    .select(...STRAND_ROW_COLUMNS);
}


/** The girder columns a change writes; JSON columns are sent as text so arrays stay JSON. */
export type GirderColumns = Pick<GirderRow, 'position' | 'girder_type_id' | 'section' | 'section_overrides' | 'concrete' | 'deck_concrete' | 'tensioning' | 'losses' | 'profiles' | 'debonding' | 'bars'>;

const GIRDER_JSON_COLUMNS = ['section', 'section_overrides', 'concrete', 'deck_concrete', 'losses', 'profiles', 'debonding', 'bars'] as const;

/** JSON columns go to the driver as text: node-postgres would write a JavaScript array as a PostgreSQL array. */
function girderValues(columns: GirderColumns): Record<string, unknown> {
  const values: Record<string, unknown> = { ...columns };
  for (const column of GIRDER_JSON_COLUMNS) values[column] = columns[column] === null ? null : JSON.stringify(columns[column]);
  return values;
}

async function insertStrandRows(trx: Transaction, girderId: number, strandRows: readonly StrandRowRecord[], userId: number): Promise<void> {
  await insertStrandRowsOfGirders(trx, [girderId], [{ strandRows }], userId);
}

/** Strand rows of many girders (ids at the same index) in a few statements, each girder's in the order given. */
async function insertStrandRowsOfGirders(trx: Transaction, girderIds: readonly number[], girders: readonly { strandRows: readonly StrandRowRecord[] }[], userId: number): Promise<void> {
  const values: StrandRowInsertRow[] = [];
  girders.forEach(({ strandRows }, at) => {
    for (let rowOrder = 0; rowOrder < strandRows.length; rowOrder += 1) values.push(strandRowInsertRow(girderIds[at]!, rowOrder, strandRows[rowOrder]!, userId));
  });
  await Promise.all([...inChunks(values, ROWS_PER_INSERT)].map((chunk) => insertJsonRows(trx, 'strand_rows', chunk)));
}

type StrandRowInsertRow = StrandRowRecord & { girder_id: number; row_order: number; created_by: number; updated_by: number };

/**
 * A strand row as its insert writes it. Each column is named, not spread from the record: rows of
 * one shape are quicker to build and to write as JSON, and a bulk import writes tens of thousands.
 */
function strandRowInsertRow(girderId: number, rowOrder: number, row: StrandRowRecord, userId: number): StrandRowInsertRow {
  return {
    girder_id: girderId,
    row_order: rowOrder,
    row_key: row.row_key,
    y_mm: row.y_mm,
    strand_count: row.strand_count,
    x_mm: row.x_mm,
    strand_area_mm2: row.strand_area_mm2,
    strand_diameter_mm: row.strand_diameter_mm,
    fpu_mpa: row.fpu_mpa,
    fpy_mpa: row.fpy_mpa,
    eps_mpa: row.eps_mpa,
    fpe_mpa: row.fpe_mpa,
    bonded: row.bonded,
    unbonded_length_mm: row.unbonded_length_mm,
    created_by: userId,
    updated_by: userId,
  };
}

export async function insertGirder(trx: Transaction, spanId: number, girderNumber: number, columns: GirderColumns, strandRows: readonly StrandRowRecord[], userId: number): Promise<number> {
  const [id] = await insertGirders(trx, [{ spanId, girderNumber, columns, strandRows }], userId);
  return id!;
}

/** A girder to insert: where it goes and what it holds. */
export interface GirderInsert {
  readonly spanId: number;
  readonly girderNumber: number;
  readonly columns: GirderColumns;
  readonly strandRows: readonly StrandRowRecord[];
}

/** Rows per insert statement: a few megabytes of JSON text; as many as the service's step of girders (`GIRDERS_PER_STEP`). */
const ROWS_PER_INSERT = 2500;

/**
 * Inserts girders with their strand rows in a few statements; gives back their ids in the order
 * given. The ids are taken from the girders' sequence first, so that the strand rows are made
 * while the database writes the girders, and nothing written is read back.
 */
export async function insertGirders(trx: Transaction, girders: readonly GirderInsert[], userId: number): Promise<number[]> {
  if (girders.length === 0) return [];
  const ids = await takeGirderIds(trx, girders.length);
  const girderRows = girders.map((girder, at) => girderInsertRow(ids[at]!, girder, userId));
  await Promise.all([
    ...[...inChunks(girderRows, ROWS_PER_INSERT)].map((chunk) => insertJsonRows(trx, 'girders', chunk, { parsedAs: 'jsonb' })),
    insertStrandRowsOfGirders(trx, ids, girders, userId),
  ]);
  return ids;
}

/** As many new girder ids as asked for, from the sequence the girders' own ids come from. */
async function takeGirderIds(trx: Transaction, count: number): Promise<number[]> {
  const { rows } = await trx.raw<{ rows: { ids: string }[] }>("select string_agg(nextval(pg_get_serial_sequence('girders', 'id'))::text, ',') as ids from generate_series(1, ?)", [count]);
  return rows[0]!.ids.split(',').map(Number);
}

/** A girder as its insert writes it, every column named (see `strandRowInsertRow`). */
function girderInsertRow(id: number, { spanId, girderNumber, columns }: GirderInsert, userId: number) {
  return {
    id,
    span_id: spanId,
    girder_number: girderNumber,
    position: columns.position,
    girder_type_id: columns.girder_type_id,
    section: columns.section,
    section_overrides: columns.section_overrides,
    concrete: columns.concrete,
    deck_concrete: columns.deck_concrete,
    tensioning: columns.tensioning,
    losses: columns.losses,
    profiles: columns.profiles,
    debonding: columns.debonding,
    bars: columns.bars,
    created_by: userId,
    updated_by: userId,
  } satisfies Record<keyof GirderColumns, unknown> & Record<string, unknown>;
}

/** Writes the girder and replaces its strand rows as a whole, when the row still has the version read. */
export async function updateGirder(trx: Transaction, id: number, expectedVersion: number, columns: GirderColumns, strandRows: readonly StrandRowRecord[], userId: number): Promise<boolean> {
  const values = girderValues(columns);
  const updated = await trx('girders')
    .where({ id, version: expectedVersion })
    .update({ ...values, version: trx.raw('version + 1'), updated_by: userId, updated_at: trx.fn.now() });
  if (updated !== 1) return false;
  await trx('strand_rows').where({ girder_id: id }).delete();
  await insertStrandRows(trx, id, strandRows, userId);
  return true;
}
