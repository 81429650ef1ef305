import type { Database, Transaction } from '../db/database';

type Db = Database | Transaction;

/** One rating on file from before Spanledger, with the span's index and the names of who wrote it. */
export interface PriorRatingRow {
  id: number;
  structure_id: number;
  span_id: number | null;
  span_index: number | null;
  lowest_legal_rf: number | null;
  design_inventory_rf: number | null;
  /** YYYY-MM-DD. */
  approved_on: string;
  source_note: string;
  import_id: number | null;
  version: number;
  created_at: Date;
  created_by_name: string | null;
}

function priorRatingsWithPlace(db: Db) {
  return db({ pr: 'prior_ratings' })
    .leftJoin({ sp: 'spans' }, 'sp.id', 'pr.span_id')
    .leftJoin({ created_by: 'users' }, 'created_by.id', 'pr.created_by')
    .select(
      'pr.id',
      'pr.structure_id',
      'pr.span_id',
      'sp.span_index',
      'pr.lowest_legal_rf',
      'pr.design_inventory_rf',
      db.raw("to_char(pr.approved_on, 'YYYY-MM-DD') as approved_on"),
      'pr.source_note',
      'pr.import_id',
      'pr.version',
      'pr.created_at',
      'created_by.display_name as created_by_name',
    );
}

/** The prior ratings of these structures, newest approval first (the whole structure before its spans on one day). */
export async function findPriorRatingsOfStructures(db: Db, structureIds: readonly number[]): Promise<PriorRatingRow[]> {
  if (structureIds.length === 0) return [];
  return priorRatingsWithPlace(db)
    .whereIn('pr.structure_id', structureIds)
    .orderBy([{ column: 'pr.approved_on', order: 'desc' }, { column: 'sp.span_index', order: 'asc', nulls: 'first' }, { column: 'pr.id', order: 'desc' }]);
}

/** The prior rating of the structure (or one span of it) approved on that day, if there is one. */
export async function findPriorRatingOfDay(trx: Transaction, structureId: number, spanId: number | null, approvedOn: string): Promise<PriorRatingRow | undefined> {
  return priorRatingsWithPlace(trx)
    .where({ 'pr.structure_id': structureId, 'pr.approved_on': approvedOn })
    .andWhere((query) => (spanId === null ? query.whereNull('pr.span_id') : query.where('pr.span_id', spanId)))
    .forUpdate('pr')
    .first();
}

/** The newest prior rating that covers the span: its own or its structure's, the span's own first on the same day. */
export async function findNewestPriorRatingOfSpan(db: Db, spanId: number): Promise<PriorRatingRow | undefined> {
  return priorRatingsWithPlace(db)
    .join({ rated: 'spans' }, 'rated.structure_id', 'pr.structure_id')
    .where('rated.id', spanId)
    .andWhere((query) => query.whereNull('pr.span_id').orWhere('pr.span_id', spanId))
    .orderBy([{ column: 'pr.approved_on', order: 'desc' }, { column: 'pr.span_id', order: 'asc', nulls: 'last' }, { column: 'pr.id', order: 'desc' }])
    .first();
}

export interface PriorRatingColumns {
  lowest_legal_rf: number | null;
  design_inventory_rf: number | null;
  source_note: string;
}

export async function insertPriorRating(trx: Transaction, place: { structure_id: number; span_id: number | null; approved_on: string }, columns: PriorRatingColumns, userId: number): Promise<number> {
  const [row] = await trx('prior_ratings')
    .insert({ ...place, ...columns, created_by: userId, updated_by: userId })
    .returning('id');
  return (row as { id: number }).id;
}

/** New figures or note for a prior rating, written by an import: the import claims it anew (migrations/20261220000100_prior_ratings.ts). */
export async function updatePriorRating(trx: Transaction, id: number, columns: PriorRatingColumns, userId: number): Promise<void> {
  await trx('prior_ratings')
    .where({ id })
    .update({ ...columns, import_id: null, version: trx.raw('version + 1'), updated_by: userId, updated_at: trx.fn.now() });
}
