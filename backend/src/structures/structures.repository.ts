import type { Knex } from 'knex';
import { RATING_BANDS, type StructureListQuery, type StructureSortKey, type StructureStatus } from '../../../shared/src';
import { postgis, type Database, type Transaction } from '../db/database';
import { inChunks } from '../db/many-created';

/** One row of `structures` with the location split into degrees and the change stamps' user names. */
export interface StructureRow {
  id: number;
  structure_number: string;
  name: string;
  route_carried: string;
  feature_crossed: string;
  district: string;
  longitude: number;
  latitude: number;
  year_built: number | null;
  year_last_major_work: number | null;
  adt: number | null;
  adtt: number | null;
  skew_deg: number;
  deck_condition: number | null;
  superstructure_condition: number | null;
  substructure_condition: number | null;
  condition_rated_on: string | null;
  status: StructureStatus;
  notes: string;
  lowest_condition: number | null;
  rating_of_record_legal_rf: number | null;
  rating_of_record_inventory_rf: number | null;
  rerating_due: boolean;
  rating_of_record_approved_at: Date | null;
  /** 'YYYY-MM-DD' when the figures are a prior rating's. */
  rating_of_record_approved_on: string | null;
  version: number;
  created_at: Date;
  updated_at: Date;
  created_by_name: string | null;
  updated_by_name: string | null;
}

/** The columns people edit, as written to the table (the location is written as a point). */
export type StructureColumns = Partial<
  Pick<
    StructureRow,
    | 'structure_number'
    | 'name'
    | 'route_carried'
    | 'feature_crossed'
    | 'district'
    | 'year_built'
    | 'year_last_major_work'
    | 'adt'
    | 'adtt'
    | 'skew_deg'
    | 'deck_condition'
    | 'superstructure_condition'
    | 'substructure_condition'
    | 'condition_rated_on'
    | 'status'
    | 'notes'
  > & { longitude: number; latitude: number }
>;

type Db = Database | Transaction;

const LOWEST_CONDITION = 'least(s.deck_condition, s.superstructure_condition, s.substructure_condition)';
/** A span of the structure has damage or inventory changes no approved rating has taken in. */
const RERATING_DUE = 'exists (select 1 from spans as due where due.structure_id = s.id and due.rerating_due_since is not null)';

function ratingColumn(basis: StructureListQuery['ratingBasis']): string {
  return basis === 'legal' ? 's.rating_of_record_legal_rf' : 's.rating_of_record_inventory_rf';
}

const SORT_EXPRESSIONS: Readonly<Record<Exclude<StructureSortKey, 'ratingFactor'>, string>> = {
  structureNumber: 's.structure_number',
  name: 's.name',
  district: 's.district',
  yearBuilt: 's.year_built',
  adt: 's.adt',
  lowestCondition: LOWEST_CONDITION,
};

function selectStructureColumns(db: Db, query: Knex.QueryBuilder): Knex.QueryBuilder {
  const st = postgis(db);
  return query.select(
    's.id',
    's.structure_number',
    's.name',
    's.route_carried',
    's.feature_crossed',
    's.district',
    st.x('s.location').as('longitude'),
    st.y('s.location').as('latitude'),
    's.year_built',
    's.year_last_major_work',
    's.adt',
    's.adtt',
    's.skew_deg',
    's.deck_condition',
    's.superstructure_condition',
    's.substructure_condition',
    db.raw("to_char(s.condition_rated_on, 'YYYY-MM-DD') as condition_rated_on"),
    's.status',
    's.notes',
    db.raw(`${LOWEST_CONDITION} as lowest_condition`),
    's.rating_of_record_legal_rf',
    's.rating_of_record_inventory_rf',
    's.rating_of_record_approved_at',
    db.raw("to_char(s.rating_of_record_approved_on, 'YYYY-MM-DD') as rating_of_record_approved_on"),
    db.raw(`${RERATING_DUE} as rerating_due`),
    's.version',
    's.created_at',
    's.updated_at',
    'created_by.display_name as created_by_name',
    'updated_by.display_name as updated_by_name',
  );
}

