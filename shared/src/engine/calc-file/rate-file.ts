import { z } from 'zod';
import { vehicleReferenceSchema } from '../live-load/vehicle-library';
import { spanDistributionSchema } from '../distribution/schema';
import { DEFAULT_POLICY_ID, POLICY_LIBRARY, ratingPolicySchema, type RatingPolicy } from '../policy/rating-policy';
import { capacityFileIssues, pathKeys, type ParseResult } from './capacity-file';
import { capacityOptionsSchema, damageEntrySchema, girderSchema } from './girder';
import { describeIssues, type CalcFileIssue } from './json-path';

/**
 * The calculation file of `spanledger rate` (calc-file.md, "Added for rate"): the girder and
 * its damage as for `capacity`, plus the span, the loads and the policy. In this version strands
 * are straight and each damage entry applies over its fromM–toM length.
 */

const positive = z.number().positive('must be > 0');
const nonNegative = z.number().nonnegative('must be >= 0');

export const spanSchema = z.strictObject({
  lengthM: positive,
  girderCount: z.number().int('must be a whole number').min(2, 'a girder line needs at least 2 girders'),
  girderSpacingMm: positive,
  /** Which girder is rated, numbered 1…n from the left edge of the plans. */
  girder: z.number().int('must be a whole number').positive('must be > 0'),
  position: z.enum(['interior', 'exterior']),
  overhangMm: nonNegative,
  roadwayWidthMm: positive,
  skewDeg: z.number().min(0, 'must be >= 0').max(89, 'must be < 90').default(0),
  /** Exterior girders: from the girder's centreline to the traffic face of the barrier, positive when the face is outboard. */
  barrierFaceToGirderMm: z.number().optional(),
  wearingSurface: z
    .strictObject({
      thicknessMm: positive,
      unitWeightKnM3: positive.optional(),
      /** A measured overlay thickness earns the lower γDW. */
      measured: z.boolean().default(false),
      /** `overlay` is DW on the composite section; `integral` is cast with the deck, DC1, outside the structural depth. */
      kind: z.enum(['overlay', 'integral']).default('overlay'),
    })
    .optional(),
  barriers: z.array(z.strictObject({ loadKnM: positive })).default([]),
  diaphragms: z.array(z.strictObject({ xM: nonNegative, loadKn: positive })).default([]),
  distribution: spanDistributionSchema.default({ method: 'formula' }),
});
export type Span = z.output<typeof spanSchema>;

/** Options of a rating: strain compatibility only; the haunch and Ec choices default to the policy's. */
export const rateOptionsSchema = z.strictObject({
  method: z.literal('strain-compatibility', 'a rating uses strain compatibility').default('strain-compatibility'),
  strandCurve: capacityOptionsSchema.shape.strandCurve,
  concreteModel: z.enum(['whitney', 'parabolic'], 'a rating uses the AASHTO block ("whitney") or the parabola ("parabolic")').default('whitney'),
  haunchInSection: z.boolean().optional(),
  elasticModulusFormula: capacityOptionsSchema.shape.elasticModulusFormula,
});
export type RateOptions = z.output<typeof rateOptionsSchema>;

const rateFileObject = z.strictObject({
  units: z.literal('si', 'must be "si": convert US customary values at the edge'),
  girder: girderSchema,
  damage: z.array(damageEntrySchema).default([]),
  options: rateOptionsSchema.default(rateOptionsSchema.parse({})),
  span: spanSchema,
  losses: z.strictObject({ method: z.literal('given', 'this version takes the effective prestress as given per row') }).default({ method: 'given' }),
  condition: z.strictObject({ superstructure: z.number().int('must be a whole number').min(0, 'must be 0–9').max(9, 'must be 0–9') }),
  traffic: z.strictObject({ adtt: nonNegative }),
  vehicles: z.array(vehicleReferenceSchema).min(1, 'name at least one vehicle'),
  policy: z.union([z.string().min(1, 'must not be empty'), ratingPolicySchema]).default(DEFAULT_POLICY_ID),
});

export const rateFileSchema = rateFileObject.superRefine((file, ctx) => {
  for (const issue of rateFileIssues(file)) ctx.addIssue({ code: 'custom', path: pathKeys(issue.path), message: issue.message });
});
export type RateFile = z.output<typeof rateFileSchema>;

/** The policy a file names, or carries inline. Expects a checked file. */
export function policyOf(file: Pick<RateFile, 'policy'>): RatingPolicy {
  return typeof file.policy === 'string' ? POLICY_LIBRARY[file.policy]! : file.policy;
}

/** Parses and checks a rate calculation file; never throws for bad input. */
export function parseRateFile(input: unknown): ParseResult<RateFile> {
  const result = rateFileSchema.safeParse(input);
  return result.success ? { ok: true, file: result.data } : { ok: false, issues: describeIssues(result.error) };
}

/** The rules of a rate file that its fields cannot check alone. */
function rateFileIssues(file: z.output<typeof rateFileObject>): CalcFileIssue[] {
  const { span } = file;
  const policyKnown = typeof file.policy !== 'string' || file.policy in POLICY_LIBRARY;
  const policy = policyKnown ? policyOf(file) : POLICY_LIBRARY[DEFAULT_POLICY_ID]!;
  const sectionOptions = {
    ...file.options,
    haunchInSection: file.options.haunchInSection ?? policy.section.haunchInSection,
    elasticModulusFormula: file.options.elasticModulusFormula ?? policy.section.elasticModulusFormula,
  };
  const issues: CalcFileIssue[] = [...capacityFileIssues({ ...file, options: sectionOptions })];
  const spanLengthM = span.lengthM;
  file.damage.forEach((entry, index) => {
    const path = `damage[${index}]`;
    if (entry.fromM === undefined) issues.push({ path: `${path}.fromM`, message: 'required in a rating: where along the span the damage starts' });
    if (entry.toM === undefined) issues.push({ path: `${path}.toM`, message: 'required in a rating: where along the span the damage ends' });
    if (entry.toM !== undefined && entry.toM > spanLengthM) issues.push({ path: `${path}.toM`, message: `lies beyond the span (${spanLengthM} m)` });
    if (entry.fromM !== undefined && entry.fromM > spanLengthM) issues.push({ path: `${path}.fromM`, message: `lies beyond the span (${spanLengthM} m)` });
  });
  if (span.girder > span.girderCount) issues.push({ path: 'span.girder', message: `the span has ${span.girderCount} girders` });
  const isEdgeGirder = span.girder === 1 || span.girder === span.girderCount;
  if (span.position === 'exterior' && !isEdgeGirder) issues.push({ path: 'span.position', message: `girder ${span.girder} is not at an edge of the span` });
  if (span.position === 'interior' && isEdgeGirder) issues.push({ path: 'span.position', message: `girder ${span.girder} is an edge girder: rate it as exterior` });
  if (span.position === 'exterior' && span.barrierFaceToGirderMm === undefined) {
    issues.push({ path: 'span.barrierFaceToGirderMm', message: 'required for an exterior girder (lever rule and the e factor)' });
  }
  span.diaphragms.forEach((diaphragm, index) => {
    if (diaphragm.xM > spanLengthM) issues.push({ path: `span.diaphragms[${index}].xM`, message: `lies beyond the span (${spanLengthM} m)` });
  });
  if (file.girder.deck === undefined) issues.push({ path: 'girder.deck', message: 'a girder line is rated with its deck' });
  if (!policyKnown) {
    issues.push({ path: 'policy', message: `no rating policy has id "${file.policy}"; known: ${Object.keys(POLICY_LIBRARY).join(', ')}` });
  }
  return issues;
}
