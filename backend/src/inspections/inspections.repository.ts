import type { FindingDetail, InspectionKind, InspectionState } from '../../../shared/src';
import type { Database, Transaction } from '../db/database';

type Db = Database | Transaction;

/** One inspection with its structure's number and district and the names of the people on it. */
export interface InspectionRow {
  id: number;
  structure_id: number;
  structure_number: string;
  district: string;
  inspected_on: string;
  kind: InspectionKind;
  inspector_id: number;
  inspector_name: string;
  deck_condition: number | null;
  superstructure_condition: number | null;
  substructure_condition: number | null;
  notes: string;
  state: InspectionState;
  return_comment: string | null;
  submitted_at: Date | null;
  reviewed_by_name: string | null;
  reviewed_at: Date | null;
  /** Recorded in the field, or from an imported spreadsheet of field sheets. */
  source: 'field' | 'import';
  /** The import that wrote it; null for one recorded in the field, and for one whose import's commit is still being written. */
  import_id: number | null;
  version: number;
}

function inspectionsWithNames(db: Db) {
  return db({ i: 'inspections' })
    .join({ s: 'structures' }, 's.id', 'i.structure_id')
    .join({ inspector: 'users' }, 'inspector.id', 'i.inspector_id')
    .leftJoin({ reviewer: 'users' }, 'reviewer.id', 'i.reviewed_by')
    .select(
      'i.id',
      'i.structure_id',
      's.structure_number',
      's.district',
      db.raw("to_char(i.inspected_on, 'YYYY-MM-DD') as inspected_on"),
      'i.kind',
      'i.inspector_id',
      'inspector.display_name as inspector_name',
      'i.deck_condition',
      'i.superstructure_condition',
      'i.substructure_condition',
      'i.notes',
      'i.state',
      'i.return_comment',
      'i.submitted_at',
      'reviewer.display_name as reviewed_by_name',
      'i.reviewed_at',
      'i.source',
      'i.import_id',
      'i.version',
    );
}

export async function findInspectionById(db: Db, id: number, { forUpdate = false } = {}): Promise<InspectionRow | undefined> {
  const query = inspectionsWithNames(db).where('i.id', id).first();
  if (forUpdate) query.forUpdate('i');
  return query;
}

export async function findInspectionsOfStructure(db: Db, structureId: number): Promise<(InspectionRow & { finding_count: string; critical_count: string })[]> {
  return inspectionsWithNames(db)
    .where('i.structure_id', structureId)
    .select(
      db.raw('(select count(*) from findings f where f.inspection_id = i.id) as finding_count'),
      db.raw('(select count(*) from findings f where f.inspection_id = i.id and f.critical) as critical_count'),
    )
    .orderBy([{ column: 'i.inspected_on', order: 'desc' }, { column: 'i.id', order: 'desc' }]);
}

/** An inspection of the structure still being written (a draft, or returned for changes), if any. */
export async function findInspectionInProgress(db: Db, structureId: number): Promise<InspectionRow | undefined> {
  return inspectionsWithNames(db).where('i.structure_id', structureId).whereIn('i.state', ['draft', 'returned']).first();
}

/**
 * The superstructure condition of the structure's newest inspection waiting for review, if it
 * records one: it comes with the findings on the register before its ratings reach the structure.
 */
export async function findPendingSuperstructureCondition(db: Db, structureId: number): Promise<{ superstructure: number; inspectedOn: string } | undefined> {
  const row = await db('inspections')
    .where({ structure_id: structureId, state: 'submitted' })
    .whereNotNull('superstructure_condition')
    .orderBy([{ column: 'inspected_on', order: 'desc' }, { column: 'id', order: 'desc' }])
    .first('superstructure_condition', db.raw("to_char(inspected_on, 'YYYY-MM-DD') as inspected_on"));
  return row ? { superstructure: row.superstructure_condition, inspectedOn: row.inspected_on } : undefined;
}

/** Every inspection of these structures, oldest first: what an import of findings for them must fit in with. */
export async function findInspectionsOfStructures(db: Db, structureIds: readonly number[]): Promise<InspectionRow[]> {
  if (structureIds.length === 0) return [];
  return inspectionsWithNames(db).whereIn('i.structure_id', structureIds).orderBy([{ column: 'i.inspected_on', order: 'asc' }, { column: 'i.id', order: 'asc' }]);
}

export type InspectionColumns = Partial<Pick<InspectionRow, 'inspected_on' | 'kind' | 'deck_condition' | 'superstructure_condition' | 'substructure_condition' | 'notes'>>;

export async function insertInspection(trx: Transaction, structureId: number, columns: Required<InspectionColumns>, userId: number): Promise<number> {
  const [row] = await trx('inspections')
    .insert({ ...columns, structure_id: structureId, inspector_id: userId, created_by: userId, updated_by: userId })
    .returning('id');
  return (row as { id: number }).id;
}

/**
 * An inspection recorded from an imported spreadsheet, by the importer, already on the register:
 * submitted, and accepted by the importer when they are a reviewer (`reviewedBy`).
 */
export async function insertImportedInspection(
  trx: Transaction,
  structureId: number,
  columns: Pick<InspectionRow, 'inspected_on' | 'kind' | 'notes'> & { state: 'submitted' | 'accepted'; reviewedBy: number | null },
  userId: number,
): Promise<number> {
  const { reviewedBy, ...rest } = columns;
  const [row] = await trx('inspections')
    .insert({
      ...rest,
      structure_id: structureId,
      inspector_id: userId,
      source: 'import',
      submitted_at: trx.fn.now(),
      reviewed_by: reviewedBy,
      reviewed_at: reviewedBy === null ? null : trx.fn.now(),
      created_by: userId,
      updated_by: userId,
    })
    .returning('id');
  return (row as { id: number }).id;
}

