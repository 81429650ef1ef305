import {
  canInDistrict,
  damageEntryOfFinding,
  FINDING_KIND_NAMES,
  INSPECTION_STATE_NAMES,
  isCriticalFinding,
  type FindingChange,
  type FindingDamage,
  type FindingDetail,
  type ImportCounts,
  type InspectionChange,
  type InspectionDetail,
  type InspectionSummary,
  type NewFinding,
  type NewInspection,
  type SignedInUser,
} from '../../../shared/src';
import { findingAlreadyAlerted, findUsersOfRoleInDistrict, insertAlerts } from '../alerts/alerts.repository';
import { recordAuditEvent } from '../audit/audit-events';
import { changedFields } from '../audit/changed-fields';
import { withTransaction, type Database, type Transaction } from '../db/database';
import { damageIssuesOnGirder } from '../girders/girders.service';
import { findGirderById } from '../girders/girders.repository';
import { AppError, type InvalidField } from '../http/app-error';
import { markSpansReratingDue } from '../ratings/ratings.repository';
import { findStructureById, updateStructure } from '../structures/structures.repository';
import { findPhotoIdsOfFindings, findPhotosOfInspection } from '../photos/photos.repository';
import type { ObjectStorage } from '../photos/object-storage';
import { inspectionOpenForChange } from './inspection-access';
import {
  deleteFinding,
  deleteInspection,
  findFindingById,
  findFindingsOfGirder,
  findFindingsOfInspection,
  findInspectionById,
  findInspectionInProgress,
  findInspectionsOfStructure,
  findInspectionsOfStructures,
  findOpenFindingsOfSpan,
  findOpenFindingsOfStructure,
  insertFinding,
  insertImportedInspection,
  insertInspection,
  supersedeCarriedFindings,
  updateFinding,
  updateInspection,
  type FindingColumns,
  type FindingRow,
  type InspectionRow,
} from './inspections.repository';

interface Reader {
  readonly db: Database;
}
interface Writer extends Reader {
  readonly user: SignedInUser;
}

function registerStateOf(row: FindingRow): FindingDetail['registerState'] {
  if (row.inspection_submitted_at === null) return 'draft';
  if (row.superseded_by_id !== null) return 'superseded';
  return row.disposition === 'repaired' ? 'repaired' : 'open';
}

/** The parts of a stored finding that say what damage it is and where, as `damageEntryOfFinding` reads them. */
export function findingDamageOfRow(row: FindingRow): FindingDamage & { id: number } {
  return {
    id: row.id,
    kind: row.kind,
    strands: row.strands,
    lossFraction: row.loss_fraction,
    brokenWires: row.broken_wires,
    spall: row.spall,
    deckLossMm: row.deck_loss_mm,
    fromM: row.from_m,
    toM: row.to_m,
  };
}

function toFindingDetail(row: FindingRow, photoIds: readonly number[] = []): FindingDetail {
  const damage = findingDamageOfRow(row);
  return {
    ...damage,
    inspectionId: row.inspection_id,
    girderId: row.girder_id,
    girderNumber: row.girder_number,
    spanId: row.span_id,
    spanIndex: row.span_index,
    crackWidthMm: row.crack_width_mm,
    severity: row.severity,
    notes: row.notes,
    disposition: row.disposition,
    carriedFromId: row.carried_from_id,
    registerState: registerStateOf(row),
    critical: row.critical,
    damageEntry: row.disposition === 'repaired' ? null : damageEntryOfFinding(damage),
    photoIds,
    version: row.version,
  };
}

function toSummary(row: InspectionRow, findingCount: number, criticalCount: number): InspectionSummary {
  return {
    id: row.id,
    structureId: row.structure_id,
    inspectedOn: row.inspected_on,
    kind: row.kind,
    state: row.state,
    inspectorName: row.inspector_name,
    findingCount,
    criticalCount,
  };
}

/** Findings as the API answers them, each with the ids of its photos. */
async function withPhotos(db: Database | Transaction, rows: readonly FindingRow[]): Promise<FindingDetail[]> {
  const photoIds = await findPhotoIdsOfFindings(db, rows.map((row) => row.id));
  return rows.map((row) => toFindingDetail(row, photoIds.get(row.id)));
}

