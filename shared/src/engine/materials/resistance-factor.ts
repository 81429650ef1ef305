/** How a section's flexural resistance factor is graded: prestressed or non-prestressed (reinforced). */
export type FlexureSectionKind = 'prestressed' | 'reinforced';

/** AASHTO LRFD 5.5.4.2 [R]: net tensile strain at or below which a section is compression-controlled. */
export const COMPRESSION_CONTROLLED_STRAIN_LIMIT = 0.002;
/** AASHTO LRFD 5.5.4.2 [R]: net tensile strain at or above which a section is tension-controlled. */
export const TENSION_CONTROLLED_STRAIN_LIMIT = 0.005;

const COMPRESSION_CONTROLLED_FACTOR = 0.75;
const TENSION_CONTROLLED_FACTOR: Readonly<Record<FlexureSectionKind, number>> = Object.freeze({
  prestressed: 1.0,
  reinforced: 0.9,
});

/**
 * Flexural resistance factor φ, AASHTO LRFD 5.5.4.2 [R], in its strain form: 0.75 when the net
 * tensile strain εt at the extreme tension steel is ≤ 0.002, 1.00 (prestressed) or 0.90
 * (reinforced) when εt ≥ 0.005, linear between (equivalent to the 0.65 + 0.15 (dt/c − 1)
 * forms). A compressive εt gives 0.75. No allocation.
 */
export function flexureResistanceFactor(extremeTensionStrain: number, kind: FlexureSectionKind): number {
  const tensionControlledFactor = TENSION_CONTROLLED_FACTOR[kind];
  const transition =
    (extremeTensionStrain - COMPRESSION_CONTROLLED_STRAIN_LIMIT) /
    (TENSION_CONTROLLED_STRAIN_LIMIT - COMPRESSION_CONTROLLED_STRAIN_LIMIT);
  const clampedTransition = Math.min(Math.max(transition, 0), 1);
  return COMPRESSION_CONTROLLED_FACTOR + clampedTransition * (tensionControlledFactor - COMPRESSION_CONTROLLED_FACTOR);
}
