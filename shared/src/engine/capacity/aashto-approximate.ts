import { convert } from '../../units';
import {
  AASHTO_ULTIMATE_CONCRETE_STRAIN,
  EngineInputError,
  blockAlpha1,
  blockBeta1,
  flexureResistanceFactor,
  requireBasis,
  joinPath,
} from '../materials';
import { requireCompressionFlange, type BarLayer, type CompressionFlange, type FlexuralStrength, type SectionModel, type StrandLayer, type StrandRowResult } from './section-model';
import { UNBONDED_STRESS_INCREASE_MPA, unbondedTendonStressMpa } from './unbonded-tendon';

/** AASHTO LRFD 5.6.3.1.1: its fps formula holds only when fpe ≥ 0.5 fpu [R]. */
const MINIMUM_FPE_TO_FPU = 0.5;

/** Bonded strand lumped at the centroid of its area, all of one grade, at fps = fpu (1 − k c/dp). */
interface BondedStrandGroup {
  readonly areaMm2: number;
  readonly dpMm: number;
  readonly fpuMpa: number;
  /** k = 2 (1.04 − fpy/fpu). */
  readonly k: number;
}

/** The steel the method counts, sorted by how its stress depends on c. */
interface TensionSteel {
  readonly bonded: BondedStrandGroup | null;
  readonly unbonded: readonly StrandLayer[];
  /** Exposed strands of bonded rows: constant force at fpe. */
  readonly exposedForceN: number;
  readonly exposedMomentAboutTopNmm: number;
  /** Bars below mid-depth, at fy. */
  readonly tensionBars: readonly BarLayer[];
}

/** The stress block's concrete: f'c, α1 and β1 of the compression flange. */
interface StressBlock {
  readonly flange: CompressionFlange;
  readonly intensityMpa: number;
  readonly beta1: number;
}

/** Depth of the neutral axis, and whether the block passed below the flange to find it. */
interface Equilibrium {
  readonly neutralAxisDepthMm: number;
  readonly flanged: boolean;
}

/**
 * Nominal flexural strength by the approximate method of AASHTO LRFD 5.6.3.1 [R], SI forms
 * (engineering.md §4.2):
 * - bonded strand (5.6.3.1.1): fps = fpu (1 − k c/dp), k = 2 (1.04 − fpy/fpu), with
 *   c = (Aps fpu + As fy)/(α1 f'c β1 b + k Aps fpu/dp); all bonded rows are lumped as their
 *   total area at its area-weighted centroid dp, and must share one strand grade;
 * - unbonded strand (5.6.3.1.2): fps = fpe + 6200 (dp − c)/le ≤ fpy per row, le taken as the
 *   row's `unbondedLengthMm`; force equilibrium is solved with this fps exactly (it is linear
 *   in c), which is the article's c formula solved simultaneously with its fps;
 * - flanged behaviour when a = β1 c > hf: the overhang α1 f'c (b − bw) hf joins the
 *   compression and bw replaces b, Mn gains α1 f'c (b − bw) hf (a/2 − hf/2);
 * - exposed strands carry fpe, a constant force at their own depth; bars below mid-depth of the
 *   section count at fy as tension steel and bars above it are ignored (no compression steel).
 * α1, β1 and f'c are those of the compression flange (the deck's when there is one); φ from
 * AASHTO LRFD 5.5.4.2 with εt = εcu (dt − c)/c at the lowest tension steel.
 * Refuses a section without a recognised compression flange (`options.method`).
 */