/** Writes changed columns (or a new state) when the row still has the version read; false when it has moved on. */
export async function updateInspection(trx: Transaction, id: number, expectedVersion: number, columns: Record<string, unknown>, userId: number): Promise<boolean> {
  const updated = await trx('inspections')
    .where({ id, version: expectedVersion })
    .update({ ...columns, version: trx.raw('version + 1'), updated_by: userId, updated_at: trx.fn.now() });
  return updated === 1;
}

export async function deleteInspection(trx: Transaction, id: number): Promise<void> {
  await trx('inspections').where({ id }).delete();
}

/** One finding with where it sits and what its inspection is. */
export interface FindingRow {
  id: number;
  inspection_id: number;
  inspection_state: InspectionRow['state'];
  inspection_submitted_at: Date | null;
  inspected_on: string;
  structure_id: number;
  girder_id: number;
  girder_number: number;
  span_id: number;
  span_index: number;
  span_length_m: number;
  kind: FindingDetail['kind'];
  strands: FindingDetail['strands'];
  loss_fraction: number | null;
  broken_wires: number | null;
  spall: FindingDetail['spall'];
  deck_loss_mm: number | null;
  crack_width_mm: number | null;
  from_m: number;
  to_m: number;
  severity: FindingDetail['severity'];
  notes: string;
  disposition: FindingDetail['disposition'];
  carried_from_id: number | null;
  superseded_by_id: number | null;
  critical: boolean;
  version: number;
}

function findingsWithPlace(db: Db) {
  return db({ f: 'findings' })
    .join({ i: 'inspections' }, 'i.id', 'f.inspection_id')
    .join({ g: 'girders' }, 'g.id', 'f.girder_id')
    .join({ sp: 'spans' }, 'sp.id', 'g.span_id')
    .select(
      'f.*',
      'i.state as inspection_state',
      'i.submitted_at as inspection_submitted_at',
      db.raw("to_char(i.inspected_on, 'YYYY-MM-DD') as inspected_on"),
      'i.structure_id',
      'g.girder_number',
      'g.span_id',
      'sp.span_index',
      'sp.length_m as span_length_m',
    );
}

export async function findFindingById(db: Db, id: number, { forUpdate = false } = {}): Promise<FindingRow | undefined> {
  const query = findingsWithPlace(db).where('f.id', id).first();
  if (forUpdate) query.forUpdate('f');
  return query;
}

export async function findFindingsOfInspection(db: Db, inspectionId: number): Promise<FindingRow[]> {
  return findingsWithPlace(db).where('f.inspection_id', inspectionId).orderBy(['sp.span_index', 'g.girder_number', 'f.id']);
}

/**
 * Findings on the register and still open: recorded in an inspection that has been submitted,
 * not superseded by a later one, and not marked repaired.
 */
function openOnRegister(query: ReturnType<typeof findingsWithPlace>) {
  return query.whereNotNull('i.submitted_at').whereNull('f.superseded_by_id').whereNot('f.disposition', 'repaired');
}

export async function findOpenFindingsOfStructure(db: Db, structureId: number): Promise<FindingRow[]> {
  return openOnRegister(findingsWithPlace(db)).where('i.structure_id', structureId).orderBy(['sp.span_index', 'g.girder_number', 'f.id']);
}

export async function findOpenFindingsOfSpan(db: Db, spanId: number): Promise<FindingRow[]> {
  return openOnRegister(findingsWithPlace(db)).where('g.span_id', spanId).orderBy(['g.girder_number', 'f.id']);
}

/** Every finding a girder has had, newest inspection first. */
export async function findFindingsOfGirder(db: Db, girderId: number): Promise<FindingRow[]> {
  return findingsWithPlace(db).where('f.girder_id', girderId).orderBy([{ column: 'i.inspected_on', order: 'desc' }, { column: 'f.id', order: 'desc' }]);
}

export type FindingColumns = Pick<
  FindingRow,
  'kind' | 'strands' | 'loss_fraction' | 'broken_wires' | 'spall' | 'deck_loss_mm' | 'crack_width_mm' | 'from_m' | 'to_m' | 'severity' | 'notes' | 'disposition' | 'critical'
>;

const jsonOrNull = (value: unknown) => (value === null ? null : JSON.stringify(value));

export async function insertFinding(
  trx: Transaction,
  finding: FindingColumns & { inspection_id: number; girder_id: number; carried_from_id: number | null },
  userId: number,
): Promise<number> {
  const [row] = await trx('findings')
    .insert({ ...finding, strands: jsonOrNull(finding.strands), spall: jsonOrNull(finding.spall), created_by: userId, updated_by: userId })
    .returning('id');
  return (row as { id: number }).id;
}

export async function updateFinding(trx: Transaction, id: number, expectedVersion: number, columns: FindingColumns, userId: number): Promise<boolean> {
  const updated = await trx('findings')
    .where({ id, version: expectedVersion })
    .update({ ...columns, strands: jsonOrNull(columns.strands), spall: jsonOrNull(columns.spall), version: trx.raw('version + 1'), updated_by: userId, updated_at: trx.fn.now() });
  return updated === 1;
}

export async function deleteFinding(trx: Transaction, id: number): Promise<void> {
  await trx('findings').where({ id }).delete();
}

/** A submitted copy takes the place of the finding it carries forward on the register. */
export async function supersedeCarriedFindings(trx: Transaction, inspectionId: number): Promise<void> {
  await trx.raw(
    `update findings as earlier set superseded_by_id = copy.id
       from findings as copy
      where copy.inspection_id = ? and copy.carried_from_id = earlier.id and earlier.superseded_by_id is null`,
    [inspectionId],
  );
}
