import { z } from 'zod';
import type { DamageEntry } from './engine/calc-file/girder';
import type { UserStamp } from './inventory';

/**
 * Field inspections, their findings and the damage register: the shared contract of the
 * inspections API (schemas the server validates with and the browser app builds its forms from,
 * and the shapes the server answers). Lengths along a span are in m from the span's start.
 */

export const INSPECTION_KINDS = ['routine', 'in-depth', 'damage'] as const;
export type InspectionKind = (typeof INSPECTION_KINDS)[number];
export const INSPECTION_KIND_NAMES: Readonly<Record<InspectionKind, string>> = { routine: 'Routine', 'in-depth': 'In-depth', damage: 'Damage' };

/** draft → submitted → accepted, or returned with a comment and submitted again. */
export const INSPECTION_STATES = ['draft', 'submitted', 'returned', 'accepted'] as const;
export type InspectionState = (typeof INSPECTION_STATES)[number];
export const INSPECTION_STATE_NAMES: Readonly<Record<InspectionState, string>> = {
  draft: 'Draft',
  submitted: 'Submitted',
  returned: 'Returned for changes',
  accepted: 'Accepted',
};

export const FINDING_KINDS = ['lost-strands', 'strand-section-loss', 'broken-wires', 'exposed-strands', 'spall', 'deck-loss', 'crack', 'other'] as const;
export type FindingKind = (typeof FINDING_KINDS)[number];
export const FINDING_KIND_NAMES: Readonly<Record<FindingKind, string>> = {
  'lost-strands': 'Lost strands',
  'strand-section-loss': 'Strand section loss',
  'broken-wires': 'Broken wires',
  'exposed-strands': 'Exposed strands',
  spall: 'Spall',
  'deck-loss': 'Deck loss',
  crack: 'Crack',
  other: 'Other',
};
/** Kinds that name strands of a row (tapped on the cross-section, or a row and a count). */
export const STRAND_FINDING_KINDS: readonly FindingKind[] = ['lost-strands', 'strand-section-loss', 'broken-wires', 'exposed-strands'];

export const FINDING_SEVERITIES = ['minor', 'moderate', 'severe', 'critical'] as const;
export type FindingSeverity = (typeof FINDING_SEVERITIES)[number];
export const FINDING_SEVERITY_NAMES: Readonly<Record<FindingSeverity, string>> = { minor: 'Minor', moderate: 'Moderate', severe: 'Severe', critical: 'Critical' };

/**
 * What this inspection says of a finding: recorded now (`new`), or carried forward from the
 * register and not yet looked at (`to-review`), seen as before (`confirmed`), larger than before
 * (`grown`, with the new extent), or `repaired` (it leaves the register).
 */
export const FINDING_DISPOSITIONS = ['new', 'to-review', 'confirmed', 'grown', 'repaired'] as const;
export type FindingDisposition = (typeof FINDING_DISPOSITIONS)[number];

/** Seven-wire strand (ASTM A416): a broken wire takes a seventh of the strand's area. */
export const WIRES_PER_STRAND = 7;

const conditionRating = z.number().int('must be a whole number').min(0, 'must be 0 to 9').max(9, 'must be 0 to 9').nullable();
const isoDate = z.iso.date('expected a date YYYY-MM-DD');
const versionField = z.number({ error: 'the version you read is required' }).int().positive();
const nonNegative = z.number().nonnegative('must be >= 0');
const positive = z.number().positive('must be > 0');

const inspectionFields = {
  inspectedOn: isoDate,
  kind: z.enum(INSPECTION_KINDS),
  deckCondition: conditionRating,
  superstructureCondition: conditionRating,
  substructureCondition: conditionRating,
  notes: z.string().max(8000, 'at most 8000 characters'),
};

