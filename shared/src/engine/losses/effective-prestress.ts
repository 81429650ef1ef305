import { EngineInputError } from '../materials';
import { checkInput, jackingStressesMpa, resolveEciMpa, type EffectivePrestressInput } from './check-input';
import { elasticShortening, type ElasticShortening } from './elastic-shortening';
import { approximateLongTermLoss, type LongTermLoss } from './long-term';

/** One row's losses and effective prestress. All are strand stresses in MPa, the losses as positive reductions. */
export interface RowEffectivePrestress {
  readonly rowId: string;
  readonly jackingStressMpa: number;
  readonly elasticShorteningMpa: number;
  readonly longTermMpa: number;
  readonly longTermParts: {
    /** 10.0 (fpi Aps/Ag) γh γst. */
    readonly prestressTermMpa: number;
    /** 83 γh γst. */
    readonly constantTermMpa: number;
    /** ΔfpR. */
    readonly relaxationMpa: number;
  };
  readonly totalLossMpa: number;
  /** fpe = fpj − ΔfpES − ΔfpLT, tension in the strand positive. */
  readonly fpeMpa: number;
}

/** The intermediate values a checker signs. */
export interface LossChecks {
  /** γh. */
  readonly humidityFactor: number;
  /** γst (SI form). */
  readonly strengthFactor: number;
  readonly eciMpa: number;
  readonly epMpa: number;
  /** Ep/Eci. */
  readonly modularRatio: number;
  /** fcgp, compression positive as the article writes it (the one stress here that is not tension-positive). */
  readonly fcgpCompressionMpa: number;
  readonly steelAreaMm2: number;
  readonly steelCentroidFromSoffitMm: number;
  readonly steelEccentricityMm: number;
  readonly jackingForceN: number;
  readonly forceAfterTransferN: number;
  readonly selfWeightMomentNmm: number;
  /** fpi Aps/Ag with fpi = fpj: the total jacking force over the gross area. */
  readonly fpiApsOverAgMpa: number;
}

export interface EffectivePrestressResult {
  readonly method: 'aashto-approximate';
  readonly rows: readonly RowEffectivePrestress[];
  readonly checks: LossChecks;
}

/**
 * Effective prestress of a pretensioned girder after all losses, per strand row: elastic
 * shortening by AASHTO LRFD 5.9.3.2.3a [R], solved in closed form (see `elasticShortening`),
 * plus the approximate long-term loss of AASHTO LRFD 5.9.3.3 [R] in its SI form (see
 * `approximateLongTermLoss`). Every row takes the same ΔfpES and ΔfpLT, because the approximate
 * method gives one loss for the whole strand group at its centroid. Rows keep their own jacking
 * stress, so fpe = fpj − ΔfpES − ΔfpLT is reported per row.
 * fpi, the stress just before transfer in the article, is taken as the jacking stress fpj:
 * the losses before transfer (anchorage seating, bed relaxation) are not estimated here.
 * Refuses, with EngineInputError at a `losses.` path, out-of-range input, tension at the steel
 * centroid at transfer, and any row whose losses leave fpe ≤ 0.
 */
export function effectivePrestress(input: EffectivePrestressInput): EffectivePrestressResult {
  checkInput(input);
  const jackingMpa = jackingStressesMpa(input);
  const eciMpa = resolveEciMpa(input);
  const epMpa = input.rows[0]!.epsMpa;
  const shortening = elasticShortening({
    rows: input.rows.map((row, index) => ({ yMm: row.yMm, areaMm2: row.areaMm2, jackingStressMpa: jackingMpa[index]! })),
    section: input.section,
    epMpa,
    eciMpa,
    selfWeightMomentNmm: input.selfWeightMomentNmm,
  });
  refuseTensionAtSteel(shortening);

  const fpiApsOverAgMpa = shortening.jackingForceN / input.section.areaMm2;
  const longTerm = approximateLongTermLoss({
    fpiApsOverAgMpa,
    relativeHumidityPct: input.relativeHumidityPct,
    fciMpa: input.fciMpa,
    strandType: input.strandType,
  });
  const rows = input.rows.map((row, index) => rowResult(row.rowId, jackingMpa[index]!, shortening, longTerm));
  refuseNonPositiveFpe(rows, typeof input.jackingStressMpa === 'number');

  return {
    method: 'aashto-approximate',
    rows,
    checks: {
      humidityFactor: longTerm.humidityFactor,
      strengthFactor: longTerm.strengthFactor,
      eciMpa,
      epMpa,
      modularRatio: shortening.modularRatio,
      fcgpCompressionMpa: shortening.fcgpCompressionMpa,
      steelAreaMm2: shortening.steelAreaMm2,
      steelCentroidFromSoffitMm: shortening.steelCentroidFromSoffitMm,
      steelEccentricityMm: shortening.steelEccentricityMm,
      jackingForceN: shortening.jackingForceN,
      forceAfterTransferN: shortening.forceAfterTransferN,
      selfWeightMomentNmm: input.selfWeightMomentNmm,
      fpiApsOverAgMpa,
    },
  };
}

function rowResult(rowId: string, jackingStressMpa: number, shortening: ElasticShortening, longTerm: LongTermLoss): RowEffectivePrestress {
  const totalLossMpa = shortening.lossMpa + longTerm.totalMpa;
  return {
    rowId,
    jackingStressMpa,
    elasticShorteningMpa: shortening.lossMpa,
    longTermMpa: longTerm.totalMpa,
    longTermParts: {
      prestressTermMpa: longTerm.prestressTermMpa,
      constantTermMpa: longTerm.constantTermMpa,
      relaxationMpa: longTerm.relaxationMpa,
    },
    totalLossMpa,
    fpeMpa: jackingStressMpa - totalLossMpa,
  };
}

/** The article's fcgp is a compression; tension at the steel centroid at transfer means the moment or the section is wrong. */
function refuseTensionAtSteel(shortening: ElasticShortening): void {
  if (shortening.fcgpCompressionMpa <= 0) {
    throw new EngineInputError(
      'losses.selfWeightMomentNmm',
      `leaves the concrete at the steel centroid in tension at transfer (fcgp = ${shortening.fcgpCompressionMpa.toFixed(2)} MPa compression); check the moment's units and the section`,
    );
  }
}

function refuseNonPositiveFpe(rows: readonly RowEffectivePrestress[], oneJackingStress: boolean): void {
  const spent = rows.find((row) => row.fpeMpa <= 0);
  if (spent === undefined) return;
  const path = oneJackingStress ? 'losses.jackingStressMpa' : `losses.jackingStressMpa.${spent.rowId}`;
  throw new EngineInputError(
    path,
    `row ${spent.rowId}: the losses (${spent.totalLossMpa.toFixed(1)} MPa) use up the jacking stress ${spent.jackingStressMpa} MPa, leaving fpe ≤ 0`,
  );
}
