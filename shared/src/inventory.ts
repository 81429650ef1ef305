import { z } from 'zod';
import { spanSchema } from './engine/calc-file/rate-file';
import { bboxParameter, DEFAULT_STRUCTURES_PER_REQUEST, MAX_STRUCTURES_PER_REQUEST } from './structures';

/**
 * The inventory API's shared contract: the query and body schemas the server validates with and
 * the browser app builds its forms from, and the shapes the server answers. Stored values are SI
 * (m for span lengths, mm for section and deck sizes); the browser converts at the edge.
 */

export const STRUCTURE_STATUSES = ['open', 'posted', 'closed'] as const;
export type StructureStatus = (typeof STRUCTURE_STATUSES)[number];
export const STRUCTURE_STATUS_NAMES: Readonly<Record<StructureStatus, string>> = { open: 'Open', posted: 'Posted', closed: 'Closed' };

/**
 * Bands of the rating factor the map colours and filters by (lowest legal-load factor of the
 * rating of record, or design inventory when the map is switched to it). 1.00 is where a legal
 * vehicle needs a posting; the others are our own plain steps.
 */
export const RATING_BANDS = [
  { key: 'not-rated', label: 'Not rated', min: null, max: null },
  { key: 'below-1', label: 'Below 1.00', min: null, max: 1 },
  { key: '1-to-1.5', label: '1.00 to 1.49', min: 1, max: 1.5 },
  { key: '1.5-up', label: '1.50 and above', min: 1.5, max: null },
] as const;
export type RatingBandKey = (typeof RATING_BANDS)[number]['key'];
const RATING_BAND_KEYS = RATING_BANDS.map((band) => band.key) as [RatingBandKey, ...RatingBandKey[]];

/** Which rating of record the map colours by. */
export const RATING_BASES = ['legal', 'design-inventory'] as const;
export type RatingBasis = (typeof RATING_BASES)[number];

export const STRUCTURE_SORT_KEYS = ['structureNumber', 'name', 'district', 'yearBuilt', 'adt', 'lowestCondition', 'ratingFactor'] as const;
export type StructureSortKey = (typeof STRUCTURE_SORT_KEYS)[number];

const wholeNumberText = (min: number, max: number) =>
  z.string().regex(/^\d+$/, 'expected a whole number').transform(Number).pipe(z.number().int().min(min).max(max));

/** A comma-separated list of known values, e.g. `status=open,posted`. */
function listOf<T extends string>(values: readonly [T, ...T[]]) {
  return z.string().transform((text, ctx): T[] => {
    const items = text.split(',').map((item) => item.trim()).filter((item) => item !== '');
    const unknown = items.filter((item) => !values.includes(item as T));
    if (unknown.length > 0) {
      ctx.addIssue({ code: 'custom', message: `unknown value ${unknown.map((u) => `"${u}"`).join(', ')}; expected ${values.join(', ')}` });
      return z.NEVER;
    }
    return items as T[];
  });
}

const districtList = z.string().transform((text) => text.split(',').map((item) => item.trim()).filter((item) => item !== ''));

/** `sort=name` ascending, `sort=-adt` descending. */
const sortParameter = z.string().transform((text, ctx): { key: StructureSortKey; descending: boolean } => {
  const descending = text.startsWith('-');
  const key = (descending ? text.slice(1) : text) as StructureSortKey;
  if (!STRUCTURE_SORT_KEYS.includes(key)) {
    ctx.addIssue({ code: 'custom', message: `expected one of ${STRUCTURE_SORT_KEYS.join(', ')}, optionally after "-" for descending` });
    return z.NEVER;
  }
  return { key, descending };
});

/**
 * Query of `GET /api/structures`: where (bbox), which (filters), in what order and which page.
 * The map and the structure table send the same filters, so both show the same structures.
 */
