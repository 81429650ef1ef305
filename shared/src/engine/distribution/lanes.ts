/**
 * Design lanes, the design truck's wheel lines and multiple presence (AASHTO LRFD 3.6.1.1.1,
 * 3.6.1.1.2, 3.6.1.3.1 [R] — confirm against the adopted edition). A truck is one lane's load,
 * so a wheel line carries half a lane.
 */

/** 3.6.1.1.1 [R]: width of one design lane. */
export const DESIGN_LANE_WIDTH_MM = 3600;
/** 3.6.1.2.1 [R]: transverse distance between the design truck's wheel lines. */
export const WHEEL_GAUGE_MM = 1800;
/** 3.6.1.3.1 [R]: nearest a wheel centre may come to the edge of its design lane (components other than the overhang). */
export const WHEEL_TO_LANE_EDGE_MM = 600;
/** Lanes carried by one wheel line: a truck is one lane's load on two wheel lines. */
export const WHEEL_LINE_LANES = 0.5;

/**
 * Number of design lanes, floor(roadway width / 3600 mm) (AASHTO LRFD 3.6.1.1.1 [R]); a roadway
 * narrower than one lane still carries one vehicle, so the count is at least 1.
 */
export function numberOfDesignLanes(roadwayWidthMm: number): number {
  return Math.max(1, Math.floor(roadwayWidthMm / DESIGN_LANE_WIDTH_MM));
}

/** Multiple presence factor m for a number of loaded lanes: 1.20, 1.00, 0.85, then 0.65 (AASHTO LRFD Table 3.6.1.1.2-1 [R]). */
export function multiplePresenceFactor(loadedLanes: number): number {
  if (loadedLanes <= 1) return 1.2;
  if (loadedLanes === 2) return 1.0;
  if (loadedLanes === 3) return 0.85;
  return 0.65;
}
