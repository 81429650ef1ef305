import type { BoxSection, RectangleSection, VoidedSlabSection } from '../section';

/** Odd terms n = 1 … 19 of the rectangle series: later terms change β by less than one part in 10⁶. */
const RECTANGLE_SERIES_TERMS = 10;

/**
 * St Venant torsion constant of a solid rectangle, J = β b t³ with t the shorter side and
 * β = ⅓ [1 − (192/π⁵)(t/b) Σ_{n odd} tanh(nπb/2t)/n⁵] (the series solution of elastic torsion,
 * Timoshenko & Goodier, Theory of Elasticity, torsion of a rectangular bar [R]).
 */
export function rectangleTorsionConstantMm4(widthMm: number, depthMm: number): number {
  const longMm = Math.max(widthMm, depthMm);
  const shortMm = Math.min(widthMm, depthMm);
  let series = 0;
  for (let term = 0; term < RECTANGLE_SERIES_TERMS; term++) {
    const n = 2 * term + 1;
    series += Math.tanh((n * Math.PI * longMm) / (2 * shortMm)) / n ** 5;
  }
  const beta = (1 - (192 / Math.PI ** 5) * (shortMm / longMm) * series) / 3;
  return beta * longMm * shortMm ** 3;
}

/**
 * Torsion constant of a box as a thin-walled closed section, J = 4 A₀² / Σ(s/t) (Bredt's formula;
 * AASHTO LRFD C4.6.2.2.1 gives the same for thin-walled closed shapes [R]): A₀ and the wall
 * lengths s on the centrelines of the top and bottom slabs and the two webs; fillets ignored,
 * which understates J slightly and so errs towards a larger distribution factor.
 */
export function boxTorsionConstantMm4(box: BoxSection): number {
  const webMm = (box.widthMm - box.voidWidthMm) / 2;
  const bottomMm = box.voidBottomMm;
  const topMm = box.depthMm - box.voidBottomMm - box.voidDepthMm;
  const centrelineWidthMm = box.widthMm - webMm;
  const centrelineHeightMm = box.depthMm - (topMm + bottomMm) / 2;
  const enclosedAreaMm2 = centrelineWidthMm * centrelineHeightMm;
  const lengthOverThickness = centrelineWidthMm / topMm + centrelineWidthMm / bottomMm + (2 * centrelineHeightMm) / webMm;
  return (4 * enclosedAreaMm2 ** 2) / lengthOverThickness;
}

/**
 * Torsion constant of a voided slab approximated as the solid rectangle's J (series formula)
 * less the polar moment π D⁴/32 of each void (common practice, no source): it ignores how the
 * voids crowd the shear flow, so a J from a finer analysis, given as `torsionConstantMm4`, wins.
 */
export function voidedSlabTorsionConstantMm4(slab: VoidedSlabSection): number {
  const voidPolarMomentMm4 = (Math.PI * slab.voidDiameterMm ** 4) / 32;
  return rectangleTorsionConstantMm4(slab.widthMm, slab.depthMm) - slab.voidCount * voidPolarMomentMm4;
}

/** The sections laid side by side as adjacent beams (Table 4.6.2.2.2b-1 types f, g). */
export type AdjacentBeamSection = RectangleSection | BoxSection | VoidedSlabSection;

/** St Venant torsion constant J of an adjacent-beam section, by the approximation its shape calls for (see each function). */
export function torsionConstantMm4(section: AdjacentBeamSection): number {
  switch (section.shape) {
    case 'rectangle':
      return rectangleTorsionConstantMm4(section.widthMm, section.depthMm);
    case 'box':
      return boxTorsionConstantMm4(section);
    case 'voided-slab':
      return voidedSlabTorsionConstantMm4(section);
  }
}