async function toInspectionDetail(db: Database | Transaction, row: InspectionRow): Promise<InspectionDetail> {
  const findings = await withPhotos(db, await findFindingsOfInspection(db, row.id));
  const photos = await findPhotosOfInspection(db, row.id);
  return {
    ...toSummary(row, findings.length, findings.filter((f) => f.critical).length),
    structureNumber: row.structure_number,
    district: row.district,
    inspectorId: row.inspector_id,
    conditions: { deck: row.deck_condition, superstructure: row.superstructure_condition, substructure: row.substructure_condition },
    notes: row.notes,
    returnComment: row.return_comment,
    submittedAt: row.submitted_at?.toISOString() ?? null,
    reviewed: row.reviewed_at ? { at: row.reviewed_at.toISOString(), by: row.reviewed_by_name } : null,
    findings,
    photoIds: photos.map((photo) => photo.id),
    version: row.version,
  };
}

const inspectionNotFound = (id: number) => AppError.notFound(`There is no inspection with id ${id}`);

export async function listInspectionsOfStructure({ db }: Reader, structureId: number): Promise<InspectionSummary[]> {
  if (!(await findStructureById(db, structureId))) throw AppError.notFound(`There is no structure with id ${structureId}`);
  return (await findInspectionsOfStructure(db, structureId)).map((row) => toSummary(row, Number(row.finding_count), Number(row.critical_count)));
}

export async function getInspection({ db }: Reader, id: number): Promise<InspectionDetail> {
  const row = await findInspectionById(db, id);
  if (!row) throw inspectionNotFound(id);
  return toInspectionDetail(db, row);
}

/**
 * Starts an inspection of a structure as a draft of the signed-in inspector, with every finding
 * open on the register carried forward to be confirmed, grown or marked repaired. One inspection
 * of a structure is written at a time, so a finding is carried forward by one of them.
 */
export async function startInspection({ db, user }: Writer, structureId: number, input: NewInspection): Promise<InspectionDetail> {
  return withTransaction(db, async (trx) => {
    const structure = await findStructureById(trx, structureId, { forUpdate: true });
    if (!structure) throw AppError.notFound(`There is no structure with id ${structureId}`);
    if (!canInDistrict(user, 'editOwnInspections', structure.district)) throw AppError.forbidden(`You may not record inspections in ${structure.district}`);
    const inProgress = await findInspectionInProgress(trx, structureId);
    if (inProgress) {
      throw new AppError({
        code: 'already_exists',
        status: 409,
        message: `An inspection of ${structure.structure_number} is already being written (${inProgress.inspected_on}, ${inProgress.inspector_name}); finish or delete it first`,
        details: { inspectionId: inProgress.id },
      });
    }
    const id = await insertInspection(
      trx,
      structureId,
      {
        inspected_on: input.inspectedOn,
        kind: input.kind,
        deck_condition: input.deckCondition,
        superstructure_condition: input.superstructureCondition,
        substructure_condition: input.substructureCondition,
        notes: input.notes,
      },
      user.id,
    );
    for (const open of await findOpenFindingsOfStructure(trx, structureId)) {
      await insertFinding(trx, { ...copyColumns(open), disposition: 'to-review', critical: false, inspection_id: id, girder_id: open.girder_id, carried_from_id: open.id }, user.id);
    }
    await recordAuditEvent({ db: trx, user, action: 'inspection.started', entity: { type: 'inspection', id }, after: input });
    return toInspectionDetail(trx, (await findInspectionById(trx, id))!);
  });
}

function copyColumns(row: FindingRow): Omit<FindingColumns, 'disposition' | 'critical'> {
  const { kind, strands, loss_fraction, broken_wires, spall, deck_loss_mm, crack_width_mm, from_m, to_m, severity, notes } = row;
  return { kind, strands, loss_fraction, broken_wires, spall, deck_loss_mm, crack_width_mm, from_m, to_m, severity, notes };
}

const INSPECTION_COLUMN_OF = {
  inspectedOn: 'inspected_on',
  kind: 'kind',
  deckCondition: 'deck_condition',
  superstructureCondition: 'superstructure_condition',
  substructureCondition: 'substructure_condition',
  notes: 'notes',
} as const;

function inspectionFields(row: InspectionRow): Record<keyof typeof INSPECTION_COLUMN_OF, unknown> {
  return {
    inspectedOn: row.inspected_on,
    kind: row.kind,
    deckCondition: row.deck_condition,
    superstructureCondition: row.superstructure_condition,
    substructureCondition: row.substructure_condition,
    notes: row.notes,
  };
}