export const structureListQuery = z.strictObject({
  bbox: bboxParameter.optional(),
  district: districtList.optional(),
  status: listOf(STRUCTURE_STATUSES).optional(),
  ratingBand: listOf(RATING_BAND_KEYS).optional(),
  ratingBasis: z.enum(RATING_BASES).optional().default('legal'),
  /** Structures whose lowest condition rating (deck, superstructure, substructure) is at most this. */
  conditionAtMost: wholeNumberText(0, 9).optional(),
  /** Only structures with a span due for re-rating (`true`). */
  reratingDue: z.literal('true', 'expected "true", or leave it out').transform(() => true).optional(),
  /** Part of the structure number or the name, any case. */
  search: z.string().trim().max(100, 'at most 100 characters').optional(),
  sort: sortParameter.optional().default({ key: 'structureNumber', descending: false }),
  limit: wholeNumberText(1, MAX_STRUCTURES_PER_REQUEST).optional().default(DEFAULT_STRUCTURES_PER_REQUEST),
  offset: wholeNumberText(0, 10_000_000).optional().default(0),
});
export type StructureListQuery = z.output<typeof structureListQuery>;

/** The rating of record's headline figures, or null on a structure not yet rated. */
export interface RatingOfRecordSummary {
  readonly lowestLegalRatingFactor: number | null;
  readonly designInventoryRatingFactor: number | null;
  readonly approvedAt: string | null;
  /** 'YYYY-MM-DD' when the figures are those of a rating on file from before Spanledger, approved on that day (`approvedAt` is its start in UTC); null when Spanledger approved them. */
  readonly approvedOn: string | null;
}

export interface ConditionRatings {
  readonly deck: number | null;
  readonly superstructure: number | null;
  readonly substructure: number | null;
  /** ISO date the ratings were given. */
  readonly ratedOn: string | null;
}

/** The lowest of the three condition ratings, or null when none is recorded. */
export function lowestCondition(ratings: Pick<ConditionRatings, 'deck' | 'superstructure' | 'substructure'>): number | null {
  const given = [ratings.deck, ratings.superstructure, ratings.substructure].filter((value): value is number => value !== null);
  return given.length === 0 ? null : Math.min(...given);
}

/** The band a rating factor falls in (null = not rated). */
export function ratingBandOf(ratingFactor: number | null): RatingBandKey {
  if (ratingFactor === null) return 'not-rated';
  if (ratingFactor < 1) return 'below-1';
  return ratingFactor < 1.5 ? '1-to-1.5' : '1.5-up';
}

export interface UserStamp {
  readonly at: string;
  /** Display name of the user, or null for a change made by a data load. */
  readonly by: string | null;
}

export interface SpanSummary {
  readonly id: number;
  readonly spanIndex: number;
  readonly lengthM: number;
  readonly girderCount: number;
  readonly girderSpacingMm: number;
}

/** `GET /api/structures/:id`. */
export interface StructureDetail {
  readonly id: number;
  readonly structureNumber: string;
  readonly name: string;
  readonly routeCarried: string;
  readonly featureCrossed: string;
  readonly district: string;
  readonly longitude: number;
  readonly latitude: number;
  readonly yearBuilt: number | null;
  readonly yearLastMajorWork: number | null;
  readonly adt: number | null;
  readonly adtt: number | null;
  readonly skewDeg: number;
  readonly conditions: ConditionRatings;
  readonly status: StructureStatus;
  readonly notes: string;
  readonly ratingOfRecord: RatingOfRecordSummary | null;
  /** A span's damage or inventory changed after its rating of record was run (or it has none yet). */
  readonly reratingDue: boolean;
  readonly spans: readonly SpanSummary[];
  readonly version: number;
  readonly created: UserStamp;
  readonly updated: UserStamp;
}

const year = z.number().int('must be a whole year').min(1800, 'must be 1800 or later').max(2200, 'must be 2200 or earlier');
const trafficCount = z.number().int('must be a whole number').nonnegative('must be >= 0');
const conditionRating = z.number().int('must be a whole number').min(0, 'must be 0 to 9').max(9, 'must be 0 to 9');
const isoDate = z.iso.date('expected a date YYYY-MM-DD');
const requiredText = (max: number) => z.string().trim().min(1, 'is required').max(max, `at most ${max} characters`);

