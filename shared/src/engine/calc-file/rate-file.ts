import { z } from 'zod';
import { vehicleReferenceSchema } from '../live-load/vehicle-library';
import { spanDistributionSchema } from '../distribution/schema';
import { DEFAULT_POLICY_ID, POLICY_LIBRARY, ratingPolicySchema, type RatingPolicy } from '../policy/rating-policy';
import { shapeToPolygons } from '../section';
import { widthAtMm } from '../geometry';
import { lossesSchema } from '../losses/schema';
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

/**
 * A strand row's profile along the span (engineering.md §5): straight at the row's `yMm`;
 * harped, level at `yMm` between the hold-down points and rising linearly to `endYMm` at both
 * ends; or draped (post-tensioned), a parabola through `endYMm` at the ends and `yMm` at midspan.
 */
export const profileSchema = z.discriminatedUnion('shape', [
  z.strictObject({ rowId: z.string().min(1, 'must not be empty'), shape: z.literal('straight') }),
  z.strictObject({
    rowId: z.string().min(1, 'must not be empty'),
    shape: z.literal('harped'),
    endYMm: z.number(),
    holdDownM: z.tuple([nonNegative, nonNegative], 'give the two hold-down points, [from the start, from the start]'),
  }),
  z.strictObject({ rowId: z.string().min(1, 'must not be empty'), shape: z.literal('draped'), endYMm: z.number() }),
]);
export type Profile = z.output<typeof profileSchema>;

/** Strands of a row debonded (sheathed) over `lengthM` from each end of the member. */
export const debondingSchema = z.strictObject({
  rowId: z.string().min(1, 'must not be empty'),
  strands: z.array(z.number().int('must be a whole number').nonnegative('must be >= 0')).min(1, 'must name at least one strand'),
  lengthM: positive,
});
export type Debonding = z.output<typeof debondingSchema>;

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
  profiles: z.array(profileSchema).default([]),
  debonding: z.array(debondingSchema).default([]),
  losses: lossesSchema.default({ method: 'given' }),
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
  const lossesComputed = file.losses.method !== 'given';
  const issues: CalcFileIssue[] = [...capacityFileIssues({ ...file, options: sectionOptions }, { effectivePrestressGiven: !lossesComputed })];
  if (lossesComputed) {
    file.girder.strandRows.forEach((row, index) => {
      if (row.fpeMpa !== undefined) issues.push({ path: `girder.strandRows[${index}].fpeMpa`, message: `remove it: losses.method "${file.losses.method}" computes the effective prestress` });
    });
    if (file.girder.tensioning === 'post') issues.push({ path: 'losses.method', message: 'the approximate method is for pretensioned girders; give fpeMpa per row' });
  }
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
  issues.push(...profileIssues(file), ...debondingIssues(file));
  if (!policyKnown) {
    issues.push({ path: 'policy', message: `no rating policy has id "${file.policy}"; known: ${Object.keys(POLICY_LIBRARY).join(', ')}` });
  }
  return issues;
}

function rowIndexOf(file: { girder: { strandRows: readonly { id: string }[] } }, rowId: string): number {
  return file.girder.strandRows.findIndex((row) => row.id === rowId);
}

function profileIssues(file: z.output<typeof rateFileObject>): CalcFileIssue[] {
  const issues: CalcFileIssue[] = [];
  const polygons = shapeToPolygons(file.girder.section);
  const lengthM = file.span.lengthM;
  file.profiles.forEach((profile, index) => {
    const path = `profiles[${index}]`;
    const rowIndex = rowIndexOf(file, profile.rowId);
    if (rowIndex < 0) {
      issues.push({ path: `${path}.rowId`, message: `no strand row has id "${profile.rowId}"` });
      return;
    }
    if (file.profiles.findIndex((other) => other.rowId === profile.rowId) !== index) {
      issues.push({ path: `${path}.rowId`, message: `row "${profile.rowId}" already has a profile` });
    }
    if (profile.shape === 'straight') return;
    const width = polygons.reduce((sum, polygon) => sum + widthAtMm(polygon, profile.endYMm), 0);
    if (!(width > 0)) issues.push({ path: `${path}.endYMm`, message: `${profile.endYMm} mm is not inside the girder section` });
    if (profile.shape === 'draped' && file.girder.tensioning !== 'post') {
      issues.push({ path: `${path}.shape`, message: 'a draped profile is for post-tensioned tendons; pretensioned strands are harped' });
    }
    if (profile.shape === 'harped') {
      const [first, second] = profile.holdDownM;
      if (first > second) issues.push({ path: `${path}.holdDownM[1]`, message: 'must not be less than the first hold-down point' });
      if (first <= 0 || second >= lengthM) issues.push({ path: `${path}.holdDownM`, message: `hold-down points must lie inside the span (0–${lengthM} m)` });
    }
  });
  return issues;
}

function debondingIssues(file: z.output<typeof rateFileObject>): CalcFileIssue[] {
  const issues: CalcFileIssue[] = [];
  file.debonding.forEach((entry, index) => {
    const path = `debonding[${index}]`;
    const row = file.girder.strandRows[rowIndexOf(file, entry.rowId)];
    if (!row) {
      issues.push({ path: `${path}.rowId`, message: `no strand row has id "${entry.rowId}"` });
      return;
    }
    entry.strands.forEach((strand, position) => {
      if (strand >= row.count) issues.push({ path: `${path}.strands[${position}]`, message: `row "${row.id}" has strands 0–${row.count - 1} only` });
    });
    if (entry.lengthM * 2 >= file.span.lengthM) issues.push({ path: `${path}.lengthM`, message: `debonding from both ends would meet: at most half the span (${file.span.lengthM / 2} m)` });
    if (file.girder.tensioning === 'post') issues.push({ path, message: 'debonding is for pretensioned strands' });
  });
  return issues;
}
