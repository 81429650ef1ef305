import {
  canInDistrict,
  type NewStructure,
  type SignedInUser,
  type StructureChange,
  type StructureDetail,
  type StructureFeature,
  type StructureFeatureCollection,
  type StructureListQuery,
} from '../../../shared/src';
import { recordAuditEvent, recordAuditEvents } from '../audit/audit-events';
import { withTransaction, type Database, type Transaction } from '../db/database';
import { onlyCreatedId, type ManyCreated } from '../db/many-created';
import { AppError } from '../http/app-error';
import { findSpansOfStructure } from '../spans/spans.repository';
import { changedFields, type FieldChanges } from '../audit/changed-fields';
import {
  findDistricts,
  findStructureById,
  findStructures,
  findStructuresByNumbers,
  insertStructures,
  structureNumberTaken,
  updateStructure,
  type StructureColumns,
  type StructureListRow,
  type StructureRow,
} from './structures.repository';

interface Reader {
  readonly db: Database;
}
interface Writer extends Reader {
  readonly user: SignedInUser;
}

function toFeature(row: StructureListRow): StructureFeature {
  return {
    type: 'Feature',
    id: row.id,
    geometry: { type: 'Point', coordinates: [row.longitude, row.latitude] },
    properties: {
      id: row.id,
      structureNumber: row.structure_number,
      name: row.name,
      routeCarried: row.route_carried,
      featureCrossed: row.feature_crossed,
      district: row.district,
      yearBuilt: row.year_built,
      adt: row.adt,
      adtt: row.adtt,
      status: row.status,
      lowestCondition: row.lowest_condition,
      legalRatingFactor: row.rating_of_record_legal_rf,
      designInventoryRatingFactor: row.rating_of_record_inventory_rf,
      reratingDue: row.rerating_due,
    },
  };
}

/** The structures that match as GeoJSON (RFC 7946), with how many match in all and whether this page holds fewer. */
export async function listStructures({ db }: Reader, query: StructureListQuery): Promise<StructureFeatureCollection> {
  const { rows, total } = await findStructures(db, query);
  return { type: 'FeatureCollection', total, truncated: query.offset + rows.length < total, features: rows.map(toFeature) };
}

export function listDistricts({ db }: Reader): Promise<string[]> {
  return findDistricts(db);
}

/** The editable fields of a structure as the API names them, from its row: what history records. */
/** A stored structure's fields as its change body names them. */
export function editableFields(row: StructureRow): Record<keyof StructureChangeFields, unknown> {
  return {
    structureNumber: row.structure_number,
    name: row.name,
    routeCarried: row.route_carried,
    featureCrossed: row.feature_crossed,
    district: row.district,
    longitude: row.longitude,
    latitude: row.latitude,
    yearBuilt: row.year_built,
    yearLastMajorWork: row.year_last_major_work,
    adt: row.adt,
    adtt: row.adtt,
    skewDeg: row.skew_deg,
    deckCondition: row.deck_condition,
    superstructureCondition: row.superstructure_condition,
    substructureCondition: row.substructure_condition,
    conditionRatedOn: row.condition_rated_on,
    status: row.status,
    notes: row.notes,
  };
}

type StructureChangeFields = Omit<StructureChange, 'version'>;

const COLUMN_OF: Readonly<Record<keyof StructureChangeFields, keyof StructureColumns>> = {
  structureNumber: 'structure_number',
  name: 'name',
  routeCarried: 'route_carried',
  featureCrossed: 'feature_crossed',
  district: 'district',
  longitude: 'longitude',
  latitude: 'latitude',
  yearBuilt: 'year_built',
  yearLastMajorWork: 'year_last_major_work',
  adt: 'adt',
  adtt: 'adtt',
  skewDeg: 'skew_deg',
  deckCondition: 'deck_condition',
  superstructureCondition: 'superstructure_condition',
  substructureCondition: 'substructure_condition',
  conditionRatedOn: 'condition_rated_on',
  status: 'status',
  notes: 'notes',
};

