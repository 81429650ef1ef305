import { integrateOverBand } from '../geometry';
import {
  AASHTO_ULTIMATE_CONCRETE_STRAIN,
  EngineInputError,
  IS_PEAK_CONCRETE_STRAIN,
  IS_ULTIMATE_CONCRETE_STRAIN,
  blockAlpha1,
  blockBeta1,
  flexureResistanceFactor,
  isConcreteStressMpa,
  mildSteelStressMpa,
  pciStrandCurveFor,
  pciStrandStressMpa,
  strandStressIs1343Mpa,
  strandStressPowerMpa,
  todeschiniStressMpa,
  type StrandCurveName,
} from '../materials';
import { usableStressLimitMpa } from './development';
import { unbondedTendonStressMpa } from './unbonded-tendon';
import { effectivePrestressForceN, topFibreConcrete, type ConcreteRegion, type FlexuralStrength, type SectionModel, type StrandLayer, type StrandRowResult } from './section-model';

export type ConcreteModelName = 'whitney' | 'parabolic' | 'is1343';

export interface StrainCompatibilityOptions {
  readonly strandCurve: StrandCurveName;
  readonly concreteModel: ConcreteModelName;
}

/** Equilibrium is reached when |ΣT − C| ≤ this share of ΣT (engineering.md §4.1). */
export const FORCE_RESIDUAL_TOLERANCE = 1e-6;
const MAX_ITERATIONS = 200;

interface PreparedStrand {
  readonly layer: StrandLayer;
  /** ε1 + ε2: strain of the strand when the concrete around it is at zero strain. */
  readonly prestrain: number;
  readonly stressAt: (strain: number) => number;
  /** The layer's area that is fully developed here. */
  readonly developedAreaMm2: number;
  /** The stress limit of each of `layer.developingParts`, set before each solve. */
  readonly partLimitsMpa: Float64Array;
}

/** The forces at one trial neutral axis, with the moments about the soffit to find Mn. */
interface TrialForces {
  tensionN: number;
  compressionN: number;
  /** Σ F·y over the steel (tension positive) and over the concrete, about y = 0. */
  steelMomentAboutSoffitNmm: number;
  concreteMomentAboutSoffitNmm: number;
}

function strandCurveFunction(curve: StrandCurveName, layer: StrandLayer): (strain: number) => number {
  const material = layer.material;
  switch (curve) {
    case 'power':
      return (strain) => strandStressPowerMpa(strain, material);
    case 'pci': {
      const pci = pciStrandCurveFor(material.fpuMpa, material.epsMpa, layer.path);
      return (strain) => pciStrandStressMpa(pci, strain);
    }
    case 'is1343':
      return (strain) => strandStressIs1343Mpa(strain, material);
  }
}

/**
 * ε1 = fpe/Eps and ε2 = (Pe/Ec)(1/A + e·ei/I) of every bonded row (engineering.md §4.1): Pe is
 * the total effective force after damage, e its eccentricity and ei the row's, both below the
 * centroid of the damaged non-composite girder, whose A and I are used.
 */
function prepareStrands(model: SectionModel, curve: StrandCurveName): PreparedStrand[] {
  const { areaMm2, inertiaMm4, centroidFromSoffitMm } = model.girderSection;
  const bonded = model.strands.filter((layer) => layer.bonded);
  const prestressN = bonded.reduce((sum, layer) => sum + effectivePrestressForceN(layer), 0);
  const forceCentroidY = prestressN > 0 ? bonded.reduce((sum, layer) => sum + effectivePrestressForceN(layer) * layer.yMm, 0) / prestressN : centroidFromSoffitMm;
  const eccentricityMm = centroidFromSoffitMm - forceCentroidY;
  return model.strands.map((layer) => {
    const rowEccentricityMm = centroidFromSoffitMm - layer.yMm;
    const decompression = (prestressN / model.girderConcrete.elasticModulusMpa) * (1 / areaMm2 + (eccentricityMm * rowEccentricityMm) / inertiaMm4);
    const developingAreaMm2 = layer.developingParts.reduce((sum, part) => sum + part.areaMm2, 0);
    return {
      layer,
      prestrain: layer.fpeMpa / layer.material.epsMpa + decompression,
      stressAt: strandCurveFunction(curve, layer),
      developedAreaMm2: layer.areaMm2 - developingAreaMm2,
      partLimitsMpa: new Float64Array(layer.developingParts.length),
    };
  });
}

