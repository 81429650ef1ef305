import type { GirderSummary, GirderTypeSummary } from '../../../shared/src';
import type { Database } from '../db/database';
import { AppError } from '../http/app-error';
import { findSpanById } from '../spans/spans.repository';
import { findGirderTypes, findGirdersOfSpan } from './girders.repository';

/** The girders of a span across it, with their strand counts. */
export async function listGirdersOfSpan({ db }: { db: Database }, spanId: number): Promise<GirderSummary[]> {
  if (!(await findSpanById(db, spanId))) throw AppError.notFound(`There is no span with id ${spanId}`);
  return (await findGirdersOfSpan(db, spanId)).map((row) => ({
    id: row.id,
    spanId: row.span_id,
    girderNumber: row.girder_number,
    position: row.position,
    girderTypeName: row.girder_type_name,
    strandRowCount: Number(row.strand_row_count),
    strandCount: Number(row.strand_count ?? 0),
    harped: row.harped,
    debonded: row.debonded,
    concreteStrengthMpa: row.concrete_strength_mpa,
    tensioning: row.tensioning,
    version: row.version,
  }));
}

/** The catalogue of girder shapes, by name; a girder refers to one and may override some of its dimensions. */
export async function listGirderTypes({ db }: { db: Database }): Promise<GirderTypeSummary[]> {
  return (await findGirderTypes(db)).map((row) => ({ id: row.id, name: row.name, shape: row.section.shape, depthMm: row.section.depthMm ?? null, source: row.source, section: row.section }));
}