export async function changeInspection({ db, user }: Writer, id: number, { version, ...fields }: InspectionChange): Promise<InspectionDetail> {
  return withTransaction(db, async (trx) => {
    const row = await inspectionOpenForChange(trx, user, id);
    if (row.version !== version) throw AppError.versionConflict(`The inspection of ${row.inspected_on}`, await toInspectionDetail(trx, row));
    const changes = changedFields(inspectionFields(row), fields);
    if (changes.fields.length === 0) return toInspectionDetail(trx, row);
    const columns = Object.fromEntries(changes.fields.map((field) => [INSPECTION_COLUMN_OF[field as keyof typeof INSPECTION_COLUMN_OF], changes.after[field]]));
    await updateInspection(trx, id, version, columns, user.id);
    await recordAuditEvent({ db: trx, user, action: 'inspection.changed', entity: { type: 'inspection', id }, before: changes.before, after: changes.after });
    return toInspectionDetail(trx, (await findInspectionById(trx, id))!);
  });
}

/**
 * Deletes a draft that was never submitted, with its findings and photos; what was once submitted
 * stays on the record. The photo files go once the deletion has committed.
 */
export async function removeInspection({ db, user, storage }: Writer & { storage: ObjectStorage }, id: number): Promise<void> {
  const photoKeys = await withTransaction(db, async (trx) => {
    const row = await inspectionOpenForChange(trx, user, id);
    if (row.submitted_at !== null) throw AppError.readOnly('This inspection was submitted once; it stays on the record — change it and submit it again instead');
    const photos = await findPhotosOfInspection(trx, id);
    await deleteInspection(trx, id);
    await recordAuditEvent({ db: trx, user, action: 'inspection.deleted', entity: { type: 'inspection', id }, before: inspectionFields(row) });
    return photos.flatMap((photo) => [photo.object_key, photo.thumbnail_key]);
  });
  await storage.deleteQuietly(photoKeys);
}

/** Where a problem the engine finds in a finding's damage entry lies in the finding. */
function findingPathOf(damagePath: string, kind: FindingDetail['kind']): string {
  const rest = damagePath.replace(/^damage\[0\]\.?/, '').replace(/\[(\d+)\]/g, '.$1');
  if (rest === '') return 'kind';
  if (rest === 'rowId' || rest === 'count' || rest.startsWith('strands')) return `strands.${rest}`;
  if (rest === 'lossFraction') return kind === 'broken-wires' ? 'brokenWires' : 'lossFraction';
  if (rest.startsWith('bottomFlange') || rest.startsWith('polygonMm')) return 'spall';
  if (rest === 'thicknessMm') return 'deckLossMm';
  return rest;
}

/** A finding as recorded against a girder named apart from it (by the route, or by an import row's girder key). */
export type FindingInput = Omit<NewFinding, 'girderId'>;

/**
 * What refuses each finding on the girder — strands it does not have, a place beyond its span, a
 * spall outside its concrete — as fields of the finding, a list per finding (empty when it fits).
 * Each is judged alone against the girder, as the API records one: damage builds up entry by
 * entry in the engine, so judging them together would refuse what recording them one by one takes.
 */
export async function findingsMisfitOnGirder(db: Database | Transaction, girderId: number, spanLengthM: number, findings: readonly FindingInput[]): Promise<InvalidField[][]> {
  const misfits: InvalidField[][] = [];
  for (const finding of findings) {
    const fields: InvalidField[] = (['fromM', 'toM'] as const).flatMap((field) => (finding[field] > spanLengthM ? [{ field, message: `lies beyond the span (${spanLengthM} m)` }] : []));
    const entry = damageEntryOfFinding(finding);
    for (const issue of entry ? await damageIssuesOnGirder(db, girderId, [entry]) : []) {
      const field = findingPathOf(issue.path, finding.kind);
      if (!fields.some((f) => f.field === field)) fields.push({ field, message: issue.message });
    }
    misfits.push(fields);
  }
  return misfits;
}

/** Refuses a finding the girder cannot have: strands it lacks, a place beyond its span, a spall outside its concrete. */
async function assertFindingFitsGirder(trx: Transaction, girderId: number, spanLengthM: number, finding: FindingInput): Promise<void> {
  const [fields] = await findingsMisfitOnGirder(trx, girderId, spanLengthM, [finding]);
  if (fields!.length > 0) throw AppError.invalidFields(fields!);
}