/** Sets each developing part's limit for the stress fps the row reaches fully developed (Infinity: not known yet). */
function setDevelopmentLimits(strand: PreparedStrand, fpsMpa: number): void {
  const { layer } = strand;
  layer.developingParts.forEach((part, i) => {
    strand.partLimitsMpa[i] = usableStressLimitMpa(part, layer.fpeMpa, fpsMpa, layer.strandDiameterMm);
  });
}

/** Force of a bonded row at a strain: developed strands on the curve, the others up to their limits. */
function strandForceN(strand: PreparedStrand, strain: number): number {
  const stress = strand.stressAt(strain);
  let force = strand.developedAreaMm2 * stress;
  const parts = strand.layer.developingParts;
  for (let i = 0; i < parts.length; i++) force += parts[i]!.areaMm2 * Math.min(stress, strand.partLimitsMpa[i]!);
  return force;
}

interface ConcreteModel {
  readonly ultimateStrain: number;
  /** Adds the compression of every region above the neutral axis at depth c. */
  addCompression(forces: TrialForces, c: number): void;
  readonly blockDepthMm: (c: number) => number | null;
}

function addRegionBand(forces: TrialForces, region: ConcreteRegion, yLowMm: number, yHighMm: number, stressAt: (yMm: number) => number): void {
  if (yHighMm <= yLowMm) return;
  for (const polygon of region.polygons) {
    const band = integrateOverBand(polygon, yLowMm, yHighMm, stressAt);
    forces.compressionN += region.sign * band.forceN;
    forces.concreteMomentAboutSoffitNmm += region.sign * band.momentAboutSoffitNmm;
  }
}

/** AASHTO LRFD 5.6.2.2 block: depth β1 c with β1 of the top-fibre concrete, each region at its own α1 f'c. */
function whitneyModel(model: SectionModel): ConcreteModel {
  const beta1 = blockBeta1(topFibreConcrete(model).strengthMpa);
  const regionStress = model.regions.map((region) => {
    const stressMpa = blockAlpha1(region.concrete.strengthMpa) * region.concrete.strengthMpa;
    return () => stressMpa;
  });
  return {
    ultimateStrain: AASHTO_ULTIMATE_CONCRETE_STRAIN,
    blockDepthMm: (c) => beta1 * c,
    addCompression(forces, c) {
      const yLow = model.topYMm - beta1 * c;
      model.regions.forEach((region, i) => addRegionBand(forces, region, yLow, model.topYMm, regionStress[i]!));
    },
  };
}

/**
 * A stress–strain curve integrated over the compression zone, strain linear from εcu at the
 * top to 0 at the neutral axis; `kinkStrain` splits the band where the curve has a corner.
 */
function curvedModel(
  model: SectionModel,
  ultimateStrain: number,
  stressOf: (region: ConcreteRegion, strain: number) => number,
  kinkStrain: number | null,
): ConcreteModel {
  let neutralAxisY = 0;
  let strainPerMm = 0;
  const regionStress = model.regions.map((region) => (yMm: number) => stressOf(region, (yMm - neutralAxisY) * strainPerMm));
  return {
    ultimateStrain,
    blockDepthMm: () => null,
    addCompression(forces, c) {
      neutralAxisY = model.topYMm - c;
      strainPerMm = ultimateStrain / c;
      const kinkY = kinkStrain === null ? null : neutralAxisY + kinkStrain / strainPerMm;
      model.regions.forEach((region, i) => {
        const stressAt = regionStress[i]!;
        if (kinkY === null) addRegionBand(forces, region, neutralAxisY, model.topYMm, stressAt);
        else {
          addRegionBand(forces, region, neutralAxisY, kinkY, stressAt);
          addRegionBand(forces, region, kinkY, model.topYMm, stressAt);
        }
      });
    },
  };
}

function concreteModelFor(model: SectionModel, name: ConcreteModelName): ConcreteModel {
  switch (name) {
    case 'whitney':
      return whitneyModel(model);
    case 'parabolic':
      // Todeschini (engineering.md §3), each region on its own curve.
      return curvedModel(
        model,
        AASHTO_ULTIMATE_CONCRETE_STRAIN,
        (region, strain) => todeschiniStressMpa(strain, { fcMpa: region.concrete.strengthMpa, ecMpa: region.concrete.elasticModulusMpa }),
        null,
      );
    case 'is1343':
      // IS 456/1343 design parabola–rectangle: the corner at 0.002 splits the band.
      return curvedModel(model, IS_ULTIMATE_CONCRETE_STRAIN, (region, strain) => isConcreteStressMpa(strain, region.concrete.strengthMpa), IS_PEAK_CONCRETE_STRAIN);
  }
}

