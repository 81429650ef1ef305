import type { LoadCase } from './vehicle-schema';

const NEWTONS_PER_KN = 1000;

/**
 * A load case laid out for the moment searches: loads in N with the axle scale applied, and each
 * axle's distance from the first with a variable gap at its minimum. On a simple span the minimum
 * gap always governs moment: hold any axle on a station and open the gap, and the axles across the
 * gap only move away from the station, where every influence ordinate is smaller (or zero beyond a
 * support). So the moment with each axle on each station falls as the gap opens, and with it both
 * the envelope and the absolute maximum.
 */
export interface AxleLayout {
  readonly axleLoadsN: Float64Array;
  readonly offsetsMm: Float64Array;
}

/** Lays out a load case's axles once per search, so the searches themselves allocate nothing. */
export function layOutAxles(loadCase: Pick<LoadCase, 'axleLoadsKn' | 'axleSpacingsMm' | 'variableSpacing' | 'axleScale'>): AxleLayout {
  const axleCount = loadCase.axleLoadsKn.length;
  const axleLoadsN = new Float64Array(axleCount);
  const offsetsMm = new Float64Array(axleCount);
  for (let axle = 0; axle < axleCount; axle++) {
    axleLoadsN[axle] = loadCase.axleLoadsKn[axle]! * NEWTONS_PER_KN * loadCase.axleScale;
    if (axle > 0) offsetsMm[axle] = offsetsMm[axle - 1]! + spacingUsedMm(loadCase, axle - 1);
  }
  return { axleLoadsN, offsetsMm };
}

function spacingUsedMm(loadCase: Pick<LoadCase, 'axleSpacingsMm' | 'variableSpacing'>, gap: number): number {
  return gap === loadCase.variableSpacing?.gapIndex ? loadCase.variableSpacing.minMm : loadCase.axleSpacingsMm[gap]!;
}

/**
 * Simple-span moment (N·mm) at `stationMm` with axle `criticalAxle` on the station and the vehicle
 * facing `direction` (+1: later axles towards the far support; −1: reversed travel). Axles beyond
 * either support carry nothing. Each axle adds its load times the influence ordinate of a simple
 * span, y (L − x)/L left of the station and x (L − y)/L right of it (elementary statics).
 */
export function momentWithAxleOnStationNmm(
  layout: AxleLayout,
  spanLengthMm: number,
  stationMm: number,
  criticalAxle: number,
  direction: number,
): number {
  const { axleLoadsN, offsetsMm } = layout;
  const criticalOffsetMm = offsetsMm[criticalAxle]!;
  let loadTimesOrdinateTimesSpan = 0;
  for (let axle = 0; axle < axleLoadsN.length; axle++) {
    const positionMm = stationMm + direction * (offsetsMm[axle]! - criticalOffsetMm);
    if (positionMm <= 0 || positionMm >= spanLengthMm) continue;
    const ordinateTimesSpan = positionMm < stationMm ? positionMm * (spanLengthMm - stationMm) : stationMm * (spanLengthMm - positionMm);
    loadTimesOrdinateTimesSpan += axleLoadsN[axle]! * ordinateTimesSpan;
  }
  return loadTimesOrdinateTimesSpan / spanLengthMm;
}
