import { convert } from '../../units';
import { EngineInputError, IS1343_STRAND_DESIGN_STRENGTH_RATIO, IS_RECTANGULAR_ZONE_RESULTANT, joinPath, requireBasis } from '../materials';
import { requireCompressionFlange, type FlexuralStrength, type SectionModel, type StrandLayer } from './section-model';

/** One row of IS 1343:1980 Table 11: at a reinforcement index, fpb/0.87 fp and xu/d for each kind of tensioning. */
export interface Is1343TableRow {
  /** Ap fp/(b d fck). */
  readonly reinforcementIndex: number;
  readonly pre: Is1343TableEntry;
  readonly post: Is1343TableEntry;
}

export interface Is1343TableEntry {
  /** fpb / 0.87 fp. */
  readonly stressRatio: number;
  /** xu / d. */
  readonly depthRatio: number;
}

/**
 * IS 1343:1980 Appendix B, Table 11, p. 59 [S], as engineering.md §4.3 transcribes it:
 * conditions at the ultimate limit state of rectangular beams with pretensioned tendons or
 * post-tensioned tendons with effective bond.
 */
export const IS1343_TABLE_11: readonly Is1343TableRow[] = Object.freeze([
  { reinforcementIndex: 0.025, pre: { stressRatio: 1.0, depthRatio: 0.054 }, post: { stressRatio: 1.0, depthRatio: 0.054 } },
  { reinforcementIndex: 0.05, pre: { stressRatio: 1.0, depthRatio: 0.109 }, post: { stressRatio: 1.0, depthRatio: 0.109 } },
  { reinforcementIndex: 0.1, pre: { stressRatio: 1.0, depthRatio: 0.217 }, post: { stressRatio: 1.0, depthRatio: 0.217 } },
  { reinforcementIndex: 0.15, pre: { stressRatio: 1.0, depthRatio: 0.326 }, post: { stressRatio: 1.0, depthRatio: 0.316 } },
  { reinforcementIndex: 0.2, pre: { stressRatio: 1.0, depthRatio: 0.435 }, post: { stressRatio: 0.95, depthRatio: 0.414 } },
  { reinforcementIndex: 0.25, pre: { stressRatio: 1.0, depthRatio: 0.542 }, post: { stressRatio: 0.9, depthRatio: 0.488 } },
  { reinforcementIndex: 0.3, pre: { stressRatio: 1.0, depthRatio: 0.655 }, post: { stressRatio: 0.85, depthRatio: 0.558 } },
  { reinforcementIndex: 0.4, pre: { stressRatio: 0.9, depthRatio: 0.783 }, post: { stressRatio: 0.75, depthRatio: 0.653 } },
]);

/** Below the table's first row: steel at 0.87 fp and a zone shrinking to nothing at zero steel (modelling choice, no source). */
const ZERO_STEEL_ENTRY: Is1343TableEntry = Object.freeze({ stressRatio: 1.0, depthRatio: 0 });

/** IS 1343 Appendix B: the method holds only when the effective prestress is at least 0.45 fp [S, engineering.md §4.3]. */
const MINIMUM_FPE_TO_FP = 0.45;
/** IS 1343 Appendix B: design stress of a flange overhang, as a share of fck [R]. */
const FLANGE_STRESS_TO_FCK = 0.45;

export const IS1343_CAPACITY_CHECK_NOTE =
  'IS 1343 Mu already includes the material partial factors; phi is 1.0 and this result is not used for LRFR ratings';
export const IS1343_FLANGE_DIVISOR_NOTE =
  'flanged section: the overhang force 0.45 fck (b − bw) Df is carried by Apf = 0.45 fck (b − bw) Df / (0.87 fp), ' +
  'IS 1343:1980 Appendix B [R: confirm the divisor against the adopted edition]';

/** The section's bonded tendons as Appendix B sees them: one area at the centroid, one grade. */
interface Tendons {
  readonly areaMm2: number;
  readonly depthMm: number;
  readonly fpMpa: number;
}

/** Strength of the tendons and the zone depth for one entry of the table. */
interface TableStrength {
  readonly fpbMpa: number;
  readonly xuMm: number;
}