/** The fields of a structure people edit; every one is optional in a change, all but a few are required to create. */
const structureFields = {
  structureNumber: z.string().trim().min(1, 'is required').max(30, 'at most 30 characters').regex(/^[A-Za-z0-9][A-Za-z0-9 ._/-]*$/, 'letters, digits, spaces and . _ / - only'),
  name: requiredText(200),
  routeCarried: requiredText(100),
  featureCrossed: requiredText(200),
  district: requiredText(100),
  longitude: z.number().min(-180, 'must be -180 to 180').max(180, 'must be -180 to 180'),
  latitude: z.number().min(-90, 'must be -90 to 90').max(90, 'must be -90 to 90'),
  yearBuilt: year.nullable(),
  yearLastMajorWork: year.nullable(),
  adt: trafficCount.nullable(),
  adtt: trafficCount.nullable(),
  skewDeg: z.number().min(0, 'must be >= 0').lt(90, 'must be < 90'),
  deckCondition: conditionRating.nullable(),
  superstructureCondition: conditionRating.nullable(),
  substructureCondition: conditionRating.nullable(),
  conditionRatedOn: isoDate.nullable(),
  status: z.enum(STRUCTURE_STATUSES),
  notes: z.string().max(4000, 'at most 4000 characters'),
};

const versionField = z.number({ error: 'the version you read is required' }).int().positive();

type StructureFieldValues = { readonly [K in keyof typeof structureFields]?: z.output<(typeof structureFields)[K]> };

function structureRules(value: StructureFieldValues & { yearBuilt?: number | null }, ctx: z.RefinementCtx): void {
  if (value.adt != null && value.adtt != null && value.adtt > value.adt) {
    ctx.addIssue({ code: 'custom', path: ['adtt'], message: 'truck traffic cannot exceed all traffic (ADT)' });
  }
  if (value.yearBuilt != null && value.yearLastMajorWork != null && value.yearLastMajorWork < value.yearBuilt) {
    ctx.addIssue({ code: 'custom', path: ['yearLastMajorWork'], message: 'cannot be before the year built' });
  }
}

/** Body of `PATCH /api/structures/:id`: the version you read and the fields you change. */
export const structureChange = z
  .strictObject({ version: versionField, ...Object.fromEntries(Object.entries(structureFields).map(([key, schema]) => [key, schema.optional()])) } as {
    version: typeof versionField;
  } & { [K in keyof typeof structureFields]: z.ZodOptional<(typeof structureFields)[K]> })
  .superRefine(structureRules);
export type StructureChange = z.output<typeof structureChange>;

/** Body of `POST /api/structures`. */
export const newStructure = z
  .strictObject({
    ...structureFields,
    yearBuilt: structureFields.yearBuilt.optional().default(null),
    yearLastMajorWork: structureFields.yearLastMajorWork.optional().default(null),
    adt: structureFields.adt.optional().default(null),
    adtt: structureFields.adtt.optional().default(null),
    skewDeg: structureFields.skewDeg.optional().default(0),
    deckCondition: structureFields.deckCondition.optional().default(null),
    superstructureCondition: structureFields.superstructureCondition.optional().default(null),
    substructureCondition: structureFields.substructureCondition.optional().default(null),
    conditionRatedOn: structureFields.conditionRatedOn.optional().default(null),
    status: structureFields.status.optional().default('open'),
    notes: structureFields.notes.optional().default(''),
  })
  .superRefine(structureRules);
export type NewStructure = z.output<typeof newStructure>;

/** `GET /api/spans/:id` and each span of `GET /api/structures/:id/spans`. */
export interface SpanDetail {
  readonly id: number;
  readonly structureId: number;
  readonly spanIndex: number;
  readonly lengthM: number;
  readonly girderCount: number;
  readonly girderSpacingMm: number;
  readonly overhangMm: number;
  readonly roadwayWidthMm: number;
  readonly barrierFaceToGirderMm: number | null;
  readonly deckThicknessMm: number;
  readonly haunchMm: number;
  readonly wearingSurface: SpanChange['wearingSurface'] | null;
  readonly barriers: readonly { loadKnM: number }[];
  readonly diaphragms: readonly { xM: number; loadKn: number }[];
  readonly supportType: 'simple' | 'continuous';
  readonly version: number;
  readonly updated: UserStamp;
}

