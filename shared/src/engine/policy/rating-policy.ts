import { z } from 'zod';
import lrfrDefault from '../data/policies/lrfr-default.json';

/**
 * A rating policy: every factor a rating uses, named, versioned and recorded with each rating
 * (engineering.md §7: no hidden constants). The library lives in `engine/data/policies/`; a
 * calculation file may name one by id or carry its own inline.
 */

const factor = z.number().positive('must be > 0');
const byAdtt = z
  .array(z.strictObject({ adtt: z.number().nonnegative('must be >= 0'), gammaLL: factor }))
  .min(1, 'needs at least one row')
  .refine((rows) => rows.every((row, i) => i === 0 || row.adtt > rows[i - 1]!.adtt), 'rows must rise in adtt');

export const ratingPolicySchema = z.strictObject({
  id: z.string().min(1),
  version: z.string().min(1),
  name: z.string().min(1),
  source: z.string().min(1),
  deadLoad: z.strictObject({
    gammaDC: factor,
    gammaDW: factor,
    gammaDWMeasured: factor,
    /** DC2 barriers shared by all girders, or carried by the exterior girders only. */
    barriers: z.enum(['equal', 'exterior']),
    wearingSurfaceUnitWeightKnM3: factor,
    girderUnitWeightKnM3: factor,
  }),
  liveLoad: z.strictObject({
    impactFactor: z.number().nonnegative('must be >= 0'),
    gammaLLInventory: factor,
    gammaLLOperating: factor,
    legalByAdtt: byAdtt,
    permitByAdtt: byAdtt,
    emergencyGammaLL: factor,
    /** Permit loads with the single-lane factor (the multi-lane formula ÷ 1.2). */
    permitSingleLane: z.boolean(),
  }),
  serviceIII: z.strictObject({
    gammaLLInventory: factor,
    rateLegal: z.boolean(),
    gammaLLLegal: factor,
    tensionCoefficientSqrtMpa: z.number().nonnegative('must be >= 0'),
    tensionCapMpa: factor.nullable(),
  }),
  resistance: z.strictObject({
    conditionFactors: z.array(z.strictObject({ minRating: z.number().int().min(0).max(9), phiC: factor })).min(1),
    /** φc used instead of the condition factor when the damage is modelled explicitly; null keeps φc. */
    conditionFactorWhenDamageModelled: factor.nullable(),
    systemFactors: z.array(z.strictObject({ minGirders: z.number().int().nonnegative(), phiS: factor })).min(1),
    minimumPhiCPhiS: factor,
  }),
  section: z.strictObject({
    effectiveFlangeWidth: z.enum(['tributary', 'as-given']),
    haunchInSection: z.boolean(),
    elasticModulusFormula: z.enum(['aashto-7', 'aashto-8', 'aci-318', 'is-456']),
  }),
  posting: z.strictObject({
    unit: z.enum(['t', 'ton']),
    ratingFactorLimit: z.number().nonnegative(),
  }),
});
export type RatingPolicy = z.output<typeof ratingPolicySchema>;

/** The policies that ship with the engine, by id. */
export const POLICY_LIBRARY: Readonly<Record<string, RatingPolicy>> = Object.freeze({
  [lrfrDefault.id]: ratingPolicySchema.parse(lrfrDefault),
});

export const DEFAULT_POLICY_ID = 'lrfr-default';

/** Linear interpolation in an ADTT table, held constant beyond its ends (MBE 6A.4.4.2.3 [R]). */
export function gammaLLForAdtt(rows: readonly { adtt: number; gammaLL: number }[], adtt: number): number {
  const first = rows[0]!;
  if (adtt <= first.adtt) return first.gammaLL;
  for (let i = 1; i < rows.length; i++) {
    const low = rows[i - 1]!;
    const high = rows[i]!;
    if (adtt <= high.adtt) return low.gammaLL + ((adtt - low.adtt) / (high.adtt - low.adtt)) * (high.gammaLL - low.gammaLL);
  }
  return rows[rows.length - 1]!.gammaLL;
}

/** φc from the superstructure condition rating (MBE 6A.4.2.3 [R]): the first row whose minimum it reaches. */
export function conditionFactor(policy: RatingPolicy, superstructureRating: number): number {
  const rows = [...policy.resistance.conditionFactors].sort((a, b) => b.minRating - a.minRating);
  return (rows.find((row) => superstructureRating >= row.minRating) ?? rows[rows.length - 1]!).phiC;
}

/** φs from the number of girders (MBE 6A.4.2.4 [R]). */
export function systemFactor(policy: RatingPolicy, girderCount: number): number {
  const rows = [...policy.resistance.systemFactors].sort((a, b) => b.minGirders - a.minGirders);
  return (rows.find((row) => girderCount >= row.minGirders) ?? rows[rows.length - 1]!).phiS;
}