function findingColumnsOf(finding: FindingInput, disposition: FindingDetail['disposition']): FindingColumns {
  return {
    kind: finding.kind,
    strands: finding.strands,
    loss_fraction: finding.lossFraction,
    broken_wires: finding.brokenWires,
    spall: finding.spall,
    deck_loss_mm: finding.deckLossMm,
    crack_width_mm: finding.crackWidthMm,
    from_m: finding.fromM,
    to_m: finding.toM,
    severity: finding.severity,
    notes: finding.notes,
    disposition,
    critical: isCriticalFinding({ kind: finding.kind, severity: finding.severity, disposition }),
  };
}

/** Records a new finding against a girder of the inspected structure. */
export async function addFinding({ db, user }: Writer, inspectionId: number, { girderId, ...finding }: NewFinding): Promise<FindingDetail> {
  return withTransaction(db, async (trx) => {
    const inspection = await inspectionOpenForChange(trx, user, inspectionId);
    const girder = await findGirderById(trx, girderId);
    if (!girder || girder.structure_id !== inspection.structure_id) {
      throw AppError.invalidFields([{ field: 'girderId', message: `structure ${inspection.structure_number} has no girder with id ${girderId}` }]);
    }
    const span = await trx('spans').where({ id: girder.span_id }).first('length_m');
    await assertFindingFitsGirder(trx, girderId, span.length_m, finding);
    const id = await insertFinding(trx, { ...findingColumnsOf(finding, 'new'), inspection_id: inspectionId, girder_id: girderId, carried_from_id: null }, user.id);
    await recordAuditEvent({ db: trx, user, action: 'finding.recorded', entity: { type: 'finding', id }, after: { girderId, ...finding } });
    return (await withPhotos(trx, [(await findFindingById(trx, id))!]))[0]!;
  });
}

function findingFields(row: FindingRow): Record<string, unknown> {
  const detail = toFindingDetail(row);
  const { kind, strands, lossFraction, brokenWires, spall, deckLossMm, crackWidthMm, fromM, toM, severity, notes, disposition } = detail;
  return { kind, strands, lossFraction, brokenWires, spall, deckLossMm, crackWidthMm, fromM, toM, severity, notes, disposition };
}

/**
 * Changes a finding of an inspection being written. A finding recorded now stays `new`; one
 * carried forward is confirmed, grown (with its new extent) or marked repaired, and keeps its kind.
 */
export async function changeFinding({ db, user }: Writer, findingId: number, { version, disposition, ...finding }: FindingChange): Promise<FindingDetail> {
  return withTransaction(db, async (trx) => {
    const existing = await findFindingById(trx, findingId);
    if (!existing) throw AppError.notFound(`There is no finding with id ${findingId}`);
    await inspectionOpenForChange(trx, user, existing.inspection_id);
    const row = (await findFindingById(trx, findingId, { forUpdate: true }))!;
    if (row.version !== version) throw AppError.versionConflict(`The finding on girder ${row.girder_number} of span ${row.span_index}`, toFindingDetail(row));
    const nextDisposition = disposition ?? row.disposition;
    const carried = row.carried_from_id !== null;
    if (!carried && nextDisposition !== 'new') throw AppError.invalidFields([{ field: 'disposition', message: 'a finding recorded in this inspection is new; confirm, grow or repair findings carried forward' }]);
    if (carried && nextDisposition === 'new') throw AppError.invalidFields([{ field: 'disposition', message: 'a finding carried forward is confirmed, grown or repaired, not new' }]);
    if (carried && finding.kind !== row.kind) throw AppError.invalidFields([{ field: 'kind', message: `a finding carried forward keeps its kind (${FINDING_KIND_NAMES[row.kind].toLowerCase()}); record a new finding instead` }]);
    if (nextDisposition !== 'repaired') await assertFindingFitsGirder(trx, row.girder_id, row.span_length_m, finding);

    const changes = changedFields(findingFields(row), { ...finding, disposition: nextDisposition });
    if (changes.fields.length === 0) return (await withPhotos(trx, [row]))[0]!;
    await updateFinding(trx, findingId, version, findingColumnsOf(finding, nextDisposition), user.id);
    await recordAuditEvent({ db: trx, user, action: 'finding.changed', entity: { type: 'finding', id: findingId }, before: changes.before, after: changes.after });
    return (await withPhotos(trx, [(await findFindingById(trx, findingId))!]))[0]!;
  });
}

