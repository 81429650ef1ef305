import {
  canInDistrict,
  ENGINE_VERSION,
  RATING_STATE_NAMES,
  RESULT_CAUTION,
  ratingFiguresOf,
  ratingResultRows,
  type RatingDetail,
  type RatingRun,
  type RatingSetup,
  type RatingSummary,
  type ReviewComment,
  type SignedInUser,
} from '../../../shared/src';
import { recordAuditEvent } from '../audit/audit-events';
import { withTransaction, type Database, type Transaction } from '../db/database';
import { findStoredGirdersOfSpan } from '../girders/girders.repository';
import { AppError } from '../http/app-error';
import { findOpenFindingsOfSpan, findPendingSuperstructureCondition } from '../inspections/inspections.repository';
import { findLatestLibraryDefinitions } from '../library/library.repository';
import { priorRatingOfRecordOfSpan } from '../prior-ratings/prior-ratings.service';
import { findSpanById } from '../spans/spans.repository';
import { findStructureById } from '../structures/structures.repository';
import { assembleRating, findingsAsApplied, rateAssembled, vehicleSummary, type RatingSources } from './rating-assembly';
import {
  clearReratingDue,
  findRatingById,
  findRatingGirders,
  findRatingOfRecord,
  findRatingsOfStructure,
  findRatingsWaitingForReview,
  insertRating,
  refreshStructureRatingFigures,
  replaceRatingRun,
  spanReratingDue,
  supersedeRatingOfRecord,
  updateRatingState,
  type RatingGirderColumns,
  type RatingRow,
  type RatingRunColumns,
} from './ratings.repository';

interface Reader {
  readonly db: Database;
}
interface Writer extends Reader {
  readonly user: SignedInUser;
}

const ratingNotFound = (id: number) => AppError.notFound(`There is no rating with id ${id}`);
const spanNotFound = (id: number) => AppError.notFound(`There is no span with id ${id}`);
const describe = (row: Pick<RatingRow, 'id' | 'structure_number' | 'span_index'>) => `Rating ${row.id} of ${row.structure_number} span ${row.span_index}`;
const stamp = (at: Date | null, by: string | null) => (at ? { at: at.toISOString(), by } : null);

function toSummary(row: RatingRow): RatingSummary {
  return {
    id: row.id,
    structureId: row.structure_id,
    structureNumber: row.structure_number,
    structureName: row.structure_name,
    district: row.district,
    spanId: row.span_id,
    spanIndex: row.span_index,
    state: row.state,
    girderCount: Number(row.girder_count),
    hypothetical: row.hypothetical,
    lowestLegalRf: row.lowest_legal_rf,
    lowestInventoryRf: row.lowest_inventory_rf,
    created: { at: row.created_at.toISOString(), by: row.created_by_name, byUserId: row.created_by },
    submitted: stamp(row.submitted_at, row.submitted_by_name),
    reviewed: stamp(row.reviewed_at, row.reviewed_by_name),
    version: row.version,
  };
}

const ranIt = (user: SignedInUser, row: Pick<RatingRow, 'created_by'>) => row.created_by === user.id;

/** Which steps the user may take on the record now; the same rules the steps themselves enforce. */
function allowedSteps(user: SignedInUser | null, row: RatingRow): RatingDetail['allowed'] {
  if (!user) return { rerun: false, submit: false, approve: false, return: false };
  const editable = (row.state === 'draft' || row.state === 'returned') && ranIt(user, row) && canInDistrict(user, 'runRatings', row.district);
  const reviewable = row.state === 'submitted' && !ranIt(user, row) && canInDistrict(user, 'approveRatings', row.district);
  return { rerun: editable, submit: editable, approve: reviewable && !row.hypothetical, return: reviewable };
}

/** An approved record's headline figures, as a later record or the rating setup compares with them; null for one never approved. */
function ofRecordFigures(row: RatingRow | undefined): RatingDetail['previousRecord'] {
  if (!row?.reviewed_at) return null;
  return { id: row.id, lowestLegalRf: row.lowest_legal_rf, lowestInventoryRf: row.lowest_inventory_rf, approvedAt: row.reviewed_at.toISOString() };
}