/** Everything at one trial neutral-axis depth c below the top fibre. */
function trialForces(model: SectionModel, strands: readonly PreparedStrand[], concrete: ConcreteModel, c: number): TrialForces {
  const forces: TrialForces = { tensionN: 0, compressionN: 0, steelMomentAboutSoffitNmm: 0, concreteMomentAboutSoffitNmm: 0 };
  const strainPerMm = concrete.ultimateStrain / c;
  for (const strand of strands) {
    const { layer } = strand;
    const force = layer.bonded
      ? strandForceN(strand, strand.prestrain + (layer.dpMm - c) * strainPerMm)
      : layer.areaMm2 * unbondedTendonStressMpa(layer, c);
    forces.tensionN += force;
    forces.steelMomentAboutSoffitNmm += force * layer.yMm;
  }
  for (const bar of model.bars) {
    const force = bar.areaMm2 * mildSteelStressMpa((bar.dMm - c) * strainPerMm, bar);
    forces.tensionN += force;
    forces.steelMomentAboutSoffitNmm += force * bar.yMm;
  }
  concrete.addCompression(forces, c);
  return forces;
}

/**
 * The neutral-axis depth at which steel tension balances concrete compression, by the Illinois
 * variant of regula falsi on a bracket (it keeps the bracket, so it cannot escape the section),
 * to a relative force residual of FORCE_RESIDUAL_TOLERANCE.
 */
function solveNeutralAxis(model: SectionModel, strands: readonly PreparedStrand[], concrete: ConcreteModel): { c: number; forces: TrialForces } {
  const residual = (c: number) => {
    const forces = trialForces(model, strands, concrete, c);
    return { forces, value: forces.tensionN - forces.compressionN };
  };
  const depthMm = model.topYMm;
  let low = depthMm * 1e-4;
  let high = depthMm;
  let atLow = residual(low);
  let atHigh = residual(high);
  if (atHigh.value > 0) {
    throw new EngineInputError('girder.strandRows', 'the steel force exceeds what the whole concrete section can balance: check the strand rows and the concrete');
  }
  if (atLow.value < 0) throw new EngineInputError('girder.strandRows', 'no tension steel below the compression zone: check the strand and bar heights');
  let side = 0;
  for (let iteration = 0; iteration < MAX_ITERATIONS; iteration++) {
    const c = (low * atHigh.value - high * atLow.value) / (atHigh.value - atLow.value);
    const trial = residual(c);
    if (Math.abs(trial.value) <= FORCE_RESIDUAL_TOLERANCE * trial.forces.tensionN || high - low <= depthMm * 1e-12) return { c, forces: trial.forces };
    if (trial.value > 0) {
      low = c;
      atLow = trial;
      if (side === 1) atHigh = { ...atHigh, value: atHigh.value / 2 };
      side = 1;
    } else {
      high = c;
      atHigh = trial;
      if (side === -1) atLow = { ...atLow, value: atLow.value / 2 };
      side = -1;
    }
  }
  throw new Error('strain compatibility did not converge');
}

/**
 * Solves once with the limits that do not depend on fps (within lt, inside exposed zones), then,
 * where a part is still developing from fpe towards fps, once more with its limit on the line
 * from fpe to the fps the row reached fully developed in the first solve (engineering.md §5).
 */
function solveWithDevelopment(model: SectionModel, strands: readonly PreparedStrand[], concrete: ConcreteModel): { c: number; forces: TrialForces } {
  strands.forEach((strand) => setDevelopmentLimits(strand, Number.POSITIVE_INFINITY));
  const first = solveNeutralAxis(model, strands, concrete);
  const developing = strands.filter((strand) => strand.layer.bonded && strand.layer.developingParts.length > 0);
  if (developing.length === 0) return first;
  for (const strand of developing) {
    const strain = strand.prestrain + ((strand.layer.dpMm - first.c) * concrete.ultimateStrain) / first.c;
    setDevelopmentLimits(strand, strand.stressAt(strain));
  }
  return solveNeutralAxis(model, strands, concrete);
}

function rowResults(strands: readonly PreparedStrand[], c: number, ultimateStrain: number): StrandRowResult[] {
  return strands.map((strand) => {
    const { layer } = strand;
    const totalStrain = layer.bonded ? strand.prestrain + ((layer.dpMm - c) * ultimateStrain) / c : null;
    const force = totalStrain === null ? layer.areaMm2 * unbondedTendonStressMpa(layer, c) : strandForceN(strand, totalStrain);
    return {
      rowId: layer.rowId,
      yMm: layer.yMm,
      effectiveStrands: layer.effectiveStrands,
      totalStrain,
      stressMpa: layer.areaMm2 > 0 ? force / layer.areaMm2 : 0,
    };
  });
}

