import { z } from 'zod';
import { sectionShapeSchema } from '../section';

/**
 * The girder part of the calculation file (calc-file.md), shared by `capacity` and `rate`.
 * SI throughout, the unit in every key. Cross-field rules live in `checkGirder`.
 */

const positive = z.number().positive('must be > 0');
const nonNegative = z.number().nonnegative('must be >= 0');
const strengthBasis = z.enum(['cylinder', 'cube'], 'must be "cylinder" (f\'c) or "cube" (fck)');

/** Concrete strength always carries its basis (engineering.md §1); Ec is optional, else from a formula. */
export const concreteSchema = z.strictObject({
  strengthMpa: positive,
  basis: strengthBasis,
  unitWeightKnM3: positive.default(24),
  elasticModulusMpa: positive.optional(),
});
export type Concrete = z.output<typeof concreteSchema>;

/** A cast-in-place deck on the girder's flat top, with the haunch under it. */
export const deckSchema = z.strictObject({
  widthMm: positive,
  thicknessMm: positive,
  haunchMm: nonNegative.default(0),
  strengthMpa: positive,
  basis: strengthBasis,
  unitWeightKnM3: positive.optional(),
  elasticModulusMpa: positive.optional(),
});
export type Deck = z.output<typeof deckSchema>;

export const strandRowSchema = z.strictObject({
  id: z.string().min(1, 'must not be empty'),
  yMm: z.number(),
  count: z.number().int('must be a whole number').positive('must be > 0'),
  xMm: z.array(z.number()).optional(),
  strandAreaMm2: positive,
  strandDiameterMm: positive,
  fpuMpa: positive,
  fpyMpa: positive,
  epsMpa: positive,
  /** Effective prestress after all losses; `rate` may compute it instead. */
  fpeMpa: nonNegative.optional(),
  bonded: z.boolean().default(true),
  /** Unbonded tendons: length between anchorages, for the tendon stress at nominal strength. */
  unbondedLengthMm: positive.optional(),
});
export type StrandRow = z.output<typeof strandRowSchema>;

export const barSchema = z.strictObject({
  id: z.string().min(1, 'must not be empty'),
  yMm: z.number(),
  areaMm2: positive,
  fyMpa: positive,
  esMpa: positive.default(200_000),
});
export type Bar = z.output<typeof barSchema>;

export const girderSchema = z.strictObject({
  section: sectionShapeSchema,
  concrete: concreteSchema,
  deck: deckSchema.optional(),
  strandRows: z.array(strandRowSchema).default([]),
  bars: z.array(barSchema).default([]),
  tensioning: z.enum(['pre', 'post']).default('pre'),
});
export type Girder = z.output<typeof girderSchema>;

/** Strands named by position in a row's `xMm`, or simply counted. */
const strandSelection = {
  rowId: z.string().min(1, 'must not be empty'),
  count: z.number().int('must be a whole number').positive('must be > 0').optional(),
  strands: z.array(z.number().int('must be a whole number').nonnegative('must be >= 0')).min(1, 'must name at least one strand').optional(),
};

/** Where along the span a damage entry lies, and the finding it came from; `rate` uses these. */
const location = {
  fromM: nonNegative.optional(),
  toM: nonNegative.optional(),
  findingId: z.union([z.string(), z.number()]).optional(),
  hypothetical: z.boolean().optional(),
};

const pointMm = z.tuple([z.number(), z.number()]);

export const damageEntrySchema = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('lost-strands'), ...strandSelection, ...location }),
  z.strictObject({
    kind: z.literal('strand-area-loss'),
    ...strandSelection,
    lossFraction: z.number().gt(0, 'must be > 0').max(1, 'must be <= 1'),
    ...location,
  }),
  z.strictObject({
    kind: z.literal('concrete-loss'),
    polygonMm: z.array(pointMm).min(3, 'needs at least 3 points').optional(),
    bottomFlange: z.strictObject({ depthMm: positive, widthMm: positive }).optional(),
    ...location,
  }),
  z.strictObject({ kind: z.literal('deck-loss'), thicknessMm: positive, ...location }),
  z.strictObject({ kind: z.literal('exposed-strands'), ...strandSelection, ...location }),
]);
export type DamageEntry = z.output<typeof damageEntrySchema>;
export type StrandDamageEntry = Extract<DamageEntry, { rowId: string }>;

export const capacityOptionsSchema = z.strictObject({
  method: z.enum(['strain-compatibility', 'aashto-approximate', 'is1343']).default('strain-compatibility'),
  strandCurve: z.enum(['power', 'pci', 'is1343']).default('power'),
  concreteModel: z.enum(['whitney', 'parabolic', 'is1343']).default('whitney'),
  haunchInSection: z.boolean().default(false),
  /** Ec when a concrete gives none (engineering.md §2): default AASHTO 8th-edition form for cylinder strength, IS 456 for cube. */
  elasticModulusFormula: z.enum(['aashto-7', 'aashto-8', 'aci-318', 'is-456']).optional(),
});
export type CapacityOptions = z.output<typeof capacityOptionsSchema>;