/**
 * Ultimate moment of resistance by IS 1343:1980 Appendix B [S for Table 11, p. 59]
 * (engineering.md §4.3), a capacity check only: Mu already carries the material partial
 * factors, so phi is 1.0 and the result is not fed into LRFR ratings.
 * - Enter Table 11 (pretensioned or post-tensioned column by `model.tensioning`) with
 *   Ap fp/(b d fck), linearly interpolated: fpb = ratio × 0.87 fp, xu = (xu/d) d,
 *   Mu = fpb Ap (d − 0.42 xu); Ap is all bonded strand at its area-weighted centroid d. Below
 *   the first row (0.025) the table is continued linearly to xu = 0 at zero steel.
 * - Flanged, when xu > Df: Apf = 0.45 fck (b − bw) Df/(0.87 fp) [R: confirm the divisor against
 *   the adopted edition], Apw = Ap − Apf entered with bw; Mu = fpb Apw (d − 0.42 xu)
 *   + 0.45 fck (b − bw) Df (d − 0.5 Df). When Apf would take every tendon (Apw ≤ 0) the
 *   rectangular result stands.
 * fck is the compression flange's cube strength (the deck's when there is one). Exposed
 * strands are left out (the table assumes bond) and mild bars are not counted.
 * Refuses: no rectangular compression zone (`options.method`), a cylinder strength, an unbonded
 * row, fpe < 0.45 fp in any row, rows of different fp, and an index beyond the table's 0.40.
 */
export function is1343Strength(model: SectionModel): FlexuralStrength {
  const flange = requireCompressionFlange(model, 'IS 1343 Appendix B');
  const fckMpa = requireBasis(flange.concrete, 'cube', flange.source === 'deck' ? 'girder.deck' : 'girder.concrete');
  const tendons = bondedTendonsOf(model.strands);
  const warnings = [IS1343_CAPACITY_CHECK_NOTE, ...exclusionWarnings(model)];
  if (tendons.areaMm2 === 0) return strengthResult(model, { fpbMpa: 0, xuMm: 0 }, 0, warnings);

  const rectangular = tableStrength(tendons, tendons.areaMm2, flange.widthMm, fckMpa, model.tensioning);
  const overhangForceN = FLANGE_STRESS_TO_FCK * fckMpa * (flange.widthMm - flange.webWidthMm) * flange.thicknessMm;
  const webAreaMm2 = tendons.areaMm2 - overhangForceN / designStrengthMpa(tendons);
  // A web left with no tendon area means the overhang alone balances them: the zone stays in the flange.
  if (rectangular.xuMm <= flange.thicknessMm || webAreaMm2 <= 0) {
    return strengthResult(model, rectangular, rectangular.fpbMpa * tendons.areaMm2 * leverArmMm(tendons, rectangular), warnings);
  }

  const web = tableStrength(tendons, webAreaMm2, flange.webWidthMm, fckMpa, model.tensioning);
  const momentNmm =
    web.fpbMpa * webAreaMm2 * leverArmMm(tendons, web) + overhangForceN * (tendons.depthMm - 0.5 * flange.thicknessMm);
  warnings.push(IS1343_FLANGE_DIVISOR_NOTE);
  if (flange.source === 'deck') {
    warnings.push('the compression zone reaches below the deck: the girder concrete is treated as deck concrete; use strain compatibility');
  }
  const meanStressMpa = (web.fpbMpa * webAreaMm2 + overhangForceN) / tendons.areaMm2;
  return strengthResult(model, { fpbMpa: meanStressMpa, xuMm: web.xuMm }, momentNmm, warnings);
}

/** Table 11 entry at a reinforcement index, linear between rows; beyond the last row the method does not apply. */
export function is1343TableEntry(reinforcementIndex: number, tensioning: 'pre' | 'post'): Is1343TableEntry {
  const upperIndex = IS1343_TABLE_11.findIndex((row) => reinforcementIndex <= row.reinforcementIndex);
  if (upperIndex === -1) {
    const lastIndex = IS1343_TABLE_11[IS1343_TABLE_11.length - 1]!.reinforcementIndex;
    throw new EngineInputError(
      'options.method',
      `Ap fp/(b d fck) = ${reinforcementIndex.toFixed(4)} is beyond IS 1343 Table 11's last row ` +
        `(${lastIndex}): the table does not cover this section; use strain-compatibility`,
    );
  }
  const upper = IS1343_TABLE_11[upperIndex]!;
  const lower =
    upperIndex === 0 ? { reinforcementIndex: 0, entry: ZERO_STEEL_ENTRY } : tableRowEntry(IS1343_TABLE_11[upperIndex - 1]!, tensioning);
  const t = (reinforcementIndex - lower.reinforcementIndex) / (upper.reinforcementIndex - lower.reinforcementIndex);
  const upperEntry = upper[tensioning];
  return {
    stressRatio: lower.entry.stressRatio + t * (upperEntry.stressRatio - lower.entry.stressRatio),
    depthRatio: lower.entry.depthRatio + t * (upperEntry.depthRatio - lower.entry.depthRatio),
  };
}

