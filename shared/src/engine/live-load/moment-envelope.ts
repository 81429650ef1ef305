import { EngineInputError } from '../materials/errors';
import { layOutAxles, momentWithAxleOnStationNmm, type AxleLayout } from './axle-placement';
import type { LoadCase, VehicleDefinition } from './vehicle-schema';

/** The governing load case's moment at one station, per lane. */
export interface StationLiveLoadMoment {
  readonly stationMm: number;
  /** The governing case's id: the one with the largest total. */
  readonly caseId: string;
  /** (1 + IM) on the parts the case applies it to: `(1 + IM)·axleMomentNmm + laneMomentNmm` as a rule. */
  readonly totalMomentNmm: number;
  /** The axles' moment with the case's axle scale, without the dynamic load allowance. */
  readonly axleMomentNmm: number;
  /** The lane load's moment, without the dynamic load allowance. */
  readonly laneMomentNmm: number;
}

export interface LiveLoadMomentEnvelopeOptions {
  readonly spanLengthMm: number;
  /** Stations from the start support's bearing centreline, each within [0, spanLengthMm]. */
  readonly stationsMm: readonly number[];
  readonly vehicle: Pick<VehicleDefinition, 'cases'>;
  /** The dynamic load allowance IM as a fraction (0.33 for AASHTO LRFD 3.6.2.1), from the rating policy. */
  readonly impactFactor: number;
}

interface PreparedCase {
  readonly id: string;
  readonly layout: AxleLayout;
  readonly laneLoadNPerMm: number;
  readonly axleAmplification: number;
  readonly laneAmplification: number;
}

/**
 * Maximum live-load moment per lane at each station of a simple span, exact for moving axles
 * (elementary influence-line statics) with the dynamic load allowance of AASHTO LRFD 3.6.2.1 [R]
 * applied where each load case says (the truck or tandem, not the lane load, for HL-93).
 *
 * Why the search is exact. The influence line for moment at station x is piecewise linear with
 * one peak, at x. Moving the vehicle changes the moment piecewise linearly; the slope falls only
 * when an axle crosses x (its ordinate's slope (L − x)/L becomes −x/L) and rises when an axle
 * enters or leaves the span (slope 0 becomes non-zero, or back, with the sign that makes the kink
 * convex), so every local maximum has an axle on the station. Every axle is tried there, in both
 * directions of travel, with axles beyond a support carrying nothing. A variable gap (the HL-93
 * rear spacing, 3.6.1.2.2) is held at its minimum, which governs on a simple span (see AxleLayout);
 * the tests confirm both against a brute-force search that also steps the gap.
 *
 * The uniform lane load is applied over the whole span, w·x·(L − x)/2: a simple span's moment
 * influence line is never negative, so loading all of it is the worst case.
 *
 * @throws EngineInputError for a span that is not positive, a station off the span or a negative IM.
 */
export function liveLoadMomentEnvelope(options: LiveLoadMomentEnvelopeOptions): StationLiveLoadMoment[] {
  checkEnvelopeOptions(options);
  const { spanLengthMm, stationsMm, impactFactor } = options;
  const cases = options.vehicle.cases.map((loadCase) => prepareCase(loadCase, impactFactor));
  return stationsMm.map((stationMm) => governingMomentAt(cases, spanLengthMm, stationMm));
}

function checkEnvelopeOptions({ spanLengthMm, stationsMm, impactFactor }: LiveLoadMomentEnvelopeOptions): void {
  if (!(Number.isFinite(spanLengthMm) && spanLengthMm > 0)) throw new EngineInputError('spanLengthMm', 'must be > 0');
  if (!(Number.isFinite(impactFactor) && impactFactor >= 0)) throw new EngineInputError('impactFactor', 'must be ≥ 0');
  stationsMm.forEach((stationMm, index) => {
    if (!(stationMm >= 0 && stationMm <= spanLengthMm)) throw new EngineInputError(`stationsMm[${index}]`, `must lie on the span, 0 to ${spanLengthMm} mm`);
  });
}

function prepareCase(loadCase: LoadCase, impactFactor: number): PreparedCase {
  return {
    id: loadCase.id,
    layout: layOutAxles(loadCase),
    // A line load of 1 kN/m is 1 N/mm.
    laneLoadNPerMm: loadCase.laneLoadKnPerM ?? 0,
    axleAmplification: loadCase.dynamicLoadAllowance.axles ? 1 + impactFactor : 1,
    laneAmplification: loadCase.dynamicLoadAllowance.lane ? 1 + impactFactor : 1,
  };
}

function governingMomentAt(cases: readonly PreparedCase[], spanLengthMm: number, stationMm: number): StationLiveLoadMoment {
  let governing: StationLiveLoadMoment | undefined;
  for (const loadCase of cases) {
    const axleMomentNmm = maximumAxleMomentNmm(loadCase.layout, spanLengthMm, stationMm);
    const laneMomentNmm = (loadCase.laneLoadNPerMm * stationMm * (spanLengthMm - stationMm)) / 2;
    const totalMomentNmm = loadCase.axleAmplification * axleMomentNmm + loadCase.laneAmplification * laneMomentNmm;
    if (governing === undefined || totalMomentNmm > governing.totalMomentNmm) {
      governing = { stationMm, caseId: loadCase.id, totalMomentNmm, axleMomentNmm, laneMomentNmm };
    }
  }
  return governing!;
}

/** The largest axle moment at the station over every axle on it, in both directions of travel. */
function maximumAxleMomentNmm(layout: AxleLayout, spanLengthMm: number, stationMm: number): number {
  let best = 0;
  for (let critical = 0; critical < layout.axleLoadsN.length; critical++) {
    best = Math.max(
      best,
      momentWithAxleOnStationNmm(layout, spanLengthMm, stationMm, critical, 1),
      momentWithAxleOnStationNmm(layout, spanLengthMm, stationMm, critical, -1),
    );
  }
  return best;
}
