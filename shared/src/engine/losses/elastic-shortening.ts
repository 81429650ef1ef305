/** The girder's gross (non-composite) section, which carries the prestress at transfer. */
export interface GrossSection {
  readonly areaMm2: number;
  readonly centroidFromSoffitMm: number;
  readonly inertiaMm4: number;
}

/** One strand row at jacking: its height above the soffit, total strand area and jacking stress. */
export interface JackedRow {
  readonly yMm: number;
  readonly areaMm2: number;
  readonly jackingStressMpa: number;
}

export interface ElasticShorteningOptions {
  readonly rows: readonly JackedRow[];
  readonly section: GrossSection;
  readonly epMpa: number;
  readonly eciMpa: number;
  /** Girder self-weight moment at the section, sagging positive. */
  readonly selfWeightMomentNmm: number;
}

/** ΔfpES and the values a checker signs on the way to it. */
export interface ElasticShortening {
  readonly lossMpa: number;
  /** Ep/Eci. */
  readonly modularRatio: number;
  /** fcgp: the concrete stress at the centroid of the strand at transfer, compression positive as the article writes it. */
  readonly fcgpCompressionMpa: number;
  readonly steelAreaMm2: number;
  readonly steelCentroidFromSoffitMm: number;
  /** Distance of the steel centroid below the gross centroid. */
  readonly steelEccentricityMm: number;
  readonly jackingForceN: number;
  /** Σ Aps (fpj − ΔfpES): the force the concrete receives at transfer. */
  readonly forceAfterTransferN: number;
}

/**
 * Elastic shortening of a pretensioned member at transfer, AASHTO LRFD 5.9.3.2.3a [R]:
 * ΔfpES = (Ep/Eci) fcgp, with fcgp the gross-section concrete stress at the centroid of the
 * strand from the force after transfer and the self-weight moment:
 *
 *   fcgp = Σ Ai (fpj,i − ΔfpES) (1/Ag + ei e/Ig) − Mg e/Ig
 *
 * (ei each row's eccentricity, e that of the steel centroid, both below the centroid). The
 * force after transfer depends on ΔfpES, and ΔfpES appears linearly. So the pair is solved in
 * closed form, not by iteration:
 *
 *   ΔfpES = n (Σ Ai fpj,i ki − Mg e/Ig)/(1 + n Σ Ai ki),  ki = 1/Ag + ei e/Ig,  n = Ep/Eci.
 *
 * With one jacking stress for all rows, this is the closed form the commentary C5.9.3.2.3a gives [R].
 * Every row takes the same ΔfpES: the article computes it for the whole group at its centroid.
 */
export function elasticShortening(options: ElasticShorteningOptions): ElasticShortening {
  const { rows, section } = options;
  const steelAreaMm2 = sum(rows.map((row) => row.areaMm2));
  const steelCentroidFromSoffitMm = sum(rows.map((row) => row.areaMm2 * row.yMm)) / steelAreaMm2;
  const steelEccentricityMm = section.centroidFromSoffitMm - steelCentroidFromSoffitMm;
  // Concrete stress at the steel centroid per newton of force in a row at height yMm.
  const stressPerNewton = (yMm: number) =>
    1 / section.areaMm2 + ((section.centroidFromSoffitMm - yMm) * steelEccentricityMm) / section.inertiaMm4;

  const jackingTermMpa = sum(rows.map((row) => row.areaMm2 * row.jackingStressMpa * stressPerNewton(row.yMm)));
  const stressPerMpaOfLoss = sum(rows.map((row) => row.areaMm2 * stressPerNewton(row.yMm)));
  const selfWeightTermMpa = (options.selfWeightMomentNmm * steelEccentricityMm) / section.inertiaMm4;
  const modularRatio = options.epMpa / options.eciMpa;

  const lossMpa = (modularRatio * (jackingTermMpa - selfWeightTermMpa)) / (1 + modularRatio * stressPerMpaOfLoss);
  const jackingForceN = sum(rows.map((row) => row.areaMm2 * row.jackingStressMpa));
  return {
    lossMpa,
    modularRatio,
    fcgpCompressionMpa: jackingTermMpa - lossMpa * stressPerMpaOfLoss - selfWeightTermMpa,
    steelAreaMm2,
    steelCentroidFromSoffitMm,
    steelEccentricityMm,
    jackingForceN,
    forceAfterTransferN: jackingForceN - lossMpa * steelAreaMm2,
  };
}

function sum(values: readonly number[]): number {
  return values.reduce((total, value) => total + value, 0);
}
