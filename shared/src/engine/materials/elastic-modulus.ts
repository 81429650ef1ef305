import { STANDARD_GRAVITY_M_PER_S2, knPerM3ToKcf, ksiToMpa, mpaToKsi } from '../../units';
import type { StrengthBasis } from './concrete';

/** The elastic-modulus formulas a rating policy may choose (engineering.md §2). */
export type ElasticModulusFormula = 'aashto-7' | 'aashto-8' | 'aci-318' | 'is-456';

/** The strength basis each formula takes; check the input with `requireBasis` before calling. */
export const ELASTIC_MODULUS_BASIS: Readonly<Record<ElasticModulusFormula, StrengthBasis>> = Object.freeze({
  'aashto-7': 'cylinder',
  'aashto-8': 'cylinder',
  'aci-318': 'cylinder',
  'is-456': 'cube',
});

export interface ElasticModulusInput {
  /** f'c (cylinder) or fck (cube), whichever `ELASTIC_MODULUS_BASIS` names for the formula. */
  readonly fcMpa: number;
  /** Unit weight of the concrete; only the AASHTO forms use it. */
  readonly unitWeightKnM3: number;
  /** AASHTO aggregate correction factor K1; 1.0 unless tests on the owner's concrete set it [R]. */
  readonly k1?: number;
}

/**
 * Concrete elastic modulus Ec in MPa, by the formula the policy names (all [R], recalled):
 * - 'aashto-7': AASHTO LRFD 5.4.2.4, 7th edition, 0.043 K1 wc^1.5 √f'c with wc in kg/m³
 *   (the unit weight divided by g = 9.80665 m/s²);
 * - 'aashto-8': AASHTO LRFD 5.4.2.4, 8th edition, 120 000 K1 wc² f'c^0.33 in ksi with wc in
 *   kcf and f'c in ksi, converted here;
 * - 'aci-318': ACI 318, 4700 √f'c;
 * - 'is-456': IS 456:2000 6.2.3.1, 5000 √fck on the cube strength.
 * The AASHTO forms take wc as the unit weight of the concrete itself, which can be below the
 * dead-load unit weight that includes reinforcement.
 */
export function elasticModulusMpa(formula: ElasticModulusFormula, input: ElasticModulusInput): number {
  const k1 = input.k1 ?? 1;
  switch (formula) {
    case 'aashto-7': {
      const densityKgM3 = (input.unitWeightKnM3 * 1000) / STANDARD_GRAVITY_M_PER_S2;
      return 0.043 * k1 * densityKgM3 ** 1.5 * Math.sqrt(input.fcMpa);
    }
    case 'aashto-8': {
      const unitWeightKcf = knPerM3ToKcf(input.unitWeightKnM3);
      return ksiToMpa(120_000 * k1 * unitWeightKcf ** 2 * mpaToKsi(input.fcMpa) ** 0.33);
    }
    case 'aci-318':
      return 4700 * Math.sqrt(input.fcMpa);
    case 'is-456':
      return 5000 * Math.sqrt(input.fcMpa);
  }
}