export async function removeFinding({ db, user }: Writer, findingId: number): Promise<void> {
  await withTransaction(db, async (trx) => {
    const row = await findFindingById(trx, findingId);
    if (!row) throw AppError.notFound(`There is no finding with id ${findingId}`);
    await inspectionOpenForChange(trx, user, row.inspection_id);
    if (row.carried_from_id !== null) throw AppError.readOnly('A finding carried forward is not deleted: confirm it, record its growth, or mark it repaired');
    await deleteFinding(trx, findingId);
    await recordAuditEvent({ db: trx, user, action: 'finding.deleted', entity: { type: 'finding', id: findingId }, before: findingFields(row) });
  });
}

/** What an imported row does to the register: records something new, changes what is there, or finds it already so. */
export type ImportOutcome = Exclude<keyof ImportCounts, 'rows' | 'refused' | 'fileRows'>;

/** Where findings imported for a structure's inspection of a day go, judged from the structure's inspections on file. */
export type ImportedFindingsPlace =
  | { readonly kind: 'new-inspection' }
  | { readonly kind: 'this-import'; readonly inspectionId: number }
  | { readonly kind: 'own-draft'; readonly inspectionId: number }
  | { readonly kind: 'refused'; readonly message: string };

type InspectionOnFile = Pick<InspectionRow, 'id' | 'inspected_on' | 'state' | 'inspector_id' | 'inspector_name' | 'source' | 'import_id'>;

const beingWritten = (inspection: InspectionOnFile) => inspection.state === 'draft' || inspection.state === 'returned';
/** Written by the commit now running: an imported inspection not yet claimed by its import (migrations/20261220000100_prior_ratings.ts). */
const ofThisImport = (inspection: InspectionOnFile) => inspection.source === 'import' && inspection.import_id === null;

/**
 * Where findings of a structure's inspection of `inspectedOn` are imported (docs/api.md, Imports):
 * into the inspection of that day this import is writing; into the importer's own draft of that
 * day, which stays a draft for them to submit; else into a new inspection — unless another
 * inspection of that day is on file (it was recorded by someone else, or is already reviewed), one
 * is being written (one at a time, since a draft carries the register's open findings forward), or
 * one of a later day is on file: its inspector has looked at the register since, and findings of
 * an earlier day would stand open beside what they found.
 */
export function placeOfImportedFindings(inspections: readonly InspectionOnFile[], user: Pick<SignedInUser, 'id'>, structureNumber: string, inspectedOn: string): ImportedFindingsPlace {
  const sameDay = inspections.filter((inspection) => inspection.inspected_on === inspectedOn);
  const imported = sameDay.find(ofThisImport);
  if (imported) return { kind: 'this-import', inspectionId: imported.id };
  const ownDraft = sameDay.find((inspection) => beingWritten(inspection) && inspection.inspector_id === user.id);
  if (ownDraft) return { kind: 'own-draft', inspectionId: ownDraft.id };
  const [other] = sameDay;
  if (other) {
    return { kind: 'refused', message: `${structureNumber} has an inspection of ${inspectedOn} on file (${INSPECTION_STATE_NAMES[other.state].toLowerCase()}, ${other.inspector_name}): findings are imported only into a new inspection or into your own draft of that day` };
  }
  const inProgress = inspections.find(beingWritten);
  if (inProgress) {
    return { kind: 'refused', message: `an inspection of ${structureNumber} is being written (${inProgress.inspected_on}, ${inProgress.inspector_name}): it is finished or deleted before findings of another day are imported` };
  }
  const later = inspections.filter((inspection) => !ofThisImport(inspection) && inspection.inspected_on > inspectedOn).at(-1);
  if (later) {
    return { kind: 'refused', message: `${structureNumber} has a later inspection on file (${later.inspected_on}, ${INSPECTION_STATE_NAMES[later.state].toLowerCase()}): findings of an earlier day would stand open beside what it found; record them in a new inspection instead` };
  }
  return { kind: 'new-inspection' };
}

/** The finding of a draft an imported row stands for: one recorded in it (not carried forward) on the same girder, of the same kind, at the same place — the import's key. */
function sameFindingOfDraft(draftFindings: readonly FindingRow[], girderId: number, finding: FindingInput): FindingRow | undefined {
  return draftFindings.find((row) => row.carried_from_id === null && row.girder_id === girderId && row.kind === finding.kind && row.from_m === finding.fromM && row.to_m === finding.toM);
}

