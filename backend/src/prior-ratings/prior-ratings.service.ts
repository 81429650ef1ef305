import { canInDistrict, type ComparedRatingOfRecord, type ImportCounts, type PriorRatingImport, type PriorRatingSummary, type SignedInUser } from '../../../shared/src';
import { recordAuditEvent } from '../audit/audit-events';
import { changedFields } from '../audit/changed-fields';
import { withTransaction, type Database, type Transaction } from '../db/database';
import { AppError, type InvalidField } from '../http/app-error';
import { refreshStructureRatingFigures } from '../ratings/ratings.repository';
import { findSpanById } from '../spans/spans.repository';
import { findStructureById } from '../structures/structures.repository';
import {
  findNewestPriorRatingOfSpan,
  findPriorRatingOfDay,
  findPriorRatingsOfStructures,
  insertPriorRating,
  updatePriorRating,
  type PriorRatingColumns,
  type PriorRatingRow,
} from './prior-ratings.repository';

interface Reader {
  readonly db: Database | Transaction;
}
interface Writer extends Reader {
  readonly user: SignedInUser;
}

/** What a prior-ratings row does: records a new one, changes the one of its day, or finds it already so. */
export type PriorRatingOutcome = Exclude<keyof ImportCounts, 'rows'>;

const DAY_MS = 24 * 60 * 60 * 1000;

/**
 * What refuses a prior rating whatever the register holds: one approved after today is not on
 * file yet (and, being newer than Spanledger's own, would stand as the rating of record). A day
 * of grace covers the time zones ahead of UTC.
 */
export function priorRatingMisfit(rating: Pick<PriorRatingImport, 'approvedOn'>, now = new Date()): InvalidField[] {
  const latest = new Date(now.getTime() + DAY_MS).toISOString().slice(0, 10);
  return rating.approvedOn > latest ? [{ field: 'approvedOn', message: 'lies in the future: a prior rating is one already approved' }] : [];
}

const figuresOf = (row: PriorRatingRow) => ({ lowestLegalRf: row.lowest_legal_rf, lowestInventoryRf: row.design_inventory_rf });

/** The prior rating a later one is compared with: the newest earlier one of the same span or of the whole structure (of the whole structure, for a whole-structure one). */
function previousOf(row: PriorRatingRow, newestFirst: readonly PriorRatingRow[]): PriorRatingSummary['previous'] {
  const earlier = newestFirst.find((other) => other.approved_on < row.approved_on && (other.span_id === null || other.span_id === row.span_id));
  return earlier ? { id: earlier.id, approvedOn: earlier.approved_on, ...figuresOf(earlier) } : null;
}

function toSummary(row: PriorRatingRow, newestFirst: readonly PriorRatingRow[]): PriorRatingSummary {
  return {
    id: row.id,
    structureId: row.structure_id,
    spanId: row.span_id,
    spanIndex: row.span_index,
    ...figuresOf(row),
    approvedOn: row.approved_on,
    sourceNote: row.source_note,
    importId: row.import_id,
    previous: previousOf(row, newestFirst),
    created: { at: row.created_at.toISOString(), by: row.created_by_name },
  };
}

/** `GET /api/structures/:id/prior-ratings`: the structure's ratings on file from before Spanledger, newest first, each with the one it follows. */
export async function listPriorRatingsOfStructure({ db }: Reader, structureId: number): Promise<PriorRatingSummary[]> {
  if (!(await findStructureById(db, structureId))) throw AppError.notFound(`There is no structure with id ${structureId}`);
  const rows = await findPriorRatingsOfStructures(db, [structureId]);
  return rows.map((row) => toSummary(row, rows));
}

/**
 * The prior rating a span's ratings are compared with where Spanledger has approved none: the
 * newest one on file of the span or of its whole structure, as the figures of a rating of record.
 */
export async function priorRatingOfRecordOfSpan(db: Database | Transaction, spanId: number): Promise<ComparedRatingOfRecord | null> {
  const row = await findNewestPriorRatingOfSpan(db, spanId);
  if (!row) return null;
  return {
    id: row.id,
    ...figuresOf(row),
    approvedAt: `${row.approved_on}T00:00:00.000Z`,
    priorRating: { id: row.id, approvedOn: row.approved_on, sourceNote: row.source_note, spanIndex: row.span_index },
  };
}

/** A prior rating as an import row gives it, placed on a structure and (or not) one of its spans. */
export interface PriorRatingInput {
  readonly structureId: number;
  readonly spanId: number | null;
  readonly rating: Pick<PriorRatingImport, 'lowestLegalRatingFactor' | 'designInventoryRatingFactor' | 'approvedOn' | 'sourceNote'>;
}

const columnsOf = (rating: PriorRatingInput['rating']): PriorRatingColumns => ({
  lowest_legal_rf: rating.lowestLegalRatingFactor,
  design_inventory_rf: rating.designInventoryRatingFactor,
  source_note: rating.sourceNote,
});

const fieldsOf = (row: PriorRatingRow): Record<string, unknown> => ({
  lowestLegalRatingFactor: row.lowest_legal_rf,
  designInventoryRatingFactor: row.design_inventory_rf,
  sourceNote: row.source_note,
});

/**
 * `POST /api/imports/:id/commit`, a prior-ratings row: records the rating on file of the structure
 * (or a span) for its day of approval, or changes the one of that day, with its history entry;
 * the structure's rating-of-record figures follow. They are ratings of record, so only those
 * who run ratings in the district record them.
 */
export async function recordPriorRating({ db, user }: Writer, { structureId, spanId, rating }: PriorRatingInput): Promise<PriorRatingOutcome> {
  return withTransaction(db, async (trx) => {
    const structure = await findStructureById(trx, structureId, { forUpdate: true });
    if (!structure) throw AppError.notFound(`There is no structure with id ${structureId}`);
    if (!canInDistrict(user, 'runRatings', structure.district)) throw AppError.forbidden(`You may not record ratings in ${structure.district}`);
    if (spanId !== null && (await findSpanById(trx, spanId))?.structure_id !== structureId) {
      throw AppError.invalidFields([{ field: 'spanIndex', message: `structure ${structure.structure_number} has no such span` }]);
    }
    const misfit = priorRatingMisfit(rating);
    if (misfit.length > 0) throw AppError.invalidFields(misfit);

    const stored = await findPriorRatingOfDay(trx, structureId, spanId, rating.approvedOn);
    let outcome: PriorRatingOutcome = 'create';
    if (!stored) {
      const id = await insertPriorRating(trx, { structure_id: structureId, span_id: spanId, approved_on: rating.approvedOn }, columnsOf(rating), user.id);
      await recordAuditEvent({ db: trx, user, action: 'prior-rating.recorded', entity: { type: 'prior-rating', id }, after: { structureId, spanId, ...rating } });
    } else {
      const changes = changedFields(fieldsOf(stored), { lowestLegalRatingFactor: rating.lowestLegalRatingFactor, designInventoryRatingFactor: rating.designInventoryRatingFactor, sourceNote: rating.sourceNote });
      if (changes.fields.length === 0) return 'unchanged';
      await updatePriorRating(trx, stored.id, columnsOf(rating), user.id);
      await recordAuditEvent({ db: trx, user, action: 'prior-rating.changed', entity: { type: 'prior-rating', id: stored.id }, before: changes.before, after: changes.after });
      outcome = 'update';
    }
    await refreshStructureRatingFigures(trx, structureId);
    return outcome;
  });
}