export function aashtoApproximateStrength(model: SectionModel): FlexuralStrength {
  const flange = requireCompressionFlange(model, 'the AASHTO approximate method');
  const block = stressBlockOf(flange);
  const steel = tensionSteelOf(model);
  const warnings = validityWarnings(model, steel);
  if (!hasTensionSteel(steel)) return withoutTensionSteel(model, warnings);

  const equilibrium = solveEquilibrium(steel, block);
  const c = equilibrium.neutralAxisDepthMm;
  const blockDepthMm = block.beta1 * c;
  if (equilibrium.flanged && flange.source === 'deck') {
    warnings.push('the stress block reaches below the deck: the girder concrete is treated as deck concrete; use strain compatibility');
  }
  warnings.push(...unyieldedBarWarnings(steel.tensionBars, c));

  const extremeTensionStrain = (AASHTO_ULTIMATE_CONCRETE_STRAIN * (extremeTensionDepthMm(model, steel) - c)) / c;
  const phi = flexureResistanceFactor(extremeTensionStrain, hasStrand(steel) ? 'prestressed' : 'reinforced');
  const nominalMomentKnm = convert(nominalMomentNmm(steel, block, equilibrium, blockDepthMm), 'Nmm', 'kNm');
  return {
    method: 'aashto-approximate',
    neutralAxisDepthMm: c,
    blockDepthMm,
    nominalMomentKnm,
    phi,
    factoredMomentKnm: phi * nominalMomentKnm,
    extremeTensionStrain,
    rows: rowResults(model.strands, steel, equilibrium),
    warnings,
  };
}


function stressBlockOf(flange: CompressionFlange): StressBlock {
  const fcMpa = requireBasis(flange.concrete, 'cylinder', flange.source === 'deck' ? 'girder.deck' : 'girder.concrete');
  return { flange, intensityMpa: blockAlpha1(fcMpa) * fcMpa, beta1: blockBeta1(fcMpa) };
}

function tensionSteelOf(model: SectionModel): TensionSteel {
  const bondedRows = model.strands.filter((layer) => layer.bonded);
  const unbondedRows = model.strands.filter((layer) => !layer.bonded);
  unbondedRows.forEach(requireUnbondedLength);
  return {
    bonded: bondedGroupOf(bondedRows),
    unbonded: unbondedRows.filter((layer) => layer.areaMm2 > 0),
    exposedForceN: sumOver(bondedRows, (layer) => layer.exposedAreaMm2 * layer.fpeMpa),
    exposedMomentAboutTopNmm: sumOver(bondedRows, (layer) => layer.exposedAreaMm2 * layer.fpeMpa * layer.dpMm),
    tensionBars: model.bars.filter((bar) => bar.dMm > model.topYMm / 2 && bar.areaMm2 > 0),
  };
}

/** One resultant for all bonded strand, at the area-weighted centroid of the strands that keep their bond. */
function bondedGroupOf(bondedRows: readonly StrandLayer[]): BondedStrandGroup | null {
  const first = bondedRows[0];
  if (first === undefined) return null;
  for (const layer of bondedRows) requireGrade(layer, first);
  const areaMm2 = sumOver(bondedRows, bondedAreaMm2);
  if (areaMm2 === 0) return null;
  const { fpuMpa, fpyMpa } = first.material;
  return {
    areaMm2,
    dpMm: sumOver(bondedRows, (layer) => bondedAreaMm2(layer) * layer.dpMm) / areaMm2,
    fpuMpa,
    k: 2 * (1.04 - fpyMpa / fpuMpa),
  };
}

function requireGrade(layer: StrandLayer, first: StrandLayer): void {
  if (layer.material.fpuMpa !== first.material.fpuMpa || layer.material.fpyMpa !== first.material.fpyMpa) {
    throw new EngineInputError(
      joinPath(layer.path, 'fpuMpa'),
      `the AASHTO approximate method lumps bonded strand into one resultant and needs one grade, ` +
        `but this row's fpu/fpy differ from ${first.path}'s: use strain-compatibility`,
    );
  }
}

function requireUnbondedLength(layer: StrandLayer): void {
  if (layer.unbondedLengthMm === null || !(layer.unbondedLengthMm > 0)) {
    throw new EngineInputError(joinPath(layer.path, 'unbondedLengthMm'), 'an unbonded row needs its length between anchorages (> 0)');
  }
}

function bondedAreaMm2(layer: StrandLayer): number {
  return layer.areaMm2 - layer.exposedAreaMm2;
}

function hasStrand(steel: TensionSteel): boolean {
  return steel.bonded !== null || steel.unbonded.length > 0 || steel.exposedForceN > 0;
}

function hasTensionSteel(steel: TensionSteel): boolean {
  return hasStrand(steel) || steel.tensionBars.length > 0;
}

