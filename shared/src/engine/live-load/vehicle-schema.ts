import { z } from 'zod';

/** What a vehicle is rated as; the rating policy picks the live-load factor by category. */
export const VEHICLE_CATEGORIES = ['design', 'legal', 'permit', 'notional', 'emergency'] as const;
export type VehicleCategory = (typeof VEHICLE_CATEGORIES)[number];

/** Relative tolerance of the weight check: the library's converted values carry 15 significant digits. */
const WEIGHT_RELATIVE_TOLERANCE = 1e-9;

const positive = (unit: string) => z.number(`must be a number in ${unit}`).positive(`must be > 0 ${unit}`);

/**
 * A gap that varies between published bounds (the HL-93 rear spacing). Both bounds are kept as
 * published; on a simple span the minimum governs moment (see `AxleLayout`).
 */
const variableSpacingSchema = z.strictObject({
  gapIndex: z.int('must be a whole number').nonnegative('must be ≥ 0'),
  minMm: positive('mm'),
  maxMm: positive('mm'),
});

/** The published US customary values of a load case, kept so a checker can compare them with the SI ones. */
const usCaseValuesSchema = z.strictObject({
  axleLoadsKip: z.array(positive('kip')),
  axleSpacingsFt: z.array(positive('ft')),
  variableSpacingFt: z.strictObject({ minFt: positive('ft'), maxFt: positive('ft') }).optional(),
  laneLoadKipPerFt: positive('kip/ft').optional(),
});

/**
 * One arrangement of a vehicle that the envelope checks: an ordered axle list (kN, with mm
 * between consecutive axles), an optional variable gap, an optional uniform lane load, a factor on
 * every axle and where the dynamic load allowance applies.
 */
export const loadCaseSchema = z
  .strictObject({
    id: z.string('must be a text id').min(1, 'must not be empty'),
    name: z.string('must be text').optional(),
    axleLoadsKn: z.array(positive('kN')),
    axleSpacingsMm: z.array(positive('mm')),
    variableSpacing: variableSpacingSchema.optional(),
    laneLoadKnPerM: positive('kN/m').optional(),
    axleScale: positive('(a factor)').default(1),
    dynamicLoadAllowance: z
      .strictObject({ axles: z.boolean('must be true or false'), lane: z.boolean('must be true or false') })
      .default({ axles: true, lane: false }),
    us: usCaseValuesSchema.optional(),
  })
  .superRefine((loadCase, ctx) => {
    for (const issue of loadCaseIssues(loadCase)) ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message });
  });
export type LoadCase = z.output<typeof loadCaseSchema>;

/**
 * A vehicle of the library, or one a calculation file carries inline in `vehicles` (calc-file.md).
 * `weightCaseId` names the case whose axles (before any axle scale) make up `weightKn`, the weight
 * a posting uses; `us.siValues` says whether the SI values are exact conversions of the US ones or
 * the SI edition's own published values.
 */
export const vehicleDefinitionSchema = z
  .strictObject({
    id: z.string('must be a text id').min(1, 'must not be empty'),
    name: z.string('must be text').min(1, 'must not be empty'),
    category: z.enum(VEHICLE_CATEGORIES, `must be one of ${VEHICLE_CATEGORIES.join(', ')}`),
    source: z.string('must name the published source, or say "from memory — verify"').min(1, 'must not be empty'),
    weightKn: positive('kN'),
    weightCaseId: z.string('must be a case id').optional(),
    us: z.strictObject({ siValues: z.enum(['converted', 'published']), weightKip: positive('kip') }).optional(),
    note: z.string('must be text').optional(),
    cases: z.array(loadCaseSchema).min(1, 'a vehicle needs at least one load case'),
  })
  .superRefine((vehicle, ctx) => {
    for (const issue of vehicleIssues(vehicle)) ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message });
  });
export type VehicleDefinition = z.output<typeof vehicleDefinitionSchema>;
/** A vehicle as written in a file, before defaults are filled in. */
export type VehicleDefinitionInput = z.input<typeof vehicleDefinitionSchema>;

interface SchemaIssue {
  readonly path: (string | number)[];
  readonly message: string;
}

