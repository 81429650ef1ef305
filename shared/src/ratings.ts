import { z } from 'zod';
import { damageEntrySchema, type DamageEntry } from './engine/calc-file/girder';
import type { RateFile } from './engine/calc-file/rate-file';
import type { ControllingRating, RateOutput } from './engine/rating/rate';
import type { FindingKind } from './inspections';
import type { UserStamp } from './inventory';

/**
 * Rating records of a span: the shared contract of the ratings API. A record keeps the
 * calculation files the engine read (one per girder rated, exactly the calc-file.md format), the
 * engine's outputs, the engine and policy versions, and who ran, submitted and reviewed it.
 */

/** draft → submitted → approved (the span's rating of record), or returned with comments and submitted again; an approved record is superseded by the next. */
export const RATING_STATES = ['draft', 'submitted', 'returned', 'approved', 'superseded'] as const;
export type RatingState = (typeof RATING_STATES)[number];
export const RATING_STATE_NAMES: Readonly<Record<RatingState, string>> = {
  draft: 'Draft',
  submitted: 'Waiting for review',
  returned: 'Returned for changes',
  approved: 'Rating of record',
  superseded: 'Superseded',
};

/** The strand stress–strain curves a rating may use (engineering.md §3). */
export const RATING_STRAND_CURVES = ['power', 'pci'] as const;
export const RATING_STRAND_CURVE_NAMES: Readonly<Record<(typeof RATING_STRAND_CURVES)[number], string>> = {
  power: 'Power formula',
  pci: 'PCI curve (1860 or 1725 MPa strand)',
};
export const RATING_CONCRETE_MODELS = ['whitney', 'parabolic'] as const;
export const RATING_CONCRETE_MODEL_NAMES: Readonly<Record<(typeof RATING_CONCRETE_MODELS)[number], string>> = {
  whitney: 'Rectangular stress block',
  parabolic: 'Parabolic stress–strain',
};

const reason = z.string().trim().min(3, 'say why, in a few words').max(2000, 'at most 2000 characters');

/** An open finding left out of a rating, and why (e.g. "repaired on 2026-11-03, inspection to follow"). */
export const findingExclusion = z.strictObject({
  findingId: z.number().int().positive(),
  reason,
});
export type FindingExclusion = z.output<typeof findingExclusion>;

/** A what-if damage entry on one girder: rated like a finding, marked hypothetical, and never approvable. */
export const hypotheticalDamage = z.strictObject({
  girderId: z.number().int().positive(),
  entry: damageEntrySchema,
  note: z.string().trim().max(2000, 'at most 2000 characters').default(''),
});
export type HypotheticalDamage = z.output<typeof hypotheticalDamage>;

/**
 * Body of `POST /api/spans/:id/ratings` (a new draft) and of `PUT /api/ratings/:id` (the draft
 * run again with changed choices, with the `version` read). Girders default to every girder of
 * the span; the capacity method is strain compatibility with the curve and concrete model named.
 */
export const ratingRun = z.strictObject({
  girderIds: z.array(z.number().int().positive()).min(1, 'rate at least one girder').optional(),
  vehicleIds: z.array(z.string().min(1)).min(1, 'choose at least one vehicle'),
  policyId: z.string().min(1, 'choose a rating policy'),
  strandCurve: z.enum(RATING_STRAND_CURVES).default('power'),
  concreteModel: z.enum(RATING_CONCRETE_MODELS).default('whitney'),
  exclusions: z.array(findingExclusion).default([]),
  hypothetical: z.array(hypotheticalDamage).default([]),
  notes: z.string().max(8000, 'at most 8000 characters').default(''),
});
export type RatingRun = z.output<typeof ratingRun>;

export const ratingRerun = ratingRun.extend({ version: z.number({ error: 'the version you read is required' }).int().positive() });

/** Body of the workflow steps: submit, approve and return carry the version read; return needs a comment. */
export const ratingStep = z.strictObject({
  version: z.number({ error: 'the version you read is required' }).int().positive(),
  comment: z.string().trim().max(4000, 'at most 4000 characters').default(''),
});
export const ratingReturn = ratingStep.extend({ comment: z.string().trim().min(3, 'say what needs changing').max(4000, 'at most 4000 characters') });

/** The lowest legal-load and design-inventory rating factors of a record, or of a structure's ratings of record. */
export interface RatingFigures {
  readonly lowestLegalRf: number | null;
  readonly lowestInventoryRf: number | null;
}

/** A rating record in lists (a span's ratings, the review queue). */
export interface RatingSummary extends RatingFigures {
  readonly id: number;
  readonly structureId: number;
  readonly structureNumber: string;
  readonly structureName: string;
  readonly district: string;
  readonly spanId: number;
  readonly spanIndex: number;
  readonly state: RatingState;
  readonly girderCount: number;
  /** Any what-if damage entry: such a record can be submitted for discussion but never approved. */
  readonly hypothetical: boolean;
  readonly created: UserStamp & { readonly byUserId: number | null };
  readonly submitted: UserStamp | null;
  readonly reviewed: UserStamp | null;
  readonly version: number;
}

/** A finding of the span's register as the rating used it: applied as its damage entry, or excluded with a reason. */
export interface AppliedFinding {
  readonly findingId: number;
  readonly girderId: number;
  readonly girderNumber: number;
  readonly kind: FindingKind;
  readonly fromM: number;
  readonly toM: number;
  readonly inspectedOn: string;
  /** The calculation file's damage entry; null for findings with no modelled effect on flexure (cracks, other). */
  readonly damageEntry: DamageEntry | null;
  readonly excludedReason: string | null;
}