/** What a record is compared with: the span's rating of record when it was run — or, for a span Spanledger had not yet approved a rating of, the prior rating on file. */
async function previousRecordOf(db: Database | Transaction, row: RatingRow): Promise<RatingDetail['previousRecord']> {
  if (row.previous_record_id === null) return priorRatingOfRecordOfSpan(db, row.span_id);
  return ofRecordFigures(await findRatingById(db, row.previous_record_id));
}

/** Warnings of the girders, once each: those every girder shares plainly, the others with the girder they concern. */
function combinedWarnings(girders: readonly { girderNumber: number; output: { summary: { warnings: readonly string[] } } }[]): string[] {
  const shared = girders[0]?.output.summary.warnings.filter((warning) => girders.every((girder) => girder.output.summary.warnings.includes(warning))) ?? [];
  const particular = girders.flatMap((girder) => girder.output.summary.warnings.filter((warning) => !shared.includes(warning)).map((warning) => `girder ${girder.girderNumber}: ${warning}`));
  return [...shared, ...particular];
}

async function toDetail(db: Database | Transaction, row: RatingRow, user: SignedInUser | null): Promise<RatingDetail> {
  const girders = (await findRatingGirders(db, row.id)).map((girder) => ({
    girderId: girder.girder_id,
    girderNumber: girder.girder_number,
    position: girder.position,
    calcFile: girder.calc_file,
    output: girder.output,
  }));
  return {
    ...toSummary(row),
    run: row.run,
    spanLengthM: row.span_length_m,
    engineVersion: row.engine_version,
    policy: { id: row.policy_id, version: row.policy_version },
    vehicles: row.vehicles,
    appliedFindings: row.applied_findings,
    girders,
    results: ratingResultRows(girders),
    warnings: row.warnings,
    reviewComments: row.review_comments,
    previousRecord: await previousRecordOf(db, row),
    allowed: allowedSteps(user, row),
    caution: RESULT_CAUTION,
  };
}

async function ratingSources(db: Database | Transaction, spanId: number): Promise<RatingSources> {
  const span = await findSpanById(db, spanId);
  if (!span) throw spanNotFound(spanId);
  const structure = (await findStructureById(db, span.structure_id))!;
  return {
    structure,
    span,
    girders: await findStoredGirdersOfSpan(db, spanId),
    openFindings: await findOpenFindingsOfSpan(db, spanId),
    pendingCondition: (await findPendingSuperstructureCondition(db, structure.id)) ?? null,
    vehicles: await findLatestLibraryDefinitions(db, 'vehicles'),
    policies: await findLatestLibraryDefinitions(db, 'rating_policies'),
  };
}

/** Assembles the span's calculation files from the inventory and register, rates them, and gives the columns to store. */
async function runOf(trx: Transaction, sources: RatingSources, run: RatingRun): Promise<{ columns: RatingRunColumns; girders: RatingGirderColumns[] }> {
  const assembled = assembleRating(sources, run);
  const outputs = rateAssembled(assembled.girders);
  const rated = assembled.girders.map((girder, index) => ({ ...girder, output: outputs[index]! }));
  const figures = ratingFiguresOf(outputs);
  const ofRecord = await findRatingOfRecord(trx, sources.span.id);
  return {
    columns: {
      run,
      applied_findings: assembled.appliedFindings,
      hypothetical: run.hypothetical.length > 0,
      engine_version: ENGINE_VERSION,
      policy_id: assembled.policy.id,
      policy_version: assembled.policy.version,
      vehicles: [...assembled.vehicles],
      lowest_legal_rf: figures.lowestLegalRf,
      lowest_inventory_rf: figures.lowestInventoryRf,
      warnings: [...assembled.notes, ...combinedWarnings(rated)],
      previous_record_id: ofRecord?.id ?? null,
    },
    girders: rated.map((girder) => ({ girder_id: girder.girderId, girder_number: girder.girderNumber, position: girder.position, calc_file: girder.calcFile, output: girder.output })),
  };
}

function assertMayRunIn(user: SignedInUser, district: string): void {
  if (!canInDistrict(user, 'runRatings', district)) throw AppError.forbidden(`You may not run ratings in ${district}: your districts are ${user.districts.join(', ') || 'none'}`);
}