/** What an imported finding does to a draft of the importer: adds to it, changes its finding of the same key, or leaves it as it is. */
export function importedFindingOutcomeInDraft(draftFindings: readonly FindingRow[], girderId: number, finding: FindingInput): ImportOutcome {
  const same = sameFindingOfDraft(draftFindings, girderId, finding);
  if (!same) return 'create';
  return changedFields(findingFields(same), { ...finding, disposition: 'new' }).fields.length === 0 ? 'unchanged' : 'update';
}

/** An imported inspection is filed as a routine one: a spreadsheet of field sheets does not say which kind each was. */
const IMPORTED_INSPECTION_NOTE = 'Recorded from an imported spreadsheet of field findings; see the import history.';

/**
 * A new inspection of the structure recorded from an import, by the importer, already on the
 * register so that its findings count at once: it goes as far as the importer may take an
 * inspection — a reviewer's (rater, manager) is accepted by them, an inspector's is submitted and
 * waits for review like any other. It carries nothing forward: a spreadsheet says what was found,
 * not what became of earlier findings, so those stay open until an inspection says otherwise.
 */
async function startImportedInspection(trx: Transaction, user: SignedInUser, structure: { id: number; district: string }, inspectedOn: string): Promise<InspectionRow> {
  const accepted = canInDistrict(user, 'reviewInspections', structure.district);
  const state = accepted ? 'accepted' : 'submitted';
  const id = await insertImportedInspection(trx, structure.id, { inspected_on: inspectedOn, kind: 'routine', notes: IMPORTED_INSPECTION_NOTE, state, reviewedBy: accepted ? user.id : null }, user.id);
  await recordAuditEvent({ db: trx, user, action: 'inspection.imported', entity: { type: 'inspection', id }, after: { structureId: structure.id, inspectedOn, kind: 'routine', state } });
  return (await findInspectionById(trx, id))!;
}

/** A finding of an imported inspection goes on the register as it is written: its span is due for re-rating and the district's raters hear of a critical one. */
async function addImportedFinding(trx: Transaction, user: SignedInUser, inspection: InspectionRow, girder: { id: number; span_id: number }, finding: FindingInput): Promise<void> {
  const span = await trx('spans').where({ id: girder.span_id }).first('length_m');
  await assertFindingFitsGirder(trx, girder.id, span.length_m, finding);
  const id = await insertFinding(trx, { ...findingColumnsOf(finding, 'new'), inspection_id: inspection.id, girder_id: girder.id, carried_from_id: null }, user.id);
  await recordAuditEvent({ db: trx, user, action: 'finding.recorded', entity: { type: 'finding', id }, after: { girderId: girder.id, ...finding, inspectionId: inspection.id, imported: true } });
  const row = (await findFindingById(trx, id))!;
  await markSpansReratingDue(trx, spansWithChangedDamage([row]));
  await alertRatersToCriticalFindings(trx, inspection, [row]);
}

/**
 * `POST /api/imports/:id/commit`, a findings row: records the finding on the girder in its
 * structure's inspection of `inspectedOn` (see `placeOfImportedFindings`), on the same rules as a
 * finding recorded in the field, with its history entry. Needs `importFindings` in the district.
 */
export async function recordImportedFinding({ db, user }: Writer, girderId: number, inspectedOn: string, finding: FindingInput): Promise<ImportOutcome> {
  return withTransaction(db, async (trx) => {
    const girder = await findGirderById(trx, girderId);
    if (!girder) throw AppError.notFound(`There is no girder with id ${girderId}`);
    // Locked, so imports and inspections of one structure take turns at its list of inspections.
    const structure = (await findStructureById(trx, girder.structure_id, { forUpdate: true }))!;
    if (!canInDistrict(user, 'importFindings', structure.district)) throw AppError.forbidden(`You may not import findings in ${structure.district}`);
    const place = placeOfImportedFindings(await findInspectionsOfStructures(trx, [structure.id]), user, structure.structure_number, inspectedOn);
    switch (place.kind) {
      case 'refused':
        throw AppError.invalidFields([{ field: 'inspectedOn', message: place.message }]);
      case 'own-draft':
        return recordInOwnDraft({ db: trx, user }, place.inspectionId, girderId, finding);
      case 'this-import':
        await addImportedFinding(trx, user, (await findInspectionById(trx, place.inspectionId, { forUpdate: true }))!, girder, finding);
        return 'create';
      case 'new-inspection':
        await addImportedFinding(trx, user, await startImportedInspection(trx, user, structure, inspectedOn), girder, finding);
        return 'create';
    }
  });
}

