import type { Girder } from '../calc-file/girder';
import type { Span } from '../calc-file/rate-file';
import type { RatingPolicy } from '../policy/rating-policy';
import { flatTopWidthMm, sectionProperties, shapeToPolygons } from '../section';
import { pointLoadMomentNmm, uniformLoadMomentNmm } from './simple-span';

/** kN/m³ × mm² = 1e3 N / 1e9 mm³ × mm² = 1e−6 N/mm. */
const N_PER_MM_PER_KN_M3_MM2 = 1e-6;

/** The dead loads one girder carries (engineering.md §6), each with what it is made of for the checker. */
export interface GirderDeadLoads {
  /** DC1 on the non-composite girder: self weight, deck and haunch, integral wearing surface. */
  readonly dc1UniformNPerMm: number;
  readonly dc1Parts: Readonly<Record<string, number>>;
  /** Diaphragms on this girder, DC1 point loads. */
  readonly dc1PointLoads: readonly { readonly atMm: number; readonly loadN: number }[];
  /** DC2 on the composite section: the girder's share of the barriers. */
  readonly dc2UniformNPerMm: number;
  /** DW on the composite section: the wearing surface on the tributary width. */
  readonly dwUniformNPerMm: number;
  readonly tributaryWidthMm: number;
}

/** The deck width a girder carries: half the spacing each side, or to the deck edge for an exterior girder. */
export function tributaryWidthMm(span: Span): number {
  return span.position === 'interior' ? span.girderSpacingMm : span.girderSpacingMm / 2 + span.overhangMm;
}

/** The wearing surface's width over this girder: to the barrier face on an exterior girder. */
function wearingSurfaceWidthMm(span: Span): number {
  if (span.position === 'interior') return span.girderSpacingMm;
  return Math.max(span.girderSpacingMm / 2 + (span.barrierFaceToGirderMm ?? 0), 0);
}

function barrierShareNPerMm(span: Span, policy: RatingPolicy): number {
  const totalNPerMm = span.barriers.reduce((sum, barrier) => sum + barrier.loadKnM, 0); // kN/m = N/mm
  if (policy.deadLoad.barriers === 'equal') return totalNPerMm / span.girderCount;
  return span.position === 'exterior' ? totalNPerMm / 2 : 0;
}

/**
 * Each girder's dead loads per engineering.md §6: the girder's self weight from its original
 * gross area (damage does not lighten it), the deck of structural thickness on the tributary
 * width and the haunch on the girder's top width, diaphragms shared as point loads, barriers per
 * the policy (shared equally, or to the exterior girders), and the wearing surface on the
 * tributary width (DW, or DC1 when it is cast integral with the deck).
 */
export function girderDeadLoads(girder: Girder, span: Span, policy: RatingPolicy): GirderDeadLoads {
  const girderUnitWeight = girder.concrete.unitWeightKnM3 ?? policy.deadLoad.girderUnitWeightKnM3;
  const deck = girder.deck!;
  const deckUnitWeight = deck.unitWeightKnM3 ?? girderUnitWeight;
  const tributary = tributaryWidthMm(span);
  const grossAreaMm2 = sectionProperties(shapeToPolygons(girder.section)).areaMm2;

  const parts: Record<string, number> = {
    girder: grossAreaMm2 * girderUnitWeight * N_PER_MM_PER_KN_M3_MM2,
    deck: tributary * deck.thicknessMm * deckUnitWeight * N_PER_MM_PER_KN_M3_MM2,
    haunch: (flatTopWidthMm(girder.section) ?? 0) * deck.haunchMm * deckUnitWeight * N_PER_MM_PER_KN_M3_MM2,
  };
  let dwUniformNPerMm = 0;
  const surface = span.wearingSurface;
  if (surface) {
    const unitWeight = surface.unitWeightKnM3 ?? policy.deadLoad.wearingSurfaceUnitWeightKnM3;
    const load = wearingSurfaceWidthMm(span) * surface.thicknessMm * unitWeight * N_PER_MM_PER_KN_M3_MM2;
    if (surface.kind === 'integral') parts['integralWearingSurface'] = load;
    else dwUniformNPerMm = load;
  }
  return {
    dc1UniformNPerMm: Object.values(parts).reduce((sum, value) => sum + value, 0),
    dc1Parts: parts,
    dc1PointLoads: span.diaphragms.map((diaphragm) => ({ atMm: diaphragm.xM * 1000, loadN: diaphragm.loadKn * 1000 })),
    dc2UniformNPerMm: barrierShareNPerMm(span, policy),
    dwUniformNPerMm,
    tributaryWidthMm: tributary,
  };
}

export interface DeadLoadMoments {
  readonly dc1Nmm: number;
  readonly dc2Nmm: number;
  readonly dwNmm: number;
}

export function deadLoadMomentsAt(loads: GirderDeadLoads, spanLengthMm: number, xMm: number): DeadLoadMoments {
  const diaphragms = loads.dc1PointLoads.reduce((sum, point) => sum + pointLoadMomentNmm(point.loadN, point.atMm, spanLengthMm, xMm), 0);
  return {
    dc1Nmm: uniformLoadMomentNmm(loads.dc1UniformNPerMm, spanLengthMm, xMm) + diaphragms,
    dc2Nmm: uniformLoadMomentNmm(loads.dc2UniformNPerMm, spanLengthMm, xMm),
    dwNmm: uniformLoadMomentNmm(loads.dwUniformNPerMm, spanLengthMm, xMm),
  };
}