/** `GET /api/spans/:id/rating-setup`: the girders, open findings, vehicles and policies a new rating would use. */
export async function ratingSetup({ db }: Reader, spanId: number): Promise<RatingSetup> {
  const sources = await ratingSources(db, spanId);
  const ofRecord = await findRatingOfRecord(db, spanId);
  return {
    spanId,
    spanIndex: sources.span.span_index,
    spanLengthM: sources.span.length_m,
    structureId: sources.structure.id,
    structureNumber: sources.structure.structure_number,
    structureName: sources.structure.name,
    district: sources.structure.district,
    girders: sources.girders.map((girder) => ({ id: girder.id, girderNumber: girder.girder.girder_number, position: girder.girder.position })),
    openFindings: findingsAsApplied(sources.openFindings, sources.girders.map((girder) => girder.id), []),
    vehicles: sources.vehicles.map(vehicleSummary),
    policies: sources.policies.map((row) => ({ id: row.id, version: row.version, name: row.definition.name ?? row.id })),
    ratingOfRecord: ofRecordFigures(ofRecord) ?? (await priorRatingOfRecordOfSpan(db, spanId)),
    reratingDue: await spanReratingDue(db, spanId),
  };
}

/** `POST /api/spans/:id/ratings`: runs a new draft rating of the span and stores it. */
export async function runRating({ db, user }: Writer, spanId: number, run: RatingRun): Promise<RatingDetail> {
  return withTransaction(db, async (trx) => {
    const sources = await ratingSources(trx, spanId);
    assertMayRunIn(user, sources.structure.district);
    const { columns, girders } = await runOf(trx, sources, run);
    const id = await insertRating(trx, spanId, columns, girders, user.id);
    await recordAuditEvent({ db: trx, user, action: 'rating.run', entity: { type: 'rating', id }, after: { spanId, run, lowestLegalRf: columns.lowest_legal_rf, lowestInventoryRf: columns.lowest_inventory_rf } });
    return toDetail(trx, (await findRatingById(trx, id))!, user);
  });
}

/** The record, locked, when it may still be run again or submitted by this user. */
async function ratingOpenForChange(trx: Transaction, user: SignedInUser, id: number, version: number): Promise<RatingRow> {
  const row = await findRatingById(trx, id, { forUpdate: true });
  if (!row) throw ratingNotFound(id);
  assertMayRunIn(user, row.district);
  if (!ranIt(user, row)) throw AppError.forbidden(`${describe(row)} was run by ${row.created_by_name ?? 'someone else'}; run a rating of your own to change it`);
  if (row.state !== 'draft' && row.state !== 'returned') throw AppError.readOnly(`${describe(row)} is ${RATING_STATE_NAMES[row.state].toLowerCase()}; it can no longer change`);
  if (row.version !== version) throw AppError.versionConflict(describe(row), await toDetail(trx, row, user));
  return row;
}

/** `PUT /api/ratings/:id`: runs a draft (or a returned record) again with the rater's changed choices, from the inventory and register as they are now. */
export async function rerunRating({ db, user }: Writer, id: number, { version, ...run }: RatingRun & { version: number }): Promise<RatingDetail> {
  return withTransaction(db, async (trx) => {
    const row = await ratingOpenForChange(trx, user, id, version);
    const { columns, girders } = await runOf(trx, await ratingSources(trx, row.span_id), run);
    await replaceRatingRun(trx, id, version, columns, girders, user.id);
    await recordAuditEvent({
      db: trx,
      user,
      action: 'rating.run-again',
      entity: { type: 'rating', id },
      before: { run: row.run, lowestLegalRf: row.lowest_legal_rf, lowestInventoryRf: row.lowest_inventory_rf },
      after: { run, lowestLegalRf: columns.lowest_legal_rf, lowestInventoryRf: columns.lowest_inventory_rf },
    });
    return toDetail(trx, (await findRatingById(trx, id))!, user);
  });
}

export async function getRating({ db, user }: Reader & { user: SignedInUser | null }, id: number): Promise<RatingDetail> {
  const row = await findRatingById(db, id);
  if (!row) throw ratingNotFound(id);
  return toDetail(db, row, user);
}

export async function listRatingsOfStructure({ db }: Reader, structureId: number): Promise<RatingSummary[]> {
  if (!(await findStructureById(db, structureId))) throw AppError.notFound(`There is no structure with id ${structureId}`);
  return (await findRatingsOfStructure(db, structureId)).map(toSummary);
}

