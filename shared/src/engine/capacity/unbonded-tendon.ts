import type { StrandLayer } from './section-model';

/** The stress-increase coefficient of AASHTO LRFD 5.6.3.1.2 [R], MPa. */
export const UNBONDED_STRESS_INCREASE_MPA = 6200;

/**
 * Stress in an unbonded tendon at nominal strength, AASHTO LRFD 5.6.3.1.2 [R]:
 * fps = fpe + 6200 (dp − c)/le ≤ fpy (MPa, mm), with le the layer's length between anchorages
 * (for a simple span le = li; the article's 2 li/(2 + Ns) for continuous tendons is the
 * caller's to supply).
 */
export function unbondedTendonStressMpa(layer: StrandLayer, neutralAxisDepthMm: number): number {
  const lengthMm = layer.unbondedLengthMm ?? Number.POSITIVE_INFINITY;
  const stress = layer.fpeMpa + (UNBONDED_STRESS_INCREASE_MPA * (layer.dpMm - neutralAxisDepthMm)) / lengthMm;
  return Math.min(stress, layer.material.fpyMpa);
}