function tableRowEntry(row: Is1343TableRow, tensioning: 'pre' | 'post') {
  return { reinforcementIndex: row.reinforcementIndex, entry: row[tensioning] };
}


function bondedTendonsOf(layers: readonly StrandLayer[]): Tendons {
  const first = layers[0];
  if (first === undefined) return { areaMm2: 0, depthMm: 0, fpMpa: 0 };
  for (const layer of layers) requireTableConditions(layer, first);
  let areaMm2 = 0;
  let areaMomentMm3 = 0;
  for (const layer of layers) {
    const bondedMm2 = layer.areaMm2 - layer.exposedAreaMm2;
    areaMm2 += bondedMm2;
    areaMomentMm3 += bondedMm2 * layer.dpMm;
  }
  return { areaMm2, depthMm: areaMm2 > 0 ? areaMomentMm3 / areaMm2 : 0, fpMpa: first.material.fpuMpa };
}

function requireTableConditions(layer: StrandLayer, first: StrandLayer): void {
  if (!layer.bonded) {
    throw new EngineInputError(
      joinPath(layer.path, 'bonded'),
      'IS 1343 Table 11 covers pretensioned tendons and post-tensioned tendons with effective bond only',
    );
  }
  const lowestFpeMpa = MINIMUM_FPE_TO_FP * layer.material.fpuMpa;
  if (layer.fpeMpa < lowestFpeMpa) {
    throw new EngineInputError(
      joinPath(layer.path, 'fpeMpa'),
      `effective prestress ${layer.fpeMpa.toFixed(1)} MPa is below 0.45 fp = ${lowestFpeMpa.toFixed(1)} MPa, ` +
        'outside IS 1343 Appendix B; use strain-compatibility',
    );
  }
  if (layer.material.fpuMpa !== first.material.fpuMpa) {
    throw new EngineInputError(
      joinPath(layer.path, 'fpuMpa'),
      `IS 1343 Appendix B enters its table with one tendon grade, but this row's fp differs from ${first.path}'s: use strain-compatibility`,
    );
  }
}

function exclusionWarnings(model: SectionModel): string[] {
  const warnings: string[] = [];
  if (model.strands.some((layer) => layer.exposedAreaMm2 > 0)) {
    warnings.push('exposed strands are left out: IS 1343 Table 11 assumes bonded tendons');
  }
  if (model.bars.length > 0) warnings.push('mild bars are not counted by the IS 1343 Appendix B table method');
  return warnings;
}

function designStrengthMpa(tendons: Tendons): number {
  return IS1343_STRAND_DESIGN_STRENGTH_RATIO * tendons.fpMpa;
}

function tableStrength(tendons: Tendons, areaMm2: number, widthMm: number, fckMpa: number, tensioning: 'pre' | 'post'): TableStrength {
  const reinforcementIndex = (areaMm2 * tendons.fpMpa) / (widthMm * tendons.depthMm * fckMpa);
  const entry = is1343TableEntry(reinforcementIndex, tensioning);
  return { fpbMpa: entry.stressRatio * designStrengthMpa(tendons), xuMm: entry.depthRatio * tendons.depthMm };
}

function leverArmMm(tendons: Tendons, strength: TableStrength): number {
  return tendons.depthMm - IS_RECTANGULAR_ZONE_RESULTANT.depthRatio * strength.xuMm;
}

/** Each row's stress is its bonded force ÷ its area: fpb, lowered where exposed strands count nothing. */
function strengthResult(model: SectionModel, strength: TableStrength, momentNmm: number, warnings: readonly string[]): FlexuralStrength {
  const nominalMomentKnm = convert(momentNmm, 'Nmm', 'kNm');
  return {
    method: 'is1343',
    neutralAxisDepthMm: strength.xuMm,
    blockDepthMm: null,
    nominalMomentKnm,
    phi: 1,
    factoredMomentKnm: nominalMomentKnm,
    extremeTensionStrain: null,
    rows: model.strands.map((layer) => ({
      rowId: layer.rowId,
      yMm: layer.yMm,
      effectiveStrands: layer.effectiveStrands,
      totalStrain: null,
      stressMpa: layer.areaMm2 > 0 ? (strength.fpbMpa * (layer.areaMm2 - layer.exposedAreaMm2)) / layer.areaMm2 : strength.fpbMpa,
    })),
    warnings,
  };
}
