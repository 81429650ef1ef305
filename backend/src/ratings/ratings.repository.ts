import type { AppliedFinding, RateFile, RateOutput, RatingRun, RatingState, ReviewComment } from '../../../shared/src';
import type { Database, Transaction } from '../db/database';

type Db = Database | Transaction;

/** One row of `ratings` with where it sits and the names of the people on it. */
export interface RatingRow {
  id: number;
  span_id: number;
  span_index: number;
  span_length_m: number;
  structure_id: number;
  structure_number: string;
  structure_name: string;
  district: string;
  state: RatingState;
  run: RatingRun;
  run_at: Date;
  applied_findings: AppliedFinding[];
  hypothetical: boolean;
  engine_version: string;
  policy_id: string;
  policy_version: string;
  vehicles: { id: string; version: string; name: string; category: string | null }[];
  lowest_legal_rf: number | null;
  lowest_inventory_rf: number | null;
  warnings: string[];
  previous_record_id: number | null;
  review_comments: ReviewComment[];
  submitted_at: Date | null;
  submitted_by_name: string | null;
  reviewed_at: Date | null;
  reviewed_by_name: string | null;
  girder_count: string;
  version: number;
  created_by: number | null;
  created_by_name: string | null;
  created_at: Date;
}

export interface RatingGirderRow {
  girder_id: number;
  girder_number: number;
  position: 'interior' | 'exterior';
  calc_file: RateFile;
  output: RateOutput;
}

function ratingsWithPlace(db: Db) {
  return db({ r: 'ratings' })
    .join({ sp: 'spans' }, 'sp.id', 'r.span_id')
    .join({ s: 'structures' }, 's.id', 'sp.structure_id')
    .leftJoin({ created_by: 'users' }, 'created_by.id', 'r.created_by')
    .leftJoin({ submitted_by: 'users' }, 'submitted_by.id', 'r.submitted_by')
    .leftJoin({ reviewed_by: 'users' }, 'reviewed_by.id', 'r.reviewed_by')
    .select(
      'r.*',
      'sp.span_index',
      'sp.length_m as span_length_m',
      'sp.structure_id',
      's.structure_number',
      's.name as structure_name',
      's.district',
      'created_by.display_name as created_by_name',
      'submitted_by.display_name as submitted_by_name',
      'reviewed_by.display_name as reviewed_by_name',
      db.raw('(select count(*) from rating_girders rg where rg.rating_id = r.id) as girder_count'),
    );
}

export async function findRatingById(db: Db, id: number, { forUpdate = false } = {}): Promise<RatingRow | undefined> {
  const query = ratingsWithPlace(db).where('r.id', id).first();
  if (forUpdate) query.forUpdate('r');
  return query;
}

export async function findRatingGirders(db: Db, ratingId: number): Promise<RatingGirderRow[]> {
  return db('rating_girders').where({ rating_id: ratingId }).orderBy('girder_number').select('girder_id', 'girder_number', 'position', 'calc_file', 'output');
}

/** A structure's rating records, newest first. */
export async function findRatingsOfStructure(db: Db, structureId: number): Promise<RatingRow[]> {
  return ratingsWithPlace(db).where('sp.structure_id', structureId).orderBy([{ column: 'r.created_at', order: 'desc' }, { column: 'r.id', order: 'desc' }]);
}

/** Records waiting for review, oldest submission first: the review queue. */
export async function findRatingsWaitingForReview(db: Db): Promise<RatingRow[]> {
  return ratingsWithPlace(db).where('r.state', 'submitted').orderBy('r.submitted_at');
}

export async function findRatingOfRecord(db: Db, spanId: number): Promise<RatingRow | undefined> {
  return ratingsWithPlace(db).where({ 'r.span_id': spanId, 'r.state': 'approved' }).first();
}

/** The columns a run writes: its choices, what it applied and what the engine answered. */
export interface RatingRunColumns {
  run: RatingRun;
  applied_findings: readonly AppliedFinding[];
  hypothetical: boolean;
  engine_version: string;
  policy_id: string;
  policy_version: string;
  vehicles: RatingRow['vehicles'];
  lowest_legal_rf: number | null;
  lowest_inventory_rf: number | null;
  warnings: readonly string[];
  previous_record_id: number | null;
}

export interface RatingGirderColumns {
  girder_id: number;
  girder_number: number;
  position: 'interior' | 'exterior';
  calc_file: unknown;
  output: unknown;
}

/** JSON columns go to the driver as text: node-postgres would write a JavaScript array as a PostgreSQL array. */
function runValues(trx: Transaction, columns: RatingRunColumns) {
  return {
    ...columns,
    run: JSON.stringify(columns.run),
    applied_findings: JSON.stringify(columns.applied_findings),
    vehicles: JSON.stringify(columns.vehicles),
    warnings: JSON.stringify(columns.warnings),
    run_at: trx.fn.now(),
  };
}

async function insertRatingGirders(trx: Transaction, ratingId: number, girders: readonly RatingGirderColumns[]): Promise<void> {
  await trx('rating_girders').insert(
    girders.map((girder) => ({ ...girder, rating_id: ratingId, calc_file: JSON.stringify(girder.calc_file), output: JSON.stringify(girder.output) })),
  );
}

