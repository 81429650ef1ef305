import { EngineInputError, joinPath } from './errors';

/**
 * Concrete in compression (engineering.md §3). The stress functions here take the compressive
 * strain as a positive number and return the compressive stress as a positive number, as the
 * published curves are written; concrete in tension carries nothing in these strength checks,
 * so a tensile (negative) strain gives 0.
 */

/** What a concrete strength was measured on: cylinders (f'c, AASHTO/ACI) or cubes (fck, IS). */
export type StrengthBasis = 'cylinder' | 'cube';

/** A concrete strength with its basis, as the calculation file's `concrete` and `deck` give it. */
export interface ConcreteStrength {
  readonly strengthMpa: number;
  readonly basis: StrengthBasis;
}

/**
 * The strength in MPa when its basis is the one a formula needs, else an EngineInputError at
 * `<path>.basis`: cylinder and cube strengths are never converted silently (engineering.md §1).
 * `path` is the concrete object's JSON path, e.g. `girder.deck`.
 */
export function requireBasis(strength: ConcreteStrength, expected: StrengthBasis, path: string): number {
  if (strength.basis !== expected) {
    throw new EngineInputError(
      joinPath(path, 'basis'),
      `this method needs a ${expected} strength but was given a ${strength.basis} strength; ` +
        'convert it through a rating policy, never silently',
    );
  }
  return strength.strengthMpa;
}

/** AASHTO LRFD 5.6.2.2: extreme-fibre compressive strain at nominal strength [R]. */
export const AASHTO_ULTIMATE_CONCRETE_STRAIN = 0.003;

/**
 * Stress-block depth factor β1 (a = β1 c), AASHTO LRFD 5.6.2.2 [R], SI form:
 * 0.85 for f'c ≤ 28 MPa, else 0.85 − 0.05 (f'c − 28)/7, not below 0.65. Cylinder strength.
 */
export function blockBeta1(fcMpa: number): number {
  return clamp(0.85 - (0.05 * (fcMpa - 28)) / 7, 0.65, 0.85);
}

/**
 * Stress-block intensity factor α1 (stress α1 f'c), AASHTO LRFD 5.6.2.2 as revised in the 2016
 * interim [R], SI form: 0.85 for f'c ≤ 69 MPa, else 0.85 − 0.02 (f'c − 69)/7, not below 0.75.
 * Cylinder strength.
 */
export function blockAlpha1(fcMpa: number): number {
  return clamp(0.85 - (0.02 * (fcMpa - 69)) / 7, 0.75, 0.85);
}

function clamp(value: number, lowest: number, highest: number): number {
  return Math.min(Math.max(value, lowest), highest);
}

/** Cylinder strength and elastic modulus, the inputs of the Todeschini curve. */
export interface TodeschiniConcrete {
  readonly fcMpa: number;
  readonly ecMpa: number;
}

/** Todeschini: the curve's peak stress f''c as a share of f'c [R]. */
export const TODESCHINI_PEAK_STRESS_RATIO = 0.9;

/** Todeschini: the strain ε0 = 1.71 f'c/Ec at which the curve peaks [R]. */
export function todeschiniPeakStrain(concrete: TodeschiniConcrete): number {
  return (1.71 * concrete.fcMpa) / concrete.ecMpa;
}

/**
 * Compressive stress on the Todeschini parabola [R] (engineering.md §3):
 * f = 2 f''c (ε/ε0)/(1 + (ε/ε0)²), f''c = 0.9 f'c, ε0 = 1.71 f'c/Ec; cylinder strength.
 * It peaks at f''c when ε = ε0 and falls beyond. Strength solvers hold the extreme fibre at
 * εcu = 0.003, so strains beyond εcu are not used. Compression positive; 0 in tension.
 */
export function todeschiniStressMpa(compressiveStrain: number, concrete: TodeschiniConcrete): number {
  if (compressiveStrain <= 0) return 0;
  const strainRatio = compressiveStrain / todeschiniPeakStrain(concrete);
  const peakStressMpa = TODESCHINI_PEAK_STRESS_RATIO * concrete.fcMpa;
  return (2 * peakStressMpa * strainRatio) / (1 + strainRatio * strainRatio);
}

/** IS 456 / IS 1343: extreme-fibre compressive strain at the limit state of collapse [R]. */
export const IS_ULTIMATE_CONCRETE_STRAIN = 0.0035;
/** IS 456 / IS 1343: strain at which the design curve's parabola reaches its peak [R]. */
export const IS_PEAK_CONCRETE_STRAIN = 0.002;
/** IS 456 / IS 1343: design peak stress as a share of fck (0.67/1.5, as engineering.md §3 rounds it) [R]. */
export const IS_DESIGN_PEAK_STRESS_RATIO = 0.446;

/**
 * Resultant of the IS design curve over a rectangular compression zone of depth xu [R]:
 * force 0.36 fck b xu acting 0.42 xu below the extreme fibre (IS 456:2000 38.1 and Annex G).
 */
export const IS_RECTANGULAR_ZONE_RESULTANT = Object.freeze({ forceRatio: 0.36, depthRatio: 0.42 });

/**
 * Compressive design stress on the IS 456 / IS 1343 parabolic-rectangular curve [R]:
 * 0.446 fck (2 r − r²) with r = ε/0.002 up to ε = 0.002, then 0.446 fck to εcu = 0.0035
 * (strains beyond εcu are not used). Cube strength fck. Compression positive; 0 in tension.
 */
export function isConcreteStressMpa(compressiveStrain: number, fckMpa: number): number {
  if (compressiveStrain <= 0) return 0;
  const peakStressMpa = IS_DESIGN_PEAK_STRESS_RATIO * fckMpa;
  if (compressiveStrain >= IS_PEAK_CONCRETE_STRAIN) return peakStressMpa;
  const strainRatio = compressiveStrain / IS_PEAK_CONCRETE_STRAIN;
  return peakStressMpa * strainRatio * (2 - strainRatio);
}