/** An imported finding in the importer's own draft is recorded as through the form: a new one, or a change to its finding of the same key. */
async function recordInOwnDraft(writer: Writer, inspectionId: number, girderId: number, finding: FindingInput): Promise<ImportOutcome> {
  const same = sameFindingOfDraft(await findFindingsOfInspection(writer.db, inspectionId), girderId, finding);
  if (!same) {
    await addFinding(writer, inspectionId, { ...finding, girderId });
    return 'create';
  }
  const changed = await changeFinding(writer, same.id, { ...finding, version: same.version });
  return changed.version === same.version ? 'unchanged' : 'update';
}

/** Alerts the raters of the district to each critical finding not alerted before (a resubmission does not alert twice). */
async function alertRatersToCriticalFindings(trx: Transaction, inspection: InspectionRow, findings: readonly FindingRow[]): Promise<void> {
  const raters = await findUsersOfRoleInDistrict(trx, 'rater', inspection.district);
  for (const finding of findings.filter((f) => f.critical)) {
    if (await findingAlreadyAlerted(trx, finding.id)) continue;
    const message = `${FINDING_KIND_NAMES[finding.kind]} on girder ${finding.girder_number} of span ${finding.span_index}, ${inspection.structure_number} (inspection of ${inspection.inspected_on} by ${inspection.inspector_name})`;
    await insertAlerts(
      trx,
      [{ kind: 'critical-finding', message, structure_id: inspection.structure_id, girder_id: finding.girder_id, inspection_id: inspection.id, finding_id: finding.id }],
      raters,
    );
  }
}

/**
 * Submits an inspection for review once every carried-forward finding has been looked at: its
 * findings go on the register (the ones they carry forward are superseded) and the district's
 * raters are alerted to critical ones at once.
 */
export async function submitInspection({ db, user }: Writer, id: number, version: number): Promise<InspectionDetail> {
  return withTransaction(db, async (trx) => {
    const row = await inspectionOpenForChange(trx, user, id);
    if (row.version !== version) throw AppError.versionConflict(`The inspection of ${row.inspected_on}`, await toInspectionDetail(trx, row));
    const findings = await findFindingsOfInspection(trx, id);
    const unreviewed = findings.flatMap((finding, index) =>
      finding.disposition === 'to-review'
        ? [{ field: `findings.${index}.disposition`, message: `carried forward from the last inspection (${FINDING_KIND_NAMES[finding.kind].toLowerCase()}, girder ${finding.girder_number} of span ${finding.span_index}): confirm it, record its growth, or mark it repaired` }]
        : [],
    );
    if (unreviewed.length > 0) throw AppError.invalidFields(unreviewed);
    await updateInspection(trx, id, version, { state: 'submitted', submitted_at: trx.fn.now(), return_comment: null }, user.id);
    await supersedeCarriedFindings(trx, id);
    await markSpansReratingDue(trx, spansWithChangedDamage(findings));
    await alertRatersToCriticalFindings(trx, row, findings);
    await recordAuditEvent({ db: trx, user, action: 'inspection.submitted', entity: { type: 'inspection', id }, before: { state: row.state }, after: { state: 'submitted' } });
    return toInspectionDetail(trx, (await findInspectionById(trx, id))!);
  });
}

/** Spans where the inspection changes the damage a rating applies: new or grown damage with an effect on flexure, or damage repaired. */
function spansWithChangedDamage(findings: readonly FindingRow[]): number[] {
  const changed = findings.filter((finding) => finding.disposition !== 'confirmed' && finding.kind !== 'crack' && finding.kind !== 'other');
  return [...new Set(changed.map((finding) => finding.span_id))];
}

