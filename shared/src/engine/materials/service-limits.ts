/**
 * Coefficients of √f'c (MPa) for the Service III allowable tension, engineering.md §7 [R]:
 * 0.19 √f'c ksi = 0.4989 √f'c MPa, and 0.0948 √f'c ksi = 0.249 √f'c MPa for severe corrosive
 * conditions. Defaults only: the rating policy stores the ones it applies.
 */
export const SERVICE_TENSION_COEFFICIENTS = Object.freeze({ normal: 0.4989, severeCorrosion: 0.249 });

/** The cap of 0.6 ksi (4.14 MPa) that some editions put on the allowable tension [R]. */
export const SERVICE_TENSION_CAP_MPA = 4.14;

/**
 * Allowable tension at the bottom fibre for LRFR Service III (AASHTO MBE 6A.4.2 with the LRFD
 * 5.9.2.3.2b limits, engineering.md §7 [R]): coefficient · √f'c in MPa, f'c the cylinder
 * strength, limited to `capMpa` in editions that cap it (no cap when omitted). Tension positive.
 */
export function serviceTensionLimitMpa(
  fcMpa: number,
  coefficient: number = SERVICE_TENSION_COEFFICIENTS.normal,
  capMpa: number = Number.POSITIVE_INFINITY,
): number {
  return Math.min(coefficient * Math.sqrt(fcMpa), capMpa);
}