function toColumns(fields: Partial<StructureChangeFields>): StructureColumns {
  const columns: Record<string, unknown> = {};
  for (const [field, value] of Object.entries(fields)) columns[COLUMN_OF[field as keyof StructureChangeFields]] = value;
  return columns as StructureColumns;
}

async function toDetail(db: Database, row: StructureRow): Promise<StructureDetail> {
  const spans = await findSpansOfStructure(db, row.id);
  return {
    id: row.id,
    structureNumber: row.structure_number,
    name: row.name,
    routeCarried: row.route_carried,
    featureCrossed: row.feature_crossed,
    district: row.district,
    longitude: row.longitude,
    latitude: row.latitude,
    yearBuilt: row.year_built,
    yearLastMajorWork: row.year_last_major_work,
    adt: row.adt,
    adtt: row.adtt,
    skewDeg: row.skew_deg,
    conditions: {
      deck: row.deck_condition,
      superstructure: row.superstructure_condition,
      substructure: row.substructure_condition,
      ratedOn: row.condition_rated_on,
    },
    status: row.status,
    notes: row.notes,
    ratingOfRecord:
      row.rating_of_record_approved_at === null
        ? null
        : {
            lowestLegalRatingFactor: row.rating_of_record_legal_rf,
            designInventoryRatingFactor: row.rating_of_record_inventory_rf,
            approvedAt: row.rating_of_record_approved_at.toISOString(),
            approvedOn: row.rating_of_record_approved_on,
          },
    reratingDue: row.rerating_due,
    spans: spans.map((span) => ({ id: span.id, spanIndex: span.span_index, lengthM: span.length_m, girderCount: span.girder_count, girderSpacingMm: span.girder_spacing_mm })),
    version: row.version,
    created: { at: row.created_at.toISOString(), by: row.created_by_name },
    updated: { at: row.updated_at.toISOString(), by: row.updated_by_name },
  };
}

const notFound = (id: number) => AppError.notFound(`There is no structure with id ${id}`);

export async function getStructure({ db }: Reader, id: number): Promise<StructureDetail> {
  const row = await findStructureById(db, id);
  if (!row) throw notFound(id);
  return toDetail(db, row);
}

/** Refuses a change outside the user's districts (product brief: districts limit what a user may change). */
export function assertMayEditIn(user: SignedInUser, district: string): void {
  if (!canInDistrict(user, 'editInventory', district)) {
    throw AppError.forbidden(`You may not change the inventory of ${district}: your districts are ${user.districts.join(', ') || 'none'}`);
  }
}

async function assertNumberFree(db: Database, structureNumber: string, exceptId?: number): Promise<void> {
  if (await structureNumberTaken(db, structureNumber, exceptId)) {
    throw AppError.alreadyExists(`Structure number ${structureNumber} is already in the register`, 'structureNumber');
  }
}

/**
 * Changes a structure when the client's version is still current (else 409 with the current
 * record), inside the user's districts (the old and, when it moves, the new), and records what
 * changed in the history in the same transaction.
 */
export async function changeStructure({ db, user }: Writer, id: number, { version, ...fields }: StructureChange): Promise<StructureDetail> {
  return withTransaction(db, async (trx) => {
    const row = await findStructureById(trx, id, { forUpdate: true });
    if (!row) throw notFound(id);
    assertMayEditIn(user, row.district);
    if (fields.district !== undefined) assertMayEditIn(user, fields.district);
    if (row.version !== version) throw AppError.versionConflict(`Structure ${row.structure_number}`, await toDetail(trx, row));
    if (fields.structureNumber !== undefined) await assertNumberFree(trx, fields.structureNumber, id);

    const before = editableFields(row);
    // A moved point is written whole: the one coordinate not sent keeps its value.
    const withLocation = fields.longitude !== undefined || fields.latitude !== undefined ? { longitude: row.longitude, latitude: row.latitude, ...fields } : fields;
    const changes: FieldChanges = changedFields(before, withLocation);
    if (changes.fields.length === 0) return toDetail(trx, row);

    if (changes.fields.includes('status')) assertMayDecideStatus(user, row.district);
    const crossFieldProblem = checkCombined({ ...before, ...withLocation });
    if (crossFieldProblem) throw crossFieldProblem;

    if (!(await updateStructure(trx, id, version, toColumns(withLocation), user.id))) throw AppError.versionConflict(`Structure ${row.structure_number}`, await toDetail(trx, row));
    await recordAuditEvent({ db: trx, user, action: 'structure.changed', entity: { type: 'structure', id }, before: changes.before, after: changes.after });
    const updated = await findStructureById(trx, id);
    return toDetail(trx, updated!);
  });
}