/** `%` and `_` typed by a person are meant literally in a search. */
const likePattern = (text: string) => `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

/** The filters of a structure list, shared by the page of rows and the count of all of them. */
function applyFilters(db: Db, query: Knex.QueryBuilder, filter: StructureListQuery): Knex.QueryBuilder {
  const st = postgis(db);
  const { bbox, district, status, ratingBand, conditionAtMost, reratingDue, search } = filter;
  if (bbox) query.where(st.boundingBoxIntersects('s.location', st.makeEnvelope(bbox.minLon, bbox.minLat, bbox.maxLon, bbox.maxLat, 4326)));
  if (district && district.length > 0) query.whereIn('s.district', district);
  if (status && status.length > 0) query.whereIn('s.status', status);
  if (conditionAtMost !== undefined) query.whereRaw(`${LOWEST_CONDITION} <= ?`, [conditionAtMost]);
  if (reratingDue) query.whereRaw(RERATING_DUE);
  if (search) query.where((q) => q.whereILike('s.structure_number', likePattern(search)).orWhereILike('s.name', likePattern(search)));
  if (ratingBand && ratingBand.length > 0) {
    const column = ratingColumn(filter.ratingBasis);
    query.where((q) => {
      for (const band of RATING_BANDS.filter((b) => ratingBand.includes(b.key))) {
        if (band.key === 'not-rated') q.orWhereRaw(`${column} is null`);
        else q.orWhere((inBand) => {
          if (band.min !== null) inBand.whereRaw(`${column} >= ?`, [band.min]);
          if (band.max !== null) inBand.whereRaw(`${column} < ?`, [band.max]);
        });
      }
    });
  }
  return query;
}

function structuresWithStamps(db: Db): Knex.QueryBuilder {
  return db({ s: 'structures' })
    .leftJoin({ created_by: 'users' }, 'created_by.id', 's.created_by')
    .leftJoin({ updated_by: 'users' }, 'updated_by.id', 's.updated_by');
}

/** What a list of structures shows of each (the map's markers, its side list and card). */
export interface StructureListRow {
  id: number;
  structure_number: string;
  name: string;
  route_carried: string;
  feature_crossed: string;
  district: string;
  longitude: number;
  latitude: number;
  year_built: number | null;
  adt: number | null;
  adtt: number | null;
  status: StructureStatus;
  lowest_condition: number | null;
  rating_of_record_legal_rf: number | null;
  rating_of_record_inventory_rf: number | null;
  rerating_due: boolean;
}

/**
 * One page of the structures that match, in the asked order (ties by structure number), and how
 * many match in all — counted by a window over the same rows, so one query answers both. Only
 * the columns a list shows: the map asks for thousands at a time.
 */
export async function findStructures(db: Db, filter: StructureListQuery): Promise<{ rows: StructureListRow[]; total: number }> {
  const st = postgis(db);
  const { key, descending } = filter.sort;
  const sortExpression = key === 'ratingFactor' ? ratingColumn(filter.ratingBasis) : SORT_EXPRESSIONS[key];
  const rows: (StructureListRow & { matching: string })[] = await applyFilters(db, db({ s: 'structures' }), filter)
    .select(
      's.id',
      's.structure_number',
      's.name',
      's.route_carried',
      's.feature_crossed',
      's.district',
      st.x('s.location').as('longitude'),
      st.y('s.location').as('latitude'),
      's.year_built',
      's.adt',
      's.adtt',
      's.status',
      db.raw(`${LOWEST_CONDITION} as lowest_condition`),
      's.rating_of_record_legal_rf',
      's.rating_of_record_inventory_rf',
      db.raw(`${RERATING_DUE} as rerating_due`),
      db.raw('count(*) over () as matching'),
    )
    .orderByRaw(`${sortExpression} ${descending ? 'desc' : 'asc'} nulls last, s.structure_number`)
    .limit(filter.limit)
    .offset(filter.offset);
  if (rows.length > 0) return { rows, total: Number(rows[0]!.matching) };
  // A page past the end has no rows to carry the count.
  const [counted] = await applyFilters(db, db({ s: 'structures' }), filter).count<{ total: string }[]>({ total: '*' });
  return { rows, total: Number(counted?.total ?? 0) };
}

/** Every structure of the register in structure-number order, for exports. */
export async function findAllStructures(db: Db): Promise<StructureRow[]> {
  return selectStructureColumns(db, structuresWithStamps(db)).orderBy('s.structure_number');
}

/** The structures with these owner's numbers, as `findStructureById` reads each. */
export async function findStructuresByNumbers(db: Db, structureNumbers: readonly string[]): Promise<StructureRow[]> {
  if (structureNumbers.length === 0) return [];
  return selectStructureColumns(db, structuresWithStamps(db)).whereRaw('s.structure_number = any(?)', [[...structureNumbers]]);
}

export async function findStructureById(db: Db, id: number, { forUpdate = false } = {}): Promise<StructureRow | undefined> {
  const query = selectStructureColumns(db, structuresWithStamps(db)).where('s.id', id).first();
  // Lock only the structure's own row: the joined users are read, not changed.
  if (forUpdate) query.forUpdate('s');
  return query;
}

/** Districts that hold at least one structure, in name order. */
export async function findDistricts(db: Db): Promise<string[]> {
  const rows = await db('structures').distinct('district').orderBy('district');
  return rows.map((row: { district: string }) => row.district);
}

function columnsForWrite(db: Db, { longitude, latitude, ...columns }: StructureColumns): Record<string, unknown> {
  if (longitude === undefined || latitude === undefined) return columns;
  return { ...columns, location: db.raw('ST_SetSRID(ST_MakePoint(?, ?), 4326)', [longitude, latitude]) };
}

/** Writes the changed columns when the row still has the version the change was made from; false when it has moved on. */
export async function updateStructure(trx: Transaction, id: number, expectedVersion: number, columns: StructureColumns, userId: number): Promise<boolean> {
  const updated = await trx('structures')
    .where({ id, version: expectedVersion })
    .update({ ...columnsForWrite(trx, columns), version: trx.raw('version + 1'), updated_by: userId, updated_at: trx.fn.now() });
  return updated === 1;
}

/** Rows per insert statement: a structure row has about 20 columns, so this stays far under 65 535 parameters. */
const ROWS_PER_INSERT = 1000;

/** Inserts structures in a few statements; gives back their ids in the order given. */
export async function insertStructures(trx: Transaction, structures: readonly Required<StructureColumns>[], userId: number): Promise<number[]> {
  const ids: number[] = [];
  for (const chunk of inChunks(structures, ROWS_PER_INSERT)) {
    const inserted: { id: number; structure_number: string }[] = await trx('structures')
      .insert(chunk.map((columns) => ({ ...columnsForWrite(trx, columns), created_by: userId, updated_by: userId })))
      .returning(['id', 'structure_number']);
    // Matched by the owner's number, which is unique, rather than trusting the order RETURNING gives.
    const idOf = new Map(inserted.map((row) => [row.structure_number, row.id]));
    ids.push(...chunk.map((columns) => idOf.get(columns.structure_number)!));
  }
  return ids;
}

export async function structureNumberTaken(db: Db, structureNumber: string, exceptId?: number): Promise<boolean> {
  const query = db('structures').where({ structure_number: structureNumber }).first('id');
  if (exceptId !== undefined) query.whereNot({ id: exceptId });
  return (await query) !== undefined;
}

/** The district of each of these structures, by id (what decides who may change what hangs on them). */
export async function findDistrictsOfStructures(db: Db, ids: readonly number[]): Promise<Map<number, string>> {
  if (ids.length === 0) return new Map();
  const rows: { id: number; district: string }[] = await db('structures').whereRaw('id = any(?)', [[...ids]]).select('id', 'district');
  return new Map(rows.map((row) => [row.id, row.district]));
}
