import { ksiToMpa } from '../../units';
import { EngineInputError, joinPath } from './errors';

/**
 * Stress–strain curves for seven-wire prestressing strand (engineering.md §3). Strain and stress
 * are tension positive. Every curve is odd in strain — f(−ε) = −f(ε) — because strand in
 * compression does not occur at a solution of these flexural checks, while a root finder's
 * trial neutral axis can momentarily put a row in compression: an odd, continuous extension
 * keeps the force residual continuous and monotonic there, where a clamp to zero would give it
 * a flat stretch with no sign information.
 */

/** A strand row's material, as the calculation file's `girder.strandRows[]` gives it. */
export interface StrandMaterial {
  readonly epsMpa: number;
  readonly fpuMpa: number;
  readonly fpyMpa: number;
}

/** The strand curves a rating may choose (`options.strandCurve` in calc-file.md). */
export type StrandCurveName = 'power' | 'pci' | 'is1343';

/**
 * Low-relaxation constants of the power formula. [R] recalled, verify against Devalapura &
 * Tadros, PCI Journal 1992.
 */
export const LOW_RELAXATION_POWER_CONSTANTS = Object.freeze({ q: 0.031, k: 1.04, r: 7.36 });

const POWER_Q = LOW_RELAXATION_POWER_CONSTANTS.q;
const POWER_K = LOW_RELAXATION_POWER_CONSTANTS.k;
const POWER_R = LOW_RELAXATION_POWER_CONSTANTS.r;
const POWER_INVERSE_R = 1 / POWER_R;

/**
 * Strand stress by the power formula, form from Devalapura & Tadros, "Stress-strain modeling
 * of 270 ksi low-relaxation prestressing strands", PCI Journal 1992 [S for the form]:
 * f = ε Eps [Q + (1 − Q)/(1 + (Eps ε/(K fpy))^R)^(1/R)] ≤ fpu, with the row's own Eps, fpu
 * and fpy and the low-relaxation constants Q = 0.031, K = 1.04, R = 7.36 [R: recalled, verify].
 * Odd in strain (see the module note). No allocation: safe inside root-finding loops.
 */
export function strandStressPowerMpa(strain: number, material: StrandMaterial): number {
  const elasticStressMpa = material.epsMpa * Math.abs(strain);
  const knee = Math.pow(1 + Math.pow(elasticStressMpa / (POWER_K * material.fpyMpa), POWER_R), POWER_INVERSE_R);
  const stressMpa = Math.min(elasticStressMpa * (POWER_Q + (1 - POWER_Q) / knee), material.fpuMpa);
  return strain < 0 ? -stressMpa : stressMpa;
}

/**
 * One of the PCI Design Handbook strand curves, in the handbook's ksi form:
 * f = modulusKsi · ε up to `elasticLimitStrain`, else f = asymptoteKsi − 0.04/(ε − strainOffset).
 */
export interface PciStrandCurve {
  readonly name: string;
  readonly nominalFpuMpa: number;
  readonly elasticLimitStrain: number;
  readonly asymptoteKsi: number;
  readonly strainOffset: number;
}

/** The modulus both PCI curves assume: 28 500 ksi, which engineering.md §3 states as 196 500 MPa. */
export const PCI_CURVE_MODULUS_KSI = 28_500;
const PCI_CURVE_MODULUS_MPA = 196_500;
const PCI_CURVE_COEFFICIENT_KSI = 0.04;

/** PCI Design Handbook curve for 270 ksi (1860 MPa) strand [R], as engineering.md §3 gives it. */
export const PCI_270_KSI_CURVE: PciStrandCurve = Object.freeze({
  name: 'PCI Design Handbook, 270 ksi strand',
  nominalFpuMpa: 1860,
  elasticLimitStrain: 0.0086,
  asymptoteKsi: 270,
  strainOffset: 0.007,
});

/** PCI Design Handbook curve for 250 ksi (1725 MPa) strand [R], as engineering.md §3 gives it. */
export const PCI_250_KSI_CURVE: PciStrandCurve = Object.freeze({
  name: 'PCI Design Handbook, 250 ksi strand',
  nominalFpuMpa: 1725,
  elasticLimitStrain: 0.0076,
  asymptoteKsi: 250,
  strainOffset: 0.0064,
});

/** engineering.md §3: refuse the PCI curves for strand whose fpu differs by more than 1 %. */
export const PCI_FPU_TOLERANCE = 0.01;
/**
 * How far the row's Eps may stray from the curves' 196 500 MPa. 2 % admits the nominal strand
 * moduli that standards state (195 000 to 200 000 MPa [R]) and shifts elastic-branch stresses
 * by at most 2 %; a modulus further off means the row is not the strand the curve describes.
 */
export const PCI_MODULUS_TOLERANCE = 0.02;

const PCI_CURVES: readonly PciStrandCurve[] = [PCI_270_KSI_CURVE, PCI_250_KSI_CURVE];

/**
 * The PCI Design Handbook curve for a strand row [R], or an EngineInputError when the row is
 * not the strand the curves describe: fpu more than 1 % from 1860 or 1725 MPa
 * (`PCI_FPU_TOLERANCE`, engineering.md §3), or Eps more than 2 % from 196 500 MPa
 * (`PCI_MODULUS_TOLERANCE`). `rowPath` is the row's JSON path, e.g. `girder.strandRows[2]`.
 * Returns a shared frozen object: no allocation.
 */