function validityWarnings(model: SectionModel, steel: TensionSteel): string[] {
  const warnings: string[] = [];
  for (const layer of model.strands) {
    const lowestFpeMpa = MINIMUM_FPE_TO_FPU * layer.material.fpuMpa;
    if (layer.bonded && layer.fpeMpa < lowestFpeMpa) {
      warnings.push(
        `${layer.path}: fpe = ${layer.fpeMpa.toFixed(1)} MPa is below 0.5 fpu = ${lowestFpeMpa.toFixed(1)} MPa, ` +
          'outside AASHTO LRFD 5.6.3.1.1; use strain compatibility',
      );
    }
  }
  if (steel.unbonded.length > 0) {
    warnings.push(
      'unbonded strand: le is taken as the tendon length between anchorages; ' +
        'AASHTO LRFD 5.6.3.1.2 reduces it to 2 li/(2 + Ns) for continuous tendons',
    );
  }
  if (model.bars.some((bar) => bar.dMm <= model.topYMm / 2)) {
    warnings.push('bars above mid-depth are ignored: the approximate method here counts no compression steel');
  }
  return warnings;
}

/** The article's force equilibrium: rectangular first, flanged when the block passes below the flange. */
function solveEquilibrium(steel: TensionSteel, block: StressBlock): Equilibrium {
  const rectangular = solveForWidth(steel, block, block.flange.widthMm, 0);
  if (block.beta1 * rectangular.neutralAxisDepthMm <= block.flange.thicknessMm) return rectangular;
  const { widthMm, webWidthMm, thicknessMm } = block.flange;
  return { ...solveForWidth(steel, block, webWidthMm, overhangForceN(block, widthMm - webWidthMm, thicknessMm)), flanged: true };
}

function overhangForceN(block: StressBlock, overhangWidthMm: number, thicknessMm: number): number {
  return block.intensityMpa * overhangWidthMm * thicknessMm;
}

/**
 * Every stress of the article is linear in c, so T(c) = T0 − T1 c and the block force
 * α1 f'c β1 bComp c + overhang balance it at one c; an unbonded row that passes fpy is then held
 * at fpy and c solved again (holding one only lowers c, so rows reach fpy one way only).
 */
function solveForWidth(steel: TensionSteel, block: StressBlock, compressionWidthMm: number, overhangN: number): Equilibrium {
  const unbondedAtYield = steel.unbonded.map(() => false);
  for (;;) {
    const c = balancedDepthMm(steel, unbondedAtYield, block.intensityMpa * block.beta1 * compressionWidthMm, overhangN);
    let newlyYielded = false;
    steel.unbonded.forEach((layer, i) => {
      if (!unbondedAtYield[i] && unbondedTendonStressMpa(layer, c) >= layer.material.fpyMpa) {
        unbondedAtYield[i] = true;
        newlyYielded = true;
      }
    });
    if (!newlyYielded) return { neutralAxisDepthMm: c, flanged: false };
  }
}

function balancedDepthMm(steel: TensionSteel, unbondedAtYield: readonly boolean[], blockForcePerMmN: number, overhangN: number): number {
  let forceAtZeroDepthN = steel.exposedForceN + sumOver(steel.tensionBars, (bar) => bar.areaMm2 * bar.fyMpa);
  let forceLossPerMmN = 0;
  if (steel.bonded) {
    forceAtZeroDepthN += steel.bonded.areaMm2 * steel.bonded.fpuMpa;
    forceLossPerMmN += (steel.bonded.k * steel.bonded.areaMm2 * steel.bonded.fpuMpa) / steel.bonded.dpMm;
  }
  steel.unbonded.forEach((layer, i) => {
    if (unbondedAtYield[i]) {
      forceAtZeroDepthN += layer.areaMm2 * layer.material.fpyMpa;
    } else {
      const risePerMmMpa = UNBONDED_STRESS_INCREASE_MPA / layer.unbondedLengthMm!;
      forceAtZeroDepthN += layer.areaMm2 * (layer.fpeMpa + risePerMmMpa * layer.dpMm);
      forceLossPerMmN += layer.areaMm2 * risePerMmMpa;
    }
  });
  return (forceAtZeroDepthN - overhangN) / (blockForcePerMmN + forceLossPerMmN);
}

function bondedStressMpa(group: BondedStrandGroup, c: number): number {
  return group.fpuMpa * (1 - (group.k * c) / group.dpMm);
}