const spanShape = spanSchema.shape;

/**
 * Body of `PATCH /api/spans/:id`, with the calculation file's own rules for each value. The
 * girder count follows the girders stored on the span, so it is changed with the girders.
 */
export const spanChange = z
  .strictObject({
    version: versionField,
    lengthM: spanShape.lengthM.max(300, 'must be at most 300 m').optional(),
    girderSpacingMm: spanShape.girderSpacingMm.max(6000, 'must be at most 6000 mm').optional(),
    overhangMm: spanShape.overhangMm.max(3000, 'must be at most 3000 mm').optional(),
    roadwayWidthMm: spanShape.roadwayWidthMm.max(60000, 'must be at most 60000 mm').optional(),
    barrierFaceToGirderMm: z.number().min(-3000, 'must be -3000 mm to 3000 mm').max(3000, 'must be -3000 mm to 3000 mm').nullable().optional(),
    deckThicknessMm: z.number().positive('must be > 0').max(600, 'must be at most 600 mm').optional(),
    haunchMm: z.number().nonnegative('must be >= 0').max(500, 'must be at most 500 mm').optional(),
    wearingSurface: spanShape.wearingSurface.unwrap().nullable().optional(),
    barriers: spanShape.barriers.unwrap().optional(),
    diaphragms: spanShape.diaphragms.unwrap().optional(),
  })
  .superRefine((value, ctx) => {
    value.diaphragms?.forEach((diaphragm, index) => {
      if (value.lengthM !== undefined && diaphragm.xM > value.lengthM) {
        ctx.addIssue({ code: 'custom', path: ['diaphragms', index, 'xM'], message: `lies beyond the span (${value.lengthM} m)` });
      }
    });
  });
export type SpanChange = z.output<typeof spanChange>;

/** One row of `GET /api/spans/:id/girders`. */
export interface GirderSummary {
  readonly id: number;
  readonly spanId: number;
  readonly girderNumber: number;
  readonly position: 'interior' | 'exterior';
  /** The catalogue type's name, or null for a custom section. */
  readonly girderTypeName: string | null;
  readonly strandRowCount: number;
  readonly strandCount: number;
  readonly harped: boolean;
  readonly debonded: boolean;
  readonly concreteStrengthMpa: number;
  readonly tensioning: 'pre' | 'post';
  readonly version: number;
}

/** One entry of a history list, with the changed fields spelled out. */
export interface HistoryEvent {
  readonly id: string;
  readonly occurredAt: string;
  readonly action: string;
  readonly entityType: string;
  readonly entityId: string;
  /** What the entry is about, for people: "Structure", "Span 2", … */
  readonly subject: string;
  readonly userName: string | null;
  readonly changes: readonly { readonly field: string; readonly before: unknown; readonly after: unknown }[];
}

export interface Page<T> {
  readonly items: readonly T[];
  readonly total: number;
  readonly limit: number;
  readonly offset: number;
}

/** `?limit&offset` of the plain lists (history, girder types). */
export const pageQuery = z.strictObject({
  limit: wholeNumberText(1, 500).optional().default(50),
  offset: wholeNumberText(0, 10_000_000).optional().default(0),
});
export type PageQuery = z.output<typeof pageQuery>;

/** One entry of `GET /api/girder-types`. */
export interface GirderTypeSummary {
  readonly id: number;
  readonly name: string;
  readonly shape: string;
  readonly depthMm: number | null;
  readonly source: string;
  readonly section: Record<string, unknown>;
  /** Girders of the inventory that use the type. */
  readonly girderCount: number;
  readonly version: number;
}

/** One entry of `GET /api/vehicles` or `GET /api/rating-policies`: a versioned library item. */
export interface LibraryItemSummary {
  readonly id: string;
  readonly version: string;
  readonly name: string;
  readonly category: string | null;
  readonly source: string;
  readonly createdAt: string;
}