export function pciStrandCurveFor(fpuMpa: number, epsMpa: number, rowPath = ''): PciStrandCurve {
  const curve = pciCurveOfGrade(fpuMpa);
  if (curve === undefined) {
    throw new EngineInputError(
      joinPath(rowPath, 'fpuMpa'),
      `the PCI strand curves cover only 1860 or 1725 MPa strand (±1 %), not ${fpuMpa} MPa; use the power formula`,
    );
  }
  if (relativeDifference(epsMpa, PCI_CURVE_MODULUS_MPA) > PCI_MODULUS_TOLERANCE) {
    throw new EngineInputError(
      joinPath(rowPath, 'epsMpa'),
      `the PCI strand curves assume Eps = 196 500 MPa (±2 %), not ${epsMpa} MPa; use the power formula`,
    );
  }
  return curve;
}

/** A plain loop rather than `find`, so the hot path creates no closure. */
function pciCurveOfGrade(fpuMpa: number): PciStrandCurve | undefined {
  for (const curve of PCI_CURVES) {
    if (relativeDifference(fpuMpa, curve.nominalFpuMpa) <= PCI_FPU_TOLERANCE) return curve;
  }
  return undefined;
}

function relativeDifference(value: number, reference: number): number {
  return Math.abs(value - reference) / reference;
}

/**
 * Strand stress on a PCI Design Handbook curve [R] (engineering.md §3), computed in ksi as the
 * handbook writes it and returned in MPa. The 270 ksi curve as published steps down by 0.1 ksi
 * where its branches meet (28 500 × 0.0086 = 245.1 ksi, 270 − 0.04/0.0016 = 245.0 ksi): kept
 * as published, so just past ε = 0.0086 the stress is 0.7 MPa below the value at it.
 * Odd in strain (see the module note). No allocation.
 */
export function pciStrandStressMpa(curve: PciStrandCurve, strain: number): number {
  const magnitude = Math.abs(strain);
  const stressKsi =
    magnitude <= curve.elasticLimitStrain
      ? PCI_CURVE_MODULUS_KSI * magnitude
      : curve.asymptoteKsi - PCI_CURVE_COEFFICIENT_KSI / (magnitude - curve.strainOffset);
  const stressMpa = ksiToMpa(stressKsi);
  return strain < 0 ? -stressMpa : stressMpa;
}

/** IS 1343 design strength of prestressing steel: 0.87 fp, i.e. fp/γm with γm = 1.15 [R]. */
export const IS1343_STRAND_DESIGN_STRENGTH_RATIO = 0.87;
/** Inelastic strain at which the IS 1343 design curve reaches 0.87 fp [R]. */
export const IS1343_STRAND_FINAL_INELASTIC_STRAIN = 0.005;

/**
 * The IS 1343 design stress–strain curve for stress-relieved wire and strand, IS 1343:1980
 * (first revision) Fig. 5, as points (stress ÷ 0.87 fp, inelastic strain). The total strain of
 * a point is stressRatio · 0.87 fp/Es + inelasticStrain. The curve is linear up to
 * 0.8 × 0.87 fp and reaches 0.87 fp at an inelastic strain of 0.005; the intermediate points
 * are a digitisation of the figure's curve. Every point: from memory — verify against the
 * figure of the edition the owner adopts (its figure number may differ).
 */
export const IS1343_STRAND_CURVE_POINTS: readonly { readonly stressRatio: number; readonly inelasticStrain: number }[] =
  Object.freeze([
    { stressRatio: 0, inelasticStrain: 0 },
    { stressRatio: 0.8, inelasticStrain: 0 },
    { stressRatio: 0.85, inelasticStrain: 0.0005 },
    { stressRatio: 0.9, inelasticStrain: 0.001 },
    { stressRatio: 0.95, inelasticStrain: 0.002 },
    { stressRatio: 1, inelasticStrain: IS1343_STRAND_FINAL_INELASTIC_STRAIN },
  ]);

/**
 * Strand stress on the IS 1343 design curve (IS 1343:1980 Fig. 5 [R], points from memory —
 * verify; see `IS1343_STRAND_CURVE_POINTS`): fp is the row's fpu and Es its Eps; linear between
 * the digitised points, as a read figure is, and constant at 0.87 fp beyond the last.
 * Odd in strain (see the module note). No allocation.
 */
export function strandStressIs1343Mpa(strain: number, material: StrandMaterial): number {
  const designStrengthMpa = IS1343_STRAND_DESIGN_STRENGTH_RATIO * material.fpuMpa;
  const magnitude = Math.abs(strain);
  let stressMpa = designStrengthMpa;
  let previousStrain = 0;
  let previousStressMpa = 0;
  for (let i = 1; i < IS1343_STRAND_CURVE_POINTS.length; i++) {
    const point = IS1343_STRAND_CURVE_POINTS[i]!;
    const pointStressMpa = point.stressRatio * designStrengthMpa;
    const pointStrain = pointStressMpa / material.epsMpa + point.inelasticStrain;
    if (magnitude <= pointStrain) {
      const fraction = (magnitude - previousStrain) / (pointStrain - previousStrain);
      stressMpa = previousStressMpa + fraction * (pointStressMpa - previousStressMpa);
      break;
    }
    previousStrain = pointStrain;
    previousStressMpa = pointStressMpa;
  }
  return strain < 0 ? -stressMpa : stressMpa;
}

/**
 * Strand stress on the curve a rating chose (`options.strandCurve`): the power formula, the PCI
 * Design Handbook curve for the row's grade (throws EngineInputError for other strand — check
 * rows with `pciStrandCurveFor` before solving), or the IS 1343 design curve. No allocation.
 */
export function strandStressFor(curve: StrandCurveName, strain: number, row: StrandMaterial): number {
  switch (curve) {
    case 'power':
      return strandStressPowerMpa(strain, row);
    case 'pci':
      return pciStrandStressMpa(pciStrandCurveFor(row.fpuMpa, row.epsMpa), strain);
    case 'is1343':
      return strandStressIs1343Mpa(strain, row);
  }
}