/** Body of `POST /api/structures/:id/inspections`: starts a draft with the open findings carried forward. */
export const newInspection = z.strictObject({
  inspectedOn: inspectionFields.inspectedOn,
  kind: inspectionFields.kind,
  deckCondition: inspectionFields.deckCondition.optional().default(null),
  superstructureCondition: inspectionFields.superstructureCondition.optional().default(null),
  substructureCondition: inspectionFields.substructureCondition.optional().default(null),
  notes: inspectionFields.notes.optional().default(''),
});
export type NewInspection = z.output<typeof newInspection>;

/** Body of `PATCH /api/inspections/:id` (its author, while a draft or returned). */
export const inspectionChange = z.strictObject({
  version: versionField,
  inspectedOn: inspectionFields.inspectedOn.optional(),
  kind: inspectionFields.kind.optional(),
  deckCondition: inspectionFields.deckCondition.optional(),
  superstructureCondition: inspectionFields.superstructureCondition.optional(),
  substructureCondition: inspectionFields.substructureCondition.optional(),
  notes: inspectionFields.notes.optional(),
});
export type InspectionChange = z.output<typeof inspectionChange>;

/** Body of `POST /api/inspections/:id/return`. */
export const inspectionReturn = z.strictObject({
  version: versionField,
  comment: z.string().trim().min(1, 'say what needs changing').max(4000, 'at most 4000 characters'),
});
/** Body of `POST /api/inspections/:id/submit` and `/accept`. */
export const inspectionStep = z.strictObject({ version: versionField });

/** Strands a finding names: by index in the row (0…count−1, as tapped on the drawing), or a count. */
export const findingStrands = z
  .strictObject({
    rowId: z.string().min(1, 'choose a strand row'),
    strands: z.array(z.number().int('must be a whole number').nonnegative('must be >= 0')).min(1, 'tap at least one strand').optional(),
    count: z.number().int('must be a whole number').positive('must be > 0').optional(),
  })
  .refine((value) => (value.strands === undefined) !== (value.count === undefined), { message: 'name the strands, or give a count — one of the two', path: ['strands'] });

const findingFields = {
  girderId: z.number().int().positive(),
  kind: z.enum(FINDING_KINDS),
  strands: findingStrands.nullable().default(null),
  /** Strand section loss: the fraction of each named strand's area that is gone. */
  lossFraction: z.number().gt(0, 'must be > 0').max(1, 'must be at most 1').nullable().default(null),
  /** Broken wires: how many wires of each named strand are broken (of seven). */
  brokenWires: z.number().int('must be a whole number').min(1, 'must be at least 1').max(WIRES_PER_STRAND - 1, `must be at most ${WIRES_PER_STRAND - 1}: a strand with every wire broken is lost`).nullable().default(null),
  /** Spall of the bottom flange: its depth and width across the flange. */
  spall: z.strictObject({ depthMm: positive, widthMm: positive }).nullable().default(null),
  /** Deck loss: thickness of deck lost over the girder. */
  deckLossMm: positive.nullable().default(null),
  /** Crack: width at the surface, for the record. */
  crackWidthMm: positive.nullable().default(null),
  fromM: nonNegative,
  toM: nonNegative,
  severity: z.enum(FINDING_SEVERITIES),
  notes: z.string().max(4000, 'at most 4000 characters').default(''),
};

type FindingFields = { [K in keyof typeof findingFields]: z.output<(typeof findingFields)[K]> };

