import { DESIGN_LANE_WIDTH_MM, WHEEL_GAUGE_MM, WHEEL_LINE_LANES, WHEEL_TO_LANE_EDGE_MM, multiplePresenceFactor } from './lanes';

/** One loading of the lever rule: where the wheel lines stand and what the girder takes. */
export interface LeverRuleCase {
  readonly loadedLanes: number;
  /** Wheel-line positions from the girder's centreline, positive towards the next girder inboard. */
  readonly wheelOffsetsMm: readonly number[];
  /** Reaction on the girder in lanes (each wheel line is half a lane), before multiple presence. */
  readonly reactionLanes: number;
  readonly multiplePresence: number;
  /** reactionLanes × multiplePresence. */
  readonly factor: number;
}

/**
 * Trucks side by side for the interior lever rule, as close as the lanes allow two trucks:
 * 1200 mm between neighbouring wheel lines (each 600 mm from the shared lane edge; common
 * practice). For three or more trucks this is closer than whole lanes allow, so it errs high.
 */
const INTERIOR_TRUCK_PITCH_MM = WHEEL_GAUGE_MM + 2 * WHEEL_TO_LANE_EDGE_MM;

function truckWheelOffsetsMm(loadedLanes: number, truckPitchMm: number): number[] {
  return Array.from({ length: loadedLanes }, (_, truck) => [truck * truckPitchMm, truck * truckPitchMm + WHEEL_GAUGE_MM]).flat();
}

function leverCase(loadedLanes: number, wheelOffsetsMm: number[], influence: (offsetMm: number) => number): LeverRuleCase {
  const reactionLanes = wheelOffsetsMm.reduce((sum, offsetMm) => sum + WHEEL_LINE_LANES * influence(offsetMm), 0);
  const multiplePresence = multiplePresenceFactor(loadedLanes);
  return { loadedLanes, wheelOffsetsMm, reactionLanes, multiplePresence, factor: reactionLanes * multiplePresence };
}

export interface ExteriorLeverRuleOptions {
  readonly girderSpacingMm: number;
  /** de: exterior girder centreline to the barrier face, positive when the girder is inside the barrier. */
  readonly barrierFaceToGirderMm: number;
  readonly loadedLanes: number;
}

/**
 * Lever rule for an exterior girder (AASHTO LRFD 4.6.2.2.2d, Table 4.6.2.2.2d-1 [R] — confirm
 * against the adopted edition): the deck between the exterior girder and the first interior
 * girder is a simple span hinged at the interior girder, with its overhang. Lanes are laid side by
 * side from the barrier face, each truck's outer wheel 600 mm inside its lane's outer edge, so
 * the first wheel is 600 mm from the barrier face; reaction = Σ ½ (S − u)/S over wheels with
 * u < S, times the multiple presence factor of the loaded lanes.
 */
export function exteriorLeverRule(options: ExteriorLeverRuleOptions): LeverRuleCase {
  const { girderSpacingMm: spacingMm, barrierFaceToGirderMm, loadedLanes } = options;
  const firstWheelMm = WHEEL_TO_LANE_EDGE_MM - barrierFaceToGirderMm;
  const wheelOffsetsMm = truckWheelOffsetsMm(loadedLanes, DESIGN_LANE_WIDTH_MM).map((offsetMm) => firstWheelMm + offsetMm);
  return leverCase(loadedLanes, wheelOffsetsMm, (offsetMm) => Math.max(0, (spacingMm - offsetMm) / spacingMm));
}

export interface InteriorLeverRuleOptions {
  readonly girderSpacingMm: number;
  readonly loadedLanes: number;
}

/**
 * Lever rule for an interior girder (AASHTO LRFD 4.6.2.2.2 [R] — confirm against the adopted
 * edition): the deck hinged over the girders on both sides, so a wheel at u takes
 * ½ (1 − |u|/S) to the girder for |u| < S. The reaction is piecewise linear in where the trucks
 * stand, so its maximum is found exactly by trying every position that puts a wheel over the
 * girder or over a neighbour. Trucks are spaced as INTERIOR_TRUCK_PITCH_MM says.
 */
export function interiorLeverRule(options: InteriorLeverRuleOptions): LeverRuleCase {
  const { girderSpacingMm: spacingMm, loadedLanes } = options;
  const relativeOffsetsMm = truckWheelOffsetsMm(loadedLanes, INTERIOR_TRUCK_PITCH_MM);
  const influence = (offsetMm: number) => Math.max(0, 1 - Math.abs(offsetMm) / spacingMm);
  const shiftsMm = relativeOffsetsMm.flatMap((offsetMm) => [-spacingMm, 0, spacingMm].map((kinkMm) => kinkMm - offsetMm));
  return shiftsMm
    .map((shiftMm) => leverCase(loadedLanes, relativeOffsetsMm.map((offsetMm) => offsetMm + shiftMm), influence))
    .reduce((best, candidate) => (candidate.reactionLanes > best.reactionLanes ? candidate : best));
}