/** One girder of a record: the calculation file as the engine read it and what the engine answered. */
export interface RatedGirder {
  readonly girderId: number;
  readonly girderNumber: number;
  readonly position: 'interior' | 'exterior';
  readonly calcFile: RateFile;
  readonly output: RateOutput;
}

/** One row of the results table: a girder, a vehicle and a rating level / limit state, at its lowest station. */
export interface RatingResultRow extends ControllingRating {
  readonly girderId: number;
  readonly girderNumber: number;
  /** The lowest of its level (inventory, operating, legal, permit) over the whole record. */
  readonly controlling: boolean;
}

export interface ReviewComment {
  readonly step: 'submitted' | 'returned' | 'approved';
  readonly comment: string;
  readonly at: string;
  readonly by: string | null;
}

/**
 * A rating on file from before Spanledger (imported from the owner's records), for a whole
 * structure (`spanId` null) or one span: `GET /api/structures/:id/prior-ratings`.
 */
export interface PriorRatingSummary extends RatingFigures {
  readonly id: number;
  readonly structureId: number;
  readonly spanId: number | null;
  readonly spanIndex: number | null;
  /** The day it was approved, YYYY-MM-DD. */
  readonly approvedOn: string;
  readonly sourceNote: string;
  /** The import that last wrote it. */
  readonly importId: number | null;
  /** The prior rating it follows: the newest earlier one of the same span or of the whole structure (of the whole structure, for a whole-structure one). */
  readonly previous: (RatingFigures & { readonly id: number; readonly approvedOn: string }) | null;
  readonly created: UserStamp;
}

/**
 * The rating of record a record or a new run is compared with: the span's approved record, or —
 * where Spanledger has approved none — the prior rating on file (`priorRating`), whose id is then
 * the prior rating's.
 */
export interface ComparedRatingOfRecord extends RatingFigures {
  readonly id: number;
  readonly approvedAt: string;
  readonly priorRating?: { readonly id: number; readonly approvedOn: string; readonly sourceNote: string; readonly spanIndex: number | null };
}

/** `GET /api/ratings/:id`. */
export interface RatingDetail extends RatingSummary {
  readonly run: RatingRun;
  readonly spanLengthM: number;
  readonly engineVersion: string;
  readonly policy: { readonly id: string; readonly version: string };
  readonly vehicles: readonly { readonly id: string; readonly version: string; readonly name: string; readonly category: string | null }[];
  readonly appliedFindings: readonly AppliedFinding[];
  readonly girders: readonly RatedGirder[];
  readonly results: readonly RatingResultRow[];
  readonly warnings: readonly string[];
  readonly reviewComments: readonly ReviewComment[];
  /** The span's rating of record when this record was run, else its prior rating on file (none for a first rating). */
  readonly previousRecord: ComparedRatingOfRecord | null;
  /** Whether the signed-in user may take each step now (the server checks again). */
  readonly allowed: { readonly rerun: boolean; readonly submit: boolean; readonly approve: boolean; readonly return: boolean };
  readonly caution: string;
}

/** `GET /api/spans/:id/rating-setup`: what a new rating of the span would use. */
export interface RatingSetup {
  readonly spanId: number;
  readonly spanIndex: number;
  readonly spanLengthM: number;
  readonly structureId: number;
  readonly structureNumber: string;
  readonly structureName: string;
  readonly district: string;
  readonly girders: readonly { readonly id: number; readonly girderNumber: number; readonly position: 'interior' | 'exterior' }[];
  readonly openFindings: readonly AppliedFinding[];
  readonly vehicles: readonly { readonly id: string; readonly version: string; readonly name: string; readonly category: string | null }[];
  readonly policies: readonly { readonly id: string; readonly version: string; readonly name: string }[];
  /** The span's rating of record, else its prior rating on file. */
  readonly ratingOfRecord: ComparedRatingOfRecord | null;
  readonly reratingDue: boolean;
}

/** The lowest legal-level and inventory-level rating factors over the girders' controlling ratings. */
export function ratingFiguresOf(outputs: readonly Pick<RateOutput, 'summary'>[]): RatingFigures {
  const lowestAt = (level: string) => {
    const factors = outputs.flatMap((output) => output.summary.controlling.filter((rating) => rating.level === level).map((rating) => rating.ratingFactor));
    return factors.length > 0 ? Math.min(...factors) : null;
  };
  return { lowestLegalRf: lowestAt('legal'), lowestInventoryRf: lowestAt('inventory') };
}

/**
 * The results table of a record: each girder's controlling rating per vehicle and rating-factor
 * key, girder by girder, with the lowest of each level over the record marked controlling.
 */
export function ratingResultRows(girders: readonly Pick<RatedGirder, 'girderId' | 'girderNumber' | 'output'>[]): RatingResultRow[] {
  const rows = girders.flatMap((girder) => girder.output.summary.controlling.map((rating) => ({ ...rating, girderId: girder.girderId, girderNumber: girder.girderNumber })));
  const lowestByLevel = new Map<string, number>();
  for (const row of rows) lowestByLevel.set(row.level, Math.min(lowestByLevel.get(row.level) ?? Infinity, row.ratingFactor));
  const marked = new Set<string>();
  return rows.map((row) => {
    // Mark one row per level: the first girder where the lowest factor occurs.
    const controlling = row.ratingFactor === lowestByLevel.get(row.level) && !marked.has(row.level);
    if (controlling) marked.add(row.level);
    return { ...row, controlling };
  });
}