export async function insertRating(trx: Transaction, spanId: number, columns: RatingRunColumns, girders: readonly RatingGirderColumns[], userId: number): Promise<number> {
  const [row] = await trx('ratings')
    .insert({ ...runValues(trx, columns), span_id: spanId, state: 'draft', created_by: userId, updated_by: userId })
    .returning('id');
  const id = (row as { id: number }).id;
  await insertRatingGirders(trx, id, girders);
  return id;
}

/** Replaces a draft's run and girders when the row still has the version the rater read; false when it has moved on. */
export async function replaceRatingRun(trx: Transaction, id: number, expectedVersion: number, columns: RatingRunColumns, girders: readonly RatingGirderColumns[], userId: number): Promise<boolean> {
  const updated = await trx('ratings')
    .where({ id, version: expectedVersion })
    .update({ ...runValues(trx, columns), version: trx.raw('version + 1'), updated_by: userId, updated_at: trx.fn.now() });
  if (updated !== 1) return false;
  await trx('rating_girders').where({ rating_id: id }).delete();
  await insertRatingGirders(trx, id, girders);
  return true;
}

export interface RatingStepColumns {
  state: RatingState;
  review_comments?: readonly ReviewComment[];
  submitted?: boolean;
  reviewed?: boolean;
}

export async function updateRatingState(trx: Transaction, id: number, expectedVersion: number, step: RatingStepColumns, userId: number): Promise<boolean> {
  const updated = await trx('ratings')
    .where({ id, version: expectedVersion })
    .update({
      state: step.state,
      ...(step.review_comments ? { review_comments: JSON.stringify(step.review_comments) } : {}),
      ...(step.submitted ? { submitted_by: userId, submitted_at: trx.fn.now(), reviewed_by: null, reviewed_at: null } : {}),
      ...(step.reviewed ? { reviewed_by: userId, reviewed_at: trx.fn.now() } : {}),
      version: trx.raw('version + 1'),
      updated_by: userId,
      updated_at: trx.fn.now(),
    });
  return updated === 1;
}

/** The span's rating of record steps down; returns its id, if it had one. */
export async function supersedeRatingOfRecord(trx: Transaction, spanId: number, userId: number): Promise<number | null> {
  const [row] = await trx('ratings')
    .where({ span_id: spanId, state: 'approved' })
    .update({ state: 'superseded', version: trx.raw('version + 1'), updated_by: userId, updated_at: trx.fn.now() })
    .returning('id');
  return row ? (row as { id: number }).id : null;
}

/**
 * The structure's headline figures for the map: the lowest legal-load and design-inventory
 * factors over its spans' ratings of record and the latest approval — or, when Spanledger has
 * approved none, or none since the structure's newest prior rating on file, the lowest of the
 * prior ratings of that newest day (whole structure and spans alike), so an imported network is
 * coloured from the first day (and its day kept, `rating_of_record_approved_on`). Null when
 * neither exists.
 */
export async function refreshStructureRatingFigures(trx: Transaction, structureId: number): Promise<void> {
  await trx.raw(
    `with spanledger as (
            select min(r.lowest_legal_rf) as legal, min(r.lowest_inventory_rf) as inventory, max(r.reviewed_at) as approved_at, null::date as approved_on
              from ratings r join spans sp on sp.id = r.span_id
             where sp.structure_id = ? and r.state = 'approved'),
          prior as (
            select min(pr.lowest_legal_rf) as legal, min(pr.design_inventory_rf) as inventory, (pr.approved_on::timestamp at time zone 'UTC') as approved_at, pr.approved_on
              from prior_ratings pr
             where pr.structure_id = ? and pr.approved_on = (select max(approved_on) from prior_ratings where structure_id = ?)
             group by pr.approved_on),
          figures as (
            select * from spanledger where approved_at is not null and approved_at >= coalesce((select approved_at from prior), '-infinity')
            union all
            select * from prior where (select approved_at from spanledger) is null or (select approved_at from spanledger) < prior.approved_at)
     update structures as s
        set rating_of_record_legal_rf = figures.legal, rating_of_record_inventory_rf = figures.inventory, rating_of_record_approved_at = figures.approved_at,
            rating_of_record_approved_on = figures.approved_on
       from (select 1) as one left join figures on true
      where s.id = ?`,
    [structureId, structureId, structureId, structureId],
  );
}

/**
 * Flags spans "re-rating due" as of now: the flag keeps the latest change, so only a rating run
 * after every change clears it. "Now" is the transaction's start, so a span flagged already in
 * this transaction is left as it is: an import flags each new span as it adds it, and again with
 * each page of its girders, and writing a row again costs the database a new version of it.
 */
export async function markSpansReratingDue(trx: Transaction, spanIds: readonly number[]): Promise<void> {
  if (spanIds.length === 0) return;
  await trx('spans').whereRaw('id = any(?)', [[...spanIds]]).whereRaw('rerating_due_since is distinct from current_timestamp').update({ rerating_due_since: trx.fn.now() });
}

/** Clears the span's flag when the approved rating was run after the change that raised it. */
export async function clearReratingDue(trx: Transaction, ratingId: number): Promise<void> {
  await trx.raw('update spans as sp set rerating_due_since = null from ratings as r where r.id = ? and sp.id = r.span_id and sp.rerating_due_since <= r.run_at', [ratingId]);
}

export async function spanReratingDue(db: Db, spanId: number): Promise<boolean> {
  const row = await db('spans').where({ id: spanId }).first('rerating_due_since');
  return row?.rerating_due_since != null;
}
