/**
 * How much of its strength a strand can use where it is not yet fully bonded (engineering.md
 * §5; AASHTO LRFD 5.9.4.3 [R]): from the point where bond begins, the usable stress rises
 * linearly from 0 to fpe over the transfer length lt = 60 db, then linearly from fpe to fps at
 * the development length ld = κ (fps − ⅔ fpe) db (stresses in ksi; SI: MPa ÷ 6.895). A strand whose
 * bond is lost over a length (exposed) still carries fpe there, anchored beyond, and rises from
 * fpe to fps over ld − lt into sound concrete. Re-anchorage of a broken strand over about one
 * transfer length agrees with Kasan & Harries, ASCE J. Bridge Eng. 2011 [S].
 */

/** lt = 60 db, AASHTO LRFD 5.9.4.3.1 [R]. */
export const TRANSFER_LENGTH_DIAMETERS = 60;
/** ksi per MPa, for the development-length formula written in ksi. */
const MPA_PER_KSI = 6.894757;

/** κ of 5.9.4.3.2 [R]: 1.0 for members up to 610 mm deep, 1.6 deeper; 2.0 for debonded strands (5.9.4.3.3). */
export function developmentKappa(memberDepthMm: number, debonded: boolean): number {
  if (debonded) return 2.0;
  return memberDepthMm <= 610 ? 1.0 : 1.6;
}

/** Part of a strand row that is not fully developed at a station. */
export interface DevelopingPart {
  readonly areaMm2: number;
  /** Distance from the nearest point where bond begins (member end, end of debonding, edge of a break); Infinity if none limits it. */
  readonly bondDistanceMm: number;
  /** Distance from the nearest edge of a zone where the strand is exposed (0 inside it); Infinity if none. */
  readonly exposedDistanceMm: number;
  readonly kappa: number;
}

export function transferLengthMm(diameterMm: number): number {
  return TRANSFER_LENGTH_DIAMETERS * diameterMm;
}

/** ld, never shorter than lt (a strand cannot reach fps before it reaches fpe). */
export function developmentLengthMm(kappa: number, fpsMpa: number, fpeMpa: number, diameterMm: number): number {
  const ldMm = (kappa * (fpsMpa - (2 / 3) * fpeMpa) * diameterMm) / MPA_PER_KSI;
  return Math.max(ldMm, transferLengthMm(diameterMm));
}

/**
 * The most stress a developing part may carry, given the stress fps the strand would reach fully
 * bonded. With fps = Infinity (not known yet) it gives only the limits that do not depend on it:
 * within lt, and inside an exposed zone.
 */
export function usableStressLimitMpa(part: DevelopingPart, fpeMpa: number, fpsMpa: number, diameterMm: number): number {
  const lt = transferLengthMm(diameterMm);
  let limit = Number.POSITIVE_INFINITY;
  if (part.bondDistanceMm < lt) limit = (fpeMpa * part.bondDistanceMm) / lt;
  if (part.exposedDistanceMm === 0) limit = Math.min(limit, fpeMpa);
  if (!Number.isFinite(fpsMpa)) return limit;
  if (fpsMpa <= fpeMpa) return Math.min(limit, fpsMpa);
  const ld = developmentLengthMm(part.kappa, fpsMpa, fpeMpa, diameterMm);
  const rise = (distance: number) => fpeMpa + (Math.min(distance, ld - lt) / (ld - lt)) * (fpsMpa - fpeMpa);
  if (part.bondDistanceMm >= lt && part.bondDistanceMm < ld) limit = Math.min(limit, rise(part.bondDistanceMm - lt));
  if (part.exposedDistanceMm < ld - lt) limit = Math.min(limit, rise(part.exposedDistanceMm));
  return limit;
}

/** The share of fpe a part carries as prestress (for service stresses): it reaches fpe at lt. */
export function prestressFraction(part: DevelopingPart, diameterMm: number): number {
  return Math.min(part.bondDistanceMm / transferLengthMm(diameterMm), 1);
}