/**
 * Nominal flexural strength by strain compatibility (engineering.md §4.1): plane sections,
 * εcu at the top fibre, each bonded row at ε1 + ε2 + ε3, unbonded tendons by AASHTO LRFD
 * 5.6.3.1.2, bars elastic–plastic; Mn from the internal couple; φ by AASHTO LRFD 5.5.4.2 from
 * the net tensile strain at the extreme tension steel. The concrete displaced by steel is not
 * deducted (its effect is well under the precision of the inputs).
 */
export function strainCompatibilityStrength(model: SectionModel, options: StrainCompatibilityOptions): FlexuralStrength {
  if (!hasTensionSteel(model)) return noSteelLeft(model);
  const strands = prepareStrands(model, options.strandCurve);
  const concrete = concreteModelFor(model, options.concreteModel);
  const { c, forces } = solveWithDevelopment(model, strands, concrete);
  const concreteDepthFromTopMm = model.topYMm - forces.concreteMomentAboutSoffitNmm / forces.compressionN;
  const steelDepthFromTopMm = model.topYMm - forces.steelMomentAboutSoffitNmm / forces.tensionN;
  const nominalMomentNmm = forces.tensionN * (steelDepthFromTopMm - concreteDepthFromTopMm);

  const tensionSteelDepths = [...model.strands.filter((s) => s.areaMm2 > 0).map((s) => s.dpMm), ...model.bars.map((b) => b.dMm)];
  const extremeDepthMm = Math.max(...tensionSteelDepths);
  const extremeTensionStrain = (concrete.ultimateStrain * (extremeDepthMm - c)) / c;
  // The IS design curves already carry the material partial factors (IS 456/1343 [R]), so no φ goes on top.
  const phi =
    options.concreteModel === 'is1343' ? 1 : flexureResistanceFactor(extremeTensionStrain, model.strands.some((s) => s.areaMm2 > 0) ? 'prestressed' : 'reinforced');
  const rows = rowResults(strands, c, concrete.ultimateStrain);
  return {
    method: 'strain-compatibility',
    neutralAxisDepthMm: c,
    blockDepthMm: concrete.blockDepthMm(c),
    nominalMomentKnm: nominalMomentNmm / 1e6,
    phi,
    factoredMomentKnm: (phi * nominalMomentNmm) / 1e6,
    extremeTensionStrain,
    rows,
    relativeForceResidual: Math.abs(forces.tensionN - forces.compressionN) / forces.tensionN,
    warnings: [...strandWarnings(rows, model), ...(options.concreteModel === 'is1343' ? [IS_CURVES_PHI_NOTE] : [])],
  };
}

const IS_CURVES_PHI_NOTE = 'the IS design stress curves already include the material partial factors, so phi is 1.0';

function strandWarnings(rows: readonly StrandRowResult[], model: SectionModel): string[] {
  const warnings: string[] = [];
  for (const row of rows) {
    if (row.stressMpa < 0) warnings.push(`strand row "${row.rowId}" is in compression at nominal strength`);
  }
  if (model.strands.some((s) => s.exposedAreaMm2 > 0)) warnings.push('exposed strands are limited to their effective prestress fpe at this section');
  if (model.strands.some((s) => s.developingParts.some((part) => Number.isFinite(part.bondDistanceMm)))) {
    warnings.push('strands near a point where bond begins are limited to the stress they have developed (AASHTO LRFD 5.9.4.3)');
  }
  if (model.strands.some((s) => !s.bonded)) {
    warnings.push('unbonded tendons use le = unbondedLengthMm as given; the 2 li/(2 + Ns) reduction for continuous tendons is not applied');
  }
  return warnings;
}

function hasTensionSteel(model: SectionModel): boolean {
  return model.strands.some((layer) => layer.areaMm2 > 0) || model.bars.length > 0;
}

/** Every strand lost at this section and no bars: nothing to balance the concrete, so no flexural strength. */
function noSteelLeft(model: SectionModel): FlexuralStrength {
  return {
    method: 'strain-compatibility',
    neutralAxisDepthMm: 0,
    blockDepthMm: null,
    nominalMomentKnm: 0,
    phi: 1,
    factoredMomentKnm: 0,
    extremeTensionStrain: null,
    rows: model.strands.map((layer) => ({ rowId: layer.rowId, yMm: layer.yMm, effectiveStrands: 0, totalStrain: null, stressMpa: 0 })),
    relativeForceResidual: 0,
    warnings: ['no tension steel remains at this section: its flexural strength is zero'],
  };
}
