/** Elastic modulus of mild reinforcing steel, engineering.md §3 (AASHTO LRFD 5.4.3.2 [R]). */
export const MILD_STEEL_MODULUS_MPA = 200_000;

export interface MildSteel {
  readonly fyMpa: number;
  /** Elastic modulus; 200 000 MPa when omitted. */
  readonly esMpa?: number;
}

/**
 * Reinforcing-bar stress, elastic–perfectly plastic (engineering.md §3; the AASHTO LRFD 5.6.2.1
 * assumption [R]): Es ε, limited to ±fy, the same in tension and compression. Tension positive.
 * No allocation.
 */
export function mildSteelStressMpa(strain: number, steel: MildSteel): number {
  const elasticStressMpa = (steel.esMpa ?? MILD_STEEL_MODULUS_MPA) * strain;
  return Math.min(Math.max(elasticStressMpa, -steel.fyMpa), steel.fyMpa);
}