/** The submitted inspection a reviewer acts on, locked, when the reviewer may review in its district. */
async function inspectionForReview(trx: Transaction, user: SignedInUser, id: number, version: number): Promise<InspectionRow> {
  const row = await findInspectionById(trx, id, { forUpdate: true });
  if (!row) throw inspectionNotFound(id);
  if (!canInDistrict(user, 'reviewInspections', row.district)) throw AppError.forbidden(`You may not review inspections in ${row.district}`);
  if (row.state !== 'submitted') throw AppError.readOnly(`The inspection of ${row.inspected_on} is ${row.state}, not waiting for review`);
  if (row.version !== version) throw AppError.versionConflict(`The inspection of ${row.inspected_on}`, await toInspectionDetail(trx, row));
  return row;
}

/** Accepts a submitted inspection; its condition ratings become the structure's. */
export async function acceptInspection({ db, user }: Writer, id: number, version: number): Promise<InspectionDetail> {
  return withTransaction(db, async (trx) => {
    const row = await inspectionForReview(trx, user, id, version);
    await updateInspection(trx, id, version, { state: 'accepted', reviewed_by: user.id, reviewed_at: trx.fn.now() }, user.id);
    await recordAuditEvent({ db: trx, user, action: 'inspection.accepted', entity: { type: 'inspection', id }, before: { state: row.state }, after: { state: 'accepted' } });
    await takeConditionRatings(trx, user, row);
    return toInspectionDetail(trx, (await findInspectionById(trx, id))!);
  });
}

/** The structure's condition ratings as the accepted inspection gave them (those it gave), with its date. */
async function takeConditionRatings(trx: Transaction, user: SignedInUser, inspection: InspectionRow): Promise<void> {
  const structure = (await findStructureById(trx, inspection.structure_id, { forUpdate: true }))!;
  if (structure.condition_rated_on !== null && structure.condition_rated_on > inspection.inspected_on) return;
  const given = {
    ...(inspection.deck_condition !== null ? { deckCondition: inspection.deck_condition } : {}),
    ...(inspection.superstructure_condition !== null ? { superstructureCondition: inspection.superstructure_condition } : {}),
    ...(inspection.substructure_condition !== null ? { substructureCondition: inspection.substructure_condition } : {}),
  };
  if (Object.keys(given).length === 0) return;
  const changes = changedFields(
    { deckCondition: structure.deck_condition, superstructureCondition: structure.superstructure_condition, substructureCondition: structure.substructure_condition, conditionRatedOn: structure.condition_rated_on },
    { ...given, conditionRatedOn: inspection.inspected_on },
  );
  if (changes.fields.length === 0) return;
  await updateStructure(
    trx,
    structure.id,
    structure.version,
    {
      deck_condition: inspection.deck_condition ?? structure.deck_condition,
      superstructure_condition: inspection.superstructure_condition ?? structure.superstructure_condition,
      substructure_condition: inspection.substructure_condition ?? structure.substructure_condition,
      condition_rated_on: inspection.inspected_on,
    },
    user.id,
  );
  await recordAuditEvent({ db: trx, user, action: 'structure.changed', entity: { type: 'structure', id: structure.id }, before: changes.before, after: { ...changes.after, fromInspection: inspection.id } });
}

export async function returnInspection({ db, user }: Writer, id: number, version: number, comment: string): Promise<InspectionDetail> {
  return withTransaction(db, async (trx) => {
    const row = await inspectionForReview(trx, user, id, version);
    await updateInspection(trx, id, version, { state: 'returned', return_comment: comment, reviewed_by: user.id, reviewed_at: trx.fn.now() }, user.id);
    await recordAuditEvent({ db: trx, user, action: 'inspection.returned', entity: { type: 'inspection', id }, before: { state: row.state }, after: { state: 'returned', comment } });
    return toInspectionDetail(trx, (await findInspectionById(trx, id))!);
  });
}

/** A girder's damage register: every finding it has had, newest first, with its state on the register. */
export async function girderFindings({ db }: Reader, girderId: number): Promise<FindingDetail[]> {
  if (!(await findGirderById(db, girderId))) throw AppError.notFound(`There is no girder with id ${girderId}`);
  return withPhotos(db, await findFindingsOfGirder(db, girderId));
}

/** What is open on the register for a span's girders: the damage a rating of the span applies. */
export async function openFindingsOfSpan({ db }: Reader, spanId: number): Promise<FindingDetail[]> {
  if (!(await db('spans').where({ id: spanId }).first('id'))) throw AppError.notFound(`There is no span with id ${spanId}`);
  return withPhotos(db, await findOpenFindingsOfSpan(db, spanId));
}