/** The rules between a finding's fields: each kind carries what it needs and nothing it does not use. */
function findingRules(finding: Partial<FindingFields>, ctx: z.RefinementCtx): void {
  const kind = finding.kind;
  if (kind === undefined) return;
  const needs = (field: keyof FindingFields, message: string) => {
    if (finding[field] === null || finding[field] === undefined) ctx.addIssue({ code: 'custom', path: [field], message });
  };
  const unused = (field: keyof FindingFields) => {
    if (finding[field] !== null && finding[field] !== undefined) ctx.addIssue({ code: 'custom', path: [field], message: `a ${FINDING_KIND_NAMES[kind].toLowerCase()} finding does not use it` });
  };
  if (STRAND_FINDING_KINDS.includes(kind)) needs('strands', 'name the strands it affects');
  else unused('strands');
  if (kind === 'strand-section-loss') needs('lossFraction', 'give the fraction of area lost');
  else unused('lossFraction');
  if (kind === 'broken-wires') needs('brokenWires', 'give how many wires are broken');
  else unused('brokenWires');
  if (kind === 'spall') needs('spall', 'give the depth and width of the spall');
  else unused('spall');
  if (kind === 'deck-loss') needs('deckLossMm', 'give the thickness of deck lost');
  else unused('deckLossMm');
  if (kind !== 'crack') unused('crackWidthMm');
  if (finding.fromM !== undefined && finding.toM !== undefined && finding.toM < finding.fromM) {
    ctx.addIssue({ code: 'custom', path: ['toM'], message: 'must not be before "from"' });
  }
}

/** Body of `POST /api/inspections/:id/findings`: a finding recorded in this inspection. */
export const newFinding = z.strictObject(findingFields).superRefine(findingRules);
export type NewFinding = z.output<typeof newFinding>;

/**
 * Body of `PUT /api/findings/:id`: the whole finding as it stands in this inspection, with the
 * version read. A finding carried forward also takes its disposition (confirmed, grown, repaired).
 */
export const findingChange = z
  .strictObject({
    version: versionField,
    ...Object.fromEntries(Object.entries(findingFields).filter(([key]) => key !== 'girderId')),
    disposition: z.enum(FINDING_DISPOSITIONS).optional(),
  } as { version: typeof versionField; disposition: z.ZodOptional<z.ZodEnum<{ [K in FindingDisposition]: K }>> } & Omit<typeof findingFields, 'girderId'>)
  .superRefine(findingRules);
export type FindingChange = z.output<typeof findingChange>;

/** A finding as the API answers it. */
export interface FindingDetail {
  readonly id: number;
  readonly inspectionId: number;
  readonly girderId: number;
  readonly girderNumber: number;
  readonly spanId: number;
  readonly spanIndex: number;
  readonly kind: FindingKind;
  readonly strands: z.output<typeof findingStrands> | null;
  readonly lossFraction: number | null;
  readonly brokenWires: number | null;
  readonly spall: { readonly depthMm: number; readonly widthMm: number } | null;
  readonly deckLossMm: number | null;
  readonly crackWidthMm: number | null;
  readonly fromM: number;
  readonly toM: number;
  readonly severity: FindingSeverity;
  readonly notes: string;
  readonly disposition: FindingDisposition;
  /** The finding of an earlier inspection this one carries forward, or null for a new one. */
  readonly carriedFromId: number | null;
  /** On the register: open, repaired, or superseded by a later inspection's finding; `draft` while its inspection was never submitted. */
  readonly registerState: 'draft' | 'open' | 'repaired' | 'superseded';
  /** Critical: newly lost strands or broken wires, or marked critical; raters of the district are alerted on submit. */
  readonly critical: boolean;
  /** The calculation file's damage entry a rating applies, or null for kinds with no capacity effect (cracks, other). */
  readonly damageEntry: DamageEntry | null;
  readonly photoIds: readonly number[];
  readonly version: number;
}

/** One inspection in a structure's list. */
export interface InspectionSummary {
  readonly id: number;
  readonly structureId: number;
  readonly inspectedOn: string;
  readonly kind: InspectionKind;
  readonly state: InspectionState;
  readonly inspectorName: string;
  readonly findingCount: number;
  readonly criticalCount: number;
}

