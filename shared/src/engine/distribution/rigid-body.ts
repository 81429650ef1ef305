import { DESIGN_LANE_WIDTH_MM, WHEEL_GAUGE_MM, WHEEL_TO_LANE_EDGE_MM, multiplePresenceFactor } from './lanes';

/** One loading of the rigid-body check. */
export interface RigidBodyCase {
  readonly loadedLanes: number;
  /** e: each truck's distance from the centroid of the girders, positive towards the exterior girder. */
  readonly truckEccentricitiesMm: readonly number[];
  /** R = NL/Nb + Xext Σe / Σx², in lanes, before multiple presence. */
  readonly reactionLanes: number;
  readonly multiplePresence: number;
  readonly factor: number;
}

export interface RigidBodyOptions {
  readonly girderSpacingMm: number;
  readonly girderCount: number;
  /** de: exterior girder centreline to the barrier face, positive when the girder is inside the barrier. */
  readonly barrierFaceToGirderMm: number;
  readonly loadedLanes: number;
}

/** Barrier face to the centre of the first truck: its outer wheel 600 mm in, plus half the gauge. */
const BARRIER_TO_FIRST_TRUCK_MM = WHEEL_TO_LANE_EDGE_MM + WHEEL_GAUGE_MM / 2;

/**
 * Exterior girder by the rigid-body method of AASHTO LRFD 4.6.2.2.2d (Eq. C4.6.2.2.2d-1 [R] —
 * confirm against the adopted edition), required as a lower bound where diaphragms or
 * cross-frames make the cross-section deflect and rotate as a rigid body:
 * R = NL/Nb + Xext Σe/Σx², times the multiple presence factor. Equally spaced girders; lanes
 * laid side by side from the barrier face with each truck 600 mm inside its lane's outer
 * edge, the layout that puts the most load on the exterior girder.
 */
export function exteriorRigidBody(options: RigidBodyOptions): RigidBodyCase {
  const { girderSpacingMm: spacingMm, girderCount, barrierFaceToGirderMm, loadedLanes } = options;
  const exteriorOffsetMm = ((girderCount - 1) / 2) * spacingMm;
  // Σx² of Nb equally spaced girders about their centroid: S² Nb (Nb² − 1)/12.
  const sumSquaresMm2 = (spacingMm ** 2 * girderCount * (girderCount ** 2 - 1)) / 12;
  const firstTruckMm = exteriorOffsetMm + barrierFaceToGirderMm - BARRIER_TO_FIRST_TRUCK_MM;
  const truckEccentricitiesMm = Array.from({ length: loadedLanes }, (_, lane) => firstTruckMm - lane * DESIGN_LANE_WIDTH_MM);
  const sumEccentricityMm = truckEccentricitiesMm.reduce((sum, eMm) => sum + eMm, 0);
  const reactionLanes = loadedLanes / girderCount + (exteriorOffsetMm * sumEccentricityMm) / sumSquaresMm2;
  const multiplePresence = multiplePresenceFactor(loadedLanes);
  return { loadedLanes, truckEccentricitiesMm, reactionLanes, multiplePresence, factor: reactionLanes * multiplePresence };
}