/** The rules between fields, checked on the record as it will be (a change may send only one side). */
function checkCombined(values: Record<keyof StructureChangeFields, unknown>): AppError | null {
  const { adt, adtt, yearBuilt, yearLastMajorWork } = values as { adt: number | null; adtt: number | null; yearBuilt: number | null; yearLastMajorWork: number | null };
  const fields: { field: string; message: string }[] = [];
  if (adt !== null && adtt !== null && adtt > adt) fields.push({ field: 'adtt', message: `truck traffic cannot exceed all traffic (ADT ${adt})` });
  if (yearBuilt !== null && yearLastMajorWork !== null && yearLastMajorWork < yearBuilt) fields.push({ field: 'yearLastMajorWork', message: `cannot be before the year built (${yearBuilt})` });
  return fields.length === 0 ? null : AppError.invalidFields(fields);
}

/** Whether a structure is posted or closed is a posting decision (permission matrix: managers). */
function assertMayDecideStatus(user: SignedInUser, district: string): void {
  if (!canInDistrict(user, 'decidePostings', district)) {
    throw AppError.forbidden('Only an asset manager of the district may change whether a structure is open, posted or closed');
  }
}

/** Adds a structure to the register, in one of the user's districts; only a manager adds one already posted or closed. */
export async function createStructure({ db, user }: Writer, structure: NewStructure): Promise<StructureDetail> {
  return withTransaction(db, async (trx) => {
    const id = onlyCreatedId(await createStructures({ db: trx, user }, [structure]));
    return toDetail(trx, (await findStructureById(trx, id))!);
  });
}

/** Adds many structures on the rules of `createStructure`, checking their numbers in one query and writing in a few statements; each refused one is named by its index. */
export async function createStructures({ db, user }: { db: Database | Transaction; user: SignedInUser }, structures: readonly NewStructure[]): Promise<ManyCreated> {
  return withTransaction(db, async (trx) => {
    const taken = new Set((await findStructuresByNumbers(trx, structures.map((structure) => structure.structureNumber))).map((row) => row.structure_number));
    const refused = new Map<number, AppError>();
    const accepted: { index: number; structure: NewStructure }[] = [];
    structures.forEach((structure, index) => {
      try {
        assertMayEditIn(user, structure.district);
        if (structure.status !== 'open') assertMayDecideStatus(user, structure.district);
        if (taken.has(structure.structureNumber)) throw AppError.alreadyExists(`Structure number ${structure.structureNumber} is already in the register`, 'structureNumber');
        taken.add(structure.structureNumber);
        accepted.push({ index, structure });
      } catch (error) {
        if (!(error instanceof AppError)) throw error;
        refused.set(index, error);
      }
    });
    const ids = await insertStructures(trx, accepted.map(({ structure }) => toColumns(structure) as Required<StructureColumns>), user.id);
    await recordAuditEvents(trx, user, accepted.map(({ structure }, at) => ({ action: 'structure.created', entity: { type: 'structure', id: ids[at]! }, after: structure })));
    const idsInOrder: (number | null)[] = structures.map(() => null);
    accepted.forEach((each, at) => (idsInOrder[each.index] = ids[at]!));
    return { ids: idsInOrder, refused };
  });
}