/** `GET /api/inspections/:id`. */
export interface InspectionDetail extends InspectionSummary {
  readonly structureNumber: string;
  readonly district: string;
  readonly inspectorId: number;
  readonly conditions: { readonly deck: number | null; readonly superstructure: number | null; readonly substructure: number | null };
  readonly notes: string;
  readonly returnComment: string | null;
  readonly submittedAt: string | null;
  readonly reviewed: UserStamp | null;
  readonly findings: readonly FindingDetail[];
  readonly photoIds: readonly number[];
  readonly version: number;
}

/** An alert in the app, e.g. a critical finding for the raters of its district. */
export interface AlertItem {
  readonly id: number;
  readonly kind: 'critical-finding';
  readonly message: string;
  readonly structureId: number;
  readonly structureNumber: string;
  readonly girderId: number | null;
  readonly inspectionId: number | null;
  readonly findingId: number | null;
  readonly createdAt: string;
  readonly readAt: string | null;
}

/** Photos an upload accepts, recognised by their first bytes rather than their names. */
export const PHOTO_CONTENT_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const;
export type PhotoContentType = (typeof PHOTO_CONTENT_TYPES)[number];

/** A photo of an inspection or of one of its findings. */
export interface PhotoSummary {
  readonly id: number;
  readonly inspectionId: number;
  readonly findingId: number | null;
  readonly contentType: PhotoContentType;
  readonly byteSize: number;
  readonly widthPx: number;
  readonly heightPx: number;
  readonly originalName: string;
  readonly uploaded: UserStamp;
}

/** The parts of a finding that say what damage it is and where. */
export type FindingDamage = Pick<FindingDetail, 'kind' | 'strands' | 'lossFraction' | 'brokenWires' | 'spall' | 'deckLossMm' | 'fromM' | 'toM'> & { readonly id?: number | string };

/**
 * The calculation file's damage entry for a finding (calc-file.md, `damage`), or null for kinds
 * with no modelled effect on flexural capacity (cracks, other). Broken wires of a seven-wire
 * strand take that share of its area (a section loss of wires ÷ 7); a bottom-flange spall is a
 * concrete loss of its depth and width.
 */
export function damageEntryOfFinding(finding: FindingDamage): DamageEntry | null {
  const where = { fromM: finding.fromM, toM: finding.toM, ...(finding.id !== undefined ? { findingId: finding.id } : {}) };
  const strands = finding.strands ? { rowId: finding.strands.rowId, ...(finding.strands.strands ? { strands: [...finding.strands.strands] } : { count: finding.strands.count! }) } : null;
  switch (finding.kind) {
    case 'lost-strands':
      return strands && { kind: 'lost-strands', ...strands, ...where };
    case 'exposed-strands':
      return strands && { kind: 'exposed-strands', ...strands, ...where };
    case 'strand-section-loss':
      return strands && finding.lossFraction !== null ? { kind: 'strand-area-loss', ...strands, lossFraction: finding.lossFraction, ...where } : null;
    case 'broken-wires':
      return strands && finding.brokenWires !== null ? { kind: 'strand-area-loss', ...strands, lossFraction: finding.brokenWires / WIRES_PER_STRAND, ...where } : null;
    case 'spall':
      return finding.spall ? { kind: 'concrete-loss', bottomFlange: { depthMm: finding.spall.depthMm, widthMm: finding.spall.widthMm }, ...where } : null;
    case 'deck-loss':
      return finding.deckLossMm !== null ? { kind: 'deck-loss', thicknessMm: finding.deckLossMm, ...where } : null;
    case 'crack':
    case 'other':
      return null;
  }
}

/** Newly lost strands or broken wires, or anything the inspector marks critical, alert the district's raters at once. */
export function isCriticalFinding(finding: Pick<FindingDetail, 'kind' | 'severity' | 'disposition'>): boolean {
  if (finding.severity === 'critical') return true;
  const strandBreak = finding.kind === 'lost-strands' || finding.kind === 'broken-wires';
  return strandBreak && (finding.disposition === 'new' || finding.disposition === 'grown');
}