/** The review queue: submitted records, oldest first. */
export async function listRatingsWaitingForReview({ db }: Reader): Promise<RatingSummary[]> {
  return (await findRatingsWaitingForReview(db)).map(toSummary);
}

const withComment = (row: RatingRow, step: ReviewComment['step'], user: SignedInUser, comment: string): ReviewComment[] => [
  ...row.review_comments,
  { step, comment, at: new Date().toISOString(), by: user.displayName },
];

/** `POST /api/ratings/:id/submit`: the rater sends their draft for review. */
export async function submitRating({ db, user }: Writer, id: number, version: number, comment: string): Promise<RatingDetail> {
  return withTransaction(db, async (trx) => {
    const row = await ratingOpenForChange(trx, user, id, version);
    await updateRatingState(trx, id, version, { state: 'submitted', submitted: true, review_comments: withComment(row, 'submitted', user, comment) }, user.id);
    await recordAuditEvent({ db: trx, user, action: 'rating.submitted', entity: { type: 'rating', id }, before: { state: row.state }, after: { state: 'submitted', comment } });
    return toDetail(trx, (await findRatingById(trx, id))!, user);
  });
}

/** The submitted record a reviewer acts on, locked: in their districts, never their own. */
async function ratingForReview(trx: Transaction, user: SignedInUser, id: number, version: number): Promise<RatingRow> {
  const row = await findRatingById(trx, id, { forUpdate: true });
  if (!row) throw ratingNotFound(id);
  if (!canInDistrict(user, 'approveRatings', row.district)) throw AppError.forbidden(`You may not review ratings in ${row.district}`);
  if (ranIt(user, row)) throw AppError.forbidden(`You ran ${describe(row).replace(/^Rating/, 'rating')}: another engineer must review it`);
  if (row.state !== 'submitted') throw AppError.readOnly(`${describe(row)} is ${RATING_STATE_NAMES[row.state].toLowerCase()}, not waiting for review`);
  if (row.version !== version) throw AppError.versionConflict(describe(row), await toDetail(trx, row, user));
  return row;
}

/**
 * `POST /api/ratings/:id/approve`: the record becomes the span's rating of record (the one before
 * is superseded), the structure's figures for the map follow, and the span's "re-rating due" flag
 * clears when nothing changed after the run. A record with what-if damage is never approved.
 */
export async function approveRating({ db, user }: Writer, id: number, version: number, comment: string): Promise<RatingDetail> {
  return withTransaction(db, async (trx) => {
    const row = await ratingForReview(trx, user, id, version);
    if (row.hypothetical) {
      throw new AppError({ code: 'not_approvable', status: 409, message: `${describe(row)} applies what-if damage: it can be discussed and returned, never approved as the rating of record` });
    }
    const superseded = await supersedeRatingOfRecord(trx, row.span_id, user.id);
    if (superseded !== null) {
      await recordAuditEvent({ db: trx, user, action: 'rating.superseded', entity: { type: 'rating', id: superseded }, before: { state: 'approved' }, after: { state: 'superseded', by: id } });
    }
    await updateRatingState(trx, id, version, { state: 'approved', reviewed: true, review_comments: withComment(row, 'approved', user, comment) }, user.id);
    await refreshStructureRatingFigures(trx, row.structure_id);
    await clearReratingDue(trx, id);
    await recordAuditEvent({ db: trx, user, action: 'rating.approved', entity: { type: 'rating', id }, before: { state: row.state }, after: { state: 'approved', comment, supersedes: superseded } });
    return toDetail(trx, (await findRatingById(trx, id))!, user);
  });
}

/** `POST /api/ratings/:id/return`: back to the rater with what needs changing. */
export async function returnRating({ db, user }: Writer, id: number, version: number, comment: string): Promise<RatingDetail> {
  return withTransaction(db, async (trx) => {
    const row = await ratingForReview(trx, user, id, version);
    await updateRatingState(trx, id, version, { state: 'returned', reviewed: true, review_comments: withComment(row, 'returned', user, comment) }, user.id);
    await recordAuditEvent({ db: trx, user, action: 'rating.returned', entity: { type: 'rating', id }, before: { state: row.state }, after: { state: 'returned', comment } });
    return toDetail(trx, (await findRatingById(trx, id))!, user);
  });
}
