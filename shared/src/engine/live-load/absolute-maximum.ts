import { EngineInputError } from '../materials/errors';
import { layOutAxles, momentWithAxleOnStationNmm, type AxleLayout } from './axle-placement';
import type { LoadCase } from './vehicle-schema';

/** The largest moment anywhere on the span under one load case's axles, and where it occurs. */
export interface AbsoluteMaximumMoment {
  /** Axles only, with the case's axle scale; no dynamic load allowance, no lane load. */
  readonly momentNmm: number;
  /** Where the critical axle stands, from the start support. */
  readonly stationMm: number;
  /** The critical axle's index in the case's axle list. */
  readonly criticalAxle: number;
}

export interface AbsoluteMaximumMomentOptions {
  readonly spanLengthMm: number;
  readonly loadCase: Pick<LoadCase, 'axleLoadsKn' | 'axleSpacingsMm' | 'variableSpacing' | 'axleScale'>;
}

/**
 * Absolute maximum moment of a simple span under moving axles, by the classic rule behind the
 * truck moment tables of the AASHTO Standard Specifications (elementary statics): the moment under
 * an axle is greatest when midspan bisects the distance between that axle and the resultant of the
 * axles on the span. Every axle is tried with every run of consecutive axles that might be on the
 * span, and each placement's moment is evaluated with the axles actually on the span, so a run
 * that does not fit merely gives a smaller, still real, moment. This is exact: with the axles on
 * the span fixed, the moment under an axle is a concave parabola in the vehicle's position, and an
 * axle entering or leaving the span only makes a convex kink. A variable gap is held at its
 * minimum, which governs on a simple span (see AxleLayout).
 *
 * @throws EngineInputError for a span that is not positive.
 */
export function absoluteMaximumMoment({ spanLengthMm, loadCase }: AbsoluteMaximumMomentOptions): AbsoluteMaximumMoment {
  if (!(Number.isFinite(spanLengthMm) && spanLengthMm > 0)) throw new EngineInputError('spanLengthMm', 'must be > 0');
  const layout = layOutAxles(loadCase);
  let best: AbsoluteMaximumMoment = { momentNmm: 0, stationMm: spanLengthMm / 2, criticalAxle: 0 };
  const axleCount = layout.axleLoadsN.length;
  for (let critical = 0; critical < axleCount; critical++) {
    for (let first = 0; first <= critical; first++) {
      for (let last = critical; last < axleCount; last++) {
        const stationMm = bisectingStationMm(layout, spanLengthMm, critical, first, last);
        if (stationMm <= 0 || stationMm >= spanLengthMm) continue;
        const momentNmm = momentWithAxleOnStationNmm(layout, spanLengthMm, stationMm, critical, 1);
        if (momentNmm > best.momentNmm) best = { momentNmm, stationMm, criticalAxle: critical };
      }
    }
  }
  return best;
}

/** Where the critical axle stands when midspan bisects it and the resultant of axles first…last. */
function bisectingStationMm(layout: AxleLayout, spanLengthMm: number, critical: number, first: number, last: number): number {
  let resultantN = 0;
  let resultantTimesOffsetNmm = 0;
  for (let axle = first; axle <= last; axle++) {
    resultantN += layout.axleLoadsN[axle]!;
    resultantTimesOffsetNmm += layout.axleLoadsN[axle]! * (layout.offsetsMm[axle]! - layout.offsetsMm[critical]!);
  }
  return (spanLengthMm - resultantTimesOffsetNmm / resultantN) / 2;
}