/** The article's Mn = Σ T (d − a/2) + α1 f'c (b − bw) hf (a/2 − hf/2), the overhang term only when flanged. */
function nominalMomentNmm(steel: TensionSteel, block: StressBlock, equilibrium: Equilibrium, blockDepthMm: number): number {
  const c = equilibrium.neutralAxisDepthMm;
  const halfBlockMm = blockDepthMm / 2;
  let momentNmm = steel.exposedMomentAboutTopNmm - steel.exposedForceN * halfBlockMm;
  if (steel.bonded) momentNmm += steel.bonded.areaMm2 * bondedStressMpa(steel.bonded, c) * (steel.bonded.dpMm - halfBlockMm);
  for (const layer of steel.unbonded) momentNmm += layer.areaMm2 * unbondedTendonStressMpa(layer, c) * (layer.dpMm - halfBlockMm);
  for (const bar of steel.tensionBars) momentNmm += bar.areaMm2 * bar.fyMpa * (bar.dMm - halfBlockMm);
  if (equilibrium.flanged) {
    const { widthMm, webWidthMm, thicknessMm } = block.flange;
    momentNmm += overhangForceN(block, widthMm - webWidthMm, thicknessMm) * (halfBlockMm - thicknessMm / 2);
  }
  return momentNmm;
}

/** dt: the lowest strand row that keeps any area, or the lowest tension bar. */
function extremeTensionDepthMm(model: SectionModel, steel: TensionSteel): number {
  let depthMm = 0;
  for (const layer of model.strands) if (layer.areaMm2 > 0) depthMm = Math.max(depthMm, layer.dpMm);
  for (const bar of steel.tensionBars) depthMm = Math.max(depthMm, bar.dMm);
  return depthMm;
}

function unyieldedBarWarnings(bars: readonly BarLayer[], c: number): string[] {
  return bars
    .filter((bar) => (AASHTO_ULTIMATE_CONCRETE_STRAIN * (bar.dMm - c)) / c < bar.fyMpa / bar.esMpa)
    .map((bar) => `${bar.path}: the bar does not reach yield at this neutral axis but is counted at fy; use strain compatibility`);
}

/** Each row's stress is its force ÷ its area, so a row with exposed strands shows the mean of fps and fpe. */
function rowResults(layers: readonly StrandLayer[], steel: TensionSteel, equilibrium: Equilibrium): StrandRowResult[] {
  const c = equilibrium.neutralAxisDepthMm;
  const bondedMpa = steel.bonded ? bondedStressMpa(steel.bonded, c) : 0;
  return layers.map((layer) => {
    const stressMpa = layer.bonded
      ? meanStressMpa(bondedAreaMm2(layer), bondedMpa, layer.exposedAreaMm2, layer.fpeMpa)
      : unbondedTendonStressMpa(layer, c);
    return { rowId: layer.rowId, yMm: layer.yMm, effectiveStrands: layer.effectiveStrands, totalStrain: null, stressMpa };
  });
}

function meanStressMpa(bondedMm2: number, bondedMpa: number, exposedMm2: number, exposedMpa: number): number {
  const areaMm2 = bondedMm2 + exposedMm2;
  return areaMm2 === 0 ? bondedMpa : (bondedMm2 * bondedMpa + exposedMm2 * exposedMpa) / areaMm2;
}

/** Every strand lost and no tension bars: nothing balances the concrete, so Mn = 0 (φ is then immaterial: the lowest). */
function withoutTensionSteel(model: SectionModel, warnings: string[]): FlexuralStrength {
  return {
    method: 'aashto-approximate',
    neutralAxisDepthMm: 0,
    blockDepthMm: 0,
    nominalMomentKnm: 0,
    phi: flexureResistanceFactor(0, 'prestressed'),
    factoredMomentKnm: 0,
    extremeTensionStrain: null,
    rows: model.strands.map((layer) => ({
      rowId: layer.rowId,
      yMm: layer.yMm,
      effectiveStrands: layer.effectiveStrands,
      totalStrain: null,
      stressMpa: 0,
    })),
    warnings: [...warnings, 'no tension steel remains at this section: Mn = 0'],
  };
}

function sumOver<T>(items: readonly T[], value: (item: T) => number): number {
  let sum = 0;
  for (const item of items) sum += value(item);
  return sum;
}