/** The fields of a load case its cross-field rules read. */
interface AxleListFields {
  readonly axleLoadsKn: readonly number[];
  readonly axleSpacingsMm: readonly number[];
  readonly variableSpacing?: { readonly gapIndex: number; readonly minMm: number; readonly maxMm: number } | undefined;
  readonly laneLoadKnPerM?: number | undefined;
  readonly us?: { readonly axleLoadsKip: readonly number[]; readonly axleSpacingsFt: readonly number[] } | undefined;
}

function loadCaseIssues(loadCase: AxleListFields): SchemaIssue[] {
  const issues: SchemaIssue[] = [];
  const axleCount = loadCase.axleLoadsKn.length;
  if (axleCount === 0 && loadCase.laneLoadKnPerM === undefined) {
    issues.push({ path: ['axleLoadsKn'], message: 'a load case needs at least one axle or a lane load' });
  }
  const gapCount = Math.max(axleCount - 1, 0);
  if (loadCase.axleSpacingsMm.length !== gapCount) {
    issues.push({ path: ['axleSpacingsMm'], message: `has ${loadCase.axleSpacingsMm.length} spacings for ${axleCount} axles (needs ${gapCount})` });
  }
  if (loadCase.variableSpacing !== undefined) issues.push(...variableSpacingIssues(loadCase.axleSpacingsMm, loadCase.variableSpacing, gapCount));
  if (loadCase.us !== undefined && loadCase.us.axleLoadsKip.length !== axleCount) {
    issues.push({ path: ['us', 'axleLoadsKip'], message: `has ${loadCase.us.axleLoadsKip.length} loads for ${axleCount} axles` });
  }
  if (loadCase.us !== undefined && loadCase.us.axleSpacingsFt.length !== loadCase.axleSpacingsMm.length) {
    issues.push({ path: ['us', 'axleSpacingsFt'], message: `has ${loadCase.us.axleSpacingsFt.length} spacings for ${loadCase.axleSpacingsMm.length} in axleSpacingsMm` });
  }
  return issues;
}

function variableSpacingIssues(
  axleSpacingsMm: readonly number[],
  { gapIndex, minMm, maxMm }: NonNullable<AxleListFields['variableSpacing']>,
  gapCount: number,
): SchemaIssue[] {
  if (gapIndex >= gapCount) return [{ path: ['variableSpacing', 'gapIndex'], message: `must name one of the ${gapCount} gaps (0 to ${gapCount - 1})` }];
  if (minMm > maxMm) return [{ path: ['variableSpacing', 'maxMm'], message: `must be at least minMm (${minMm})` }];
  const listedMm = axleSpacingsMm[gapIndex]!;
  return listedMm < minMm || listedMm > maxMm
    ? [{ path: ['axleSpacingsMm', gapIndex], message: `must lie within the variable spacing ${minMm}–${maxMm} mm` }]
    : [];
}

function vehicleIssues(vehicle: Pick<VehicleDefinition, 'cases' | 'weightCaseId' | 'weightKn'>): SchemaIssue[] {
  const issues: SchemaIssue[] = vehicle.cases.flatMap((loadCase, index) =>
    vehicle.cases.findIndex((other) => other.id === loadCase.id) === index ? [] : [{ path: ['cases', index, 'id'], message: `id "${loadCase.id}" is used twice` }],
  );
  if (vehicle.weightCaseId === undefined) return issues;
  const weightCase = vehicle.cases.find((loadCase) => loadCase.id === vehicle.weightCaseId);
  if (weightCase === undefined) return [...issues, { path: ['weightCaseId'], message: `names no load case of this vehicle ("${vehicle.weightCaseId}")` }];
  const axleSumKn = weightCase.axleLoadsKn.reduce((sum, loadKn) => sum + loadKn, 0);
  if (Math.abs(axleSumKn - vehicle.weightKn) > WEIGHT_RELATIVE_TOLERANCE * vehicle.weightKn) {
    issues.push({ path: ['weightKn'], message: `must equal the sum of case "${weightCase.id}"'s axle loads (${axleSumKn} kN)` });
  }
  return issues;
}
