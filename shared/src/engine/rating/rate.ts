import type { Girder } from '../calc-file/girder';
import { policyOf, type RateFile } from '../calc-file/rate-file';
import { buildSectionGeometry, withSteel, type SectionGeometry } from '../capacity/build-section-model';
import { applyStrandDamage } from '../calc-file/strand-damage';
import { sectionDepthMm } from '../section';
import { developmentStationsMm, planSpanStrands, rowsAtMm, strandsAtMm, type SpanStrands } from './strands-along-span';
import { effectivePrestressForceN, type SectionModel, type StrandRowResult } from '../capacity/section-model';
import { strainCompatibilityStrength } from '../capacity/strain-compatibility';
import { RESULT_CAUTION } from '../caution';
import { momentDistributionFactor, type MomentDistributionResult } from '../distribution';
import { liveLoadMomentEnvelope, resolveVehicle, type VehicleDefinition } from '../live-load';
import { serviceTensionLimitMpa } from '../materials';
import { conditionFactor, systemFactor, type RatingPolicy } from '../policy/rating-policy';
import { ENGINE_VERSION } from '../version';
import { deadLoadMomentsAt, girderDeadLoads, tributaryWidthMm, type GirderDeadLoads } from './dead-loads';
import { levelOf, postingLoad, serviceLevels, serviceRatingFactor, strengthLevels, strengthRatingFactor, type RatingFactorKey } from './lrfr';
import { damageAt, ratingStationsMm } from './stations';
import { strandLossMargin, type StrandLossMargin } from './strand-loss-margin';
import { withEffectivePrestress } from './effective-prestress';
import type { EffectivePrestressResult } from '../losses';

/** One station of the output (calc-file.md, Output of rate). Moments per girder, kN·m. */
export interface RatingStation {
  readonly xM: number;
  readonly nominalMomentKnm: number;
  readonly phi: number;
  readonly conditionFactor: number;
  readonly systemFactor: number;
  /** C = φc φs φ Mn. */
  readonly factoredCapacityKnm: number;
  readonly momentsKnm: { readonly dc1: number; readonly dc2: number; readonly dw: number; readonly live: Record<string, number> };
  readonly distributionFactor: number;
  readonly impactFactor: number;
  /** Bottom-fibre stresses, tension positive. */
  readonly bottomStressMpa: { readonly prestress: number; readonly dc1: number; readonly dc2: number; readonly dw: number; readonly live: Record<string, number> };
  readonly allowableTensionMpa: number;
  readonly ratingFactors: Record<string, Partial<Record<RatingFactorKey, number>>>;
  /** Each strand row here: its height, the strands that remain (effective area ÷ one strand) and their usable stress at nominal strength. */
  readonly rows: readonly StrandRowResult[];
  /** The damage entries (by position in `damage`) acting here. */
  readonly damageApplied: readonly number[];
}

export interface ControllingRating {
  readonly vehicle: string;
  readonly level: 'inventory' | 'operating' | 'legal' | 'permit';
  readonly limitState: 'strength-i' | 'service-iii';
  readonly ratingFactor: number;
  readonly xM: number;
}

export interface RateOutput {
  readonly stations: readonly RatingStation[];
  readonly summary: {
    readonly controlling: readonly ControllingRating[];
    readonly posting: readonly { vehicle: string; postingLoad: number; unit: 't' | 'ton'; ratingFactor: number; note?: string }[];
    readonly strandLossMargin?: StrandLossMargin;
    readonly capacityAlongSpan: CapacityAlongSpan;
    readonly distribution: MomentDistributionResult;
    /** Computed losses per row, when `losses.method` computes them. */
    readonly effectivePrestress?: EffectivePrestressResult;
    readonly deadLoadsKnPerM: { readonly dc1: Readonly<Record<string, number>>; readonly dc2: number; readonly dw: number };
    readonly warnings: readonly string[];
  };
  readonly inputs: RateFile;
  readonly engineVersion: string;
  readonly policyVersion: string;
  readonly signConvention: string;
  readonly caution: string;
}

/** Factored capacity against factored demand along the span, ready to plot (kN·m per girder). */
export interface CapacityAlongSpan {
  readonly xM: readonly number[];
  readonly nominalMomentKnm: readonly number[];
  readonly factoredCapacityKnm: readonly number[];
  /** γDC (DC1 + DC2) + γDW DW + γLL (LL + IM) at each vehicle's first strength level (inventory for design loads). */
  readonly factoredDemandKnm: Readonly<Record<string, readonly number[]>>;
  /** The damage entries' lengths, to shade on the chart. */
  readonly damagedZonesM: readonly { readonly fromM: number; readonly toM: number; readonly damage: number }[];
}

const SHEAR_WARNING = 'shear not rated: this version rates flexure only';

/** The girder as rated: with the policy's effective flange width for the deck. */
function ratedGirder(file: RateFile, policy: RatingPolicy): { girder: Girder; warnings: string[] } {
  const deck = file.girder.deck!;
  if (policy.section.effectiveFlangeWidth === 'as-given') return { girder: file.girder, warnings: [] };
  const widthMm = tributaryWidthMm(file.span);
  const warnings = Math.abs(widthMm - deck.widthMm) > 0.5 ? [`deck width for strength and stiffness taken as the tributary width ${widthMm} mm (the policy), not ${deck.widthMm} mm`] : [];
  return { girder: { ...file.girder, deck: { ...deck, widthMm } }, warnings };
}

type SectionOptions = { haunchInSection: boolean; elasticModulusFormula: RateFile['options']['elasticModulusFormula'] };

/**
 * The section at any station: the damaged concrete acting there (built once per set of concrete
 * and deck damage), with the strands as they stand there — at their profile's height, lost where
 * broken or debonded, limited where they are still developing.
 */
function sectionsAlongSpan(file: RateFile, girder: Girder, options: SectionOptions, strands: SpanStrands) {
  const geometries = new Map<string, SectionGeometry>();
  const concreteDamage = file.damage.flatMap((entry, index) => (entry.kind === 'concrete-loss' || entry.kind === 'deck-loss' ? [index] : []));
  return (xMm: number): SectionModel => {
    const acting = concreteDamage.filter((index) => damageAt([file.damage[index]!], xMm).length > 0);
    const key = acting.join(',');
    let geometry = geometries.get(key);
    if (!geometry) {
      geometry = buildSectionGeometry({ girder, damage: acting.map((index) => file.damage[index]!), options });
      geometries.set(key, geometry);
    }
    const { states, development } = strandsAtMm(strands, xMm);
    return withSteel(geometry, { strandRows: rowsAtMm(strands, xMm), bars: girder.bars }, states, development);
  };
}

/** Each row's stress at nominal strength where it is fully developed (midspan of the sound girder), for the development lengths. */
function fullyDevelopedStressByRow(file: RateFile, girder: Girder, options: SectionOptions, strands: SpanStrands): number[] {
  const midspanMm = strands.spanLengthMm / 2;
  const { states } = applyStrandDamage(girder.strandRows, []);
  const model = withSteel(buildSectionGeometry({ girder, damage: [], options }), { strandRows: rowsAtMm(strands, midspanMm), bars: girder.bars }, states);
  return strainCompatibilityStrength(model, { strandCurve: file.options.strandCurve, concreteModel: file.options.concreteModel }).rows.map((row) => row.stressMpa);
}

function distributionFor(file: RateFile, sound: SectionModel): MomentDistributionResult {
  const { span, girder } = file;
  const deck = girder.deck!;
  return momentDistributionFactor({
    section: girder.section,
    position: span.position,
    distribution: span.distribution,
    spanLengthMm: span.lengthM * 1000,
    girderSpacingMm: span.girderSpacingMm,
    girderCount: span.girderCount,
    roadwayWidthMm: span.roadwayWidthMm,
    skewDeg: span.skewDeg,
    ...(span.barrierFaceToGirderMm !== undefined ? { barrierFaceToGirderMm: span.barrierFaceToGirderMm } : {}),
    overhangMm: span.overhangMm,
    hasDiaphragms: span.diaphragms.length > 0,
    deck: { thicknessMm: deck.thicknessMm, haunchMm: deck.haunchMm, nBeamToDeck: sound.girderConcrete.elasticModulusMpa / sound.deckConcrete!.elasticModulusMpa },
  });
}

/** Bottom-fibre stress of the effective prestress that remains, on the damaged girder section (tension positive). */
function prestressBottomStressMpa(model: SectionModel): number {
  const { areaMm2, centroidFromSoffitMm, bottomModulusMm3 } = model.girderSection;
  const forceN = model.strands.reduce((sum, layer) => sum + effectivePrestressForceN(layer), 0);
  if (forceN === 0) return 0;
  const forceY = model.strands.reduce((sum, layer) => sum + effectivePrestressForceN(layer) * layer.yMm, 0) / forceN;
  const eccentricityMm = centroidFromSoffitMm - forceY;
  return -forceN / areaMm2 - (forceN * eccentricityMm) / bottomModulusMm3;
}

interface VehicleLive {
  readonly vehicle: VehicleDefinition;
  /** Per girder, with IM and distribution, at each station, N·mm. */
  readonly momentsNmm: readonly number[];
}

/**
 * LRFR load rating of one girder line on a simple span (engineering.md §6–§7, AASHTO MBE 6A
 * [R]): dead loads per girder, the exact live-load envelope of each vehicle with IM and the
 * distribution factor, strain-compatibility capacity at every station with the damage acting
 * there, strength I at each level of the vehicle's category and Service III at the bottom fibre,
 * then the controlling rating and the posting loads. Takes a file `parseRateFile` accepted.
 */
export interface RateOptions {
  /** Rate only at these stations, plus the development points that fall among them (the strand-loss margin's local re-rating). */
  readonly onlyNearMm?: { readonly fromMm: number; readonly toMm: number };
  /** Leave out the strand-loss margin (it re-rates the girder line once per strand it takes). */
  readonly withoutMargin?: boolean;
}

export function rateGirderLine(file: RateFile, rateOptions: RateOptions = {}): RateOutput {
  const policy = policyOf(file);
  const { girder: widened, warnings: girderWarnings } = ratedGirder(file, policy);
  const { girder, losses } = withEffectivePrestress(file, widened, policy);
  const sectionOptions = {
    haunchInSection: file.options.haunchInSection ?? policy.section.haunchInSection,
    elasticModulusFormula: file.options.elasticModulusFormula ?? policy.section.elasticModulusFormula,
  };
  const spanStrands = planSpanStrands({ ...file, girder }, sectionDepthMm(girder.section));
  const modelAt = sectionsAlongSpan(file, girder, sectionOptions, spanStrands);
  const spanLengthMm = file.span.lengthM * 1000;
  const soundModel = withSteel(buildSectionGeometry({ girder, damage: [], options: sectionOptions }), girder, applyStrandDamage(girder.strandRows, []).states);
  const fpsByRow = fullyDevelopedStressByRow(file, girder, sectionOptions, spanStrands);
  const near = rateOptions.onlyNearMm;
  const stationsMm = ratingStationsMm(file.span, file.damage, developmentStationsMm(spanStrands, fpsByRow)).filter(
    (x) => !near || (x >= near.fromMm && x <= near.toMm),
  );
  const distribution = distributionFor(file, soundModel);
  const deadLoads = girderDeadLoads(girder, file.span, policy);
  const impactFactor = policy.liveLoad.impactFactor;
  const vehicles: VehicleLive[] = file.vehicles.map((reference, index) => {
    const vehicle = resolveVehicle(reference, `vehicles[${index}]`);
    const envelope = liveLoadMomentEnvelope({ spanLengthMm, stationsMm, vehicle, impactFactor });
    return { vehicle, momentsNmm: envelope.map((station) => station.totalMomentNmm * distribution.factor) };
  });
  // Only recorded damage counts as modelled; the strand-loss margin's trial breaks are hypothetical.
  const damageModelled = file.damage.some((entry) => !entry.hypothetical);
  const phiC = damageModelled && policy.resistance.conditionFactorWhenDamageModelled !== null
    ? policy.resistance.conditionFactorWhenDamageModelled
    : conditionFactor(policy, file.condition.superstructure);
  const phiS = systemFactor(policy, file.span.girderCount);
  const phiCPhiS = Math.max(phiC * phiS, policy.resistance.minimumPhiCPhiS);
  const capacityWarnings = new Set<string>();

  const stations = stationsMm.map((xMm, stationIndex) => {
    const damageIndexes = file.damage.flatMap((entry, i) => (damageAt([entry], xMm).length > 0 ? [i] : []));
    const model = modelAt(xMm);
    const strength = strainCompatibilityStrength(model, { strandCurve: file.options.strandCurve, concreteModel: file.options.concreteModel });
    strength.warnings.forEach((warning) => capacityWarnings.add(warning));
    model.warnings.forEach((warning) => capacityWarnings.add(warning));
    return rateStation({ file, policy, model, deadLoads, vehicles, xMm, stationIndex, spanLengthMm, strength, phiC, phiS, phiCPhiS, distribution, impactFactor, damageIndexes });
  });

  const controlling = controllingRatings(stations);
  const gammaDW = file.span.wearingSurface?.measured ? policy.deadLoad.gammaDWMeasured : policy.deadLoad.gammaDW;
  const capacityAlongSpan: CapacityAlongSpan = {
    xM: stations.map((station) => station.xM),
    nominalMomentKnm: stations.map((station) => station.nominalMomentKnm),
    factoredCapacityKnm: stations.map((station) => station.factoredCapacityKnm),
    factoredDemandKnm: Object.fromEntries(
      vehicles.map(({ vehicle }) => {
        const gammaLL = strengthLevels(vehicle.category, policy, file.traffic.adtt)[0]!.gammaLL;
        return [vehicle.id, stations.map((s) => policy.deadLoad.gammaDC * (s.momentsKnm.dc1 + s.momentsKnm.dc2) + gammaDW * s.momentsKnm.dw + gammaLL * s.momentsKnm.live[vehicle.id]!)];
      }),
    ),
    damagedZonesM: file.damage.map((entry, damage) => ({ fromM: entry.fromM!, toM: entry.toM!, damage })),
  };
  return {
    stations,
    summary: {
      controlling,
      capacityAlongSpan,
      ...(rateOptions.withoutMargin || near ? {} : { strandLossMargin: strandLossMargin(file, stations, controlling, spanStrands, fpsByRow) }),
      posting: postings(controlling, vehicles, policy),
      distribution,
      ...(losses ? { effectivePrestress: losses } : {}),
      deadLoadsKnPerM: { dc1: deadLoads.dc1Parts, dc2: deadLoads.dc2UniformNPerMm, dw: deadLoads.dwUniformNPerMm },
      warnings: [SHEAR_WARNING, ...girderWarnings, ...distribution.warnings, ...capacityWarnings],
    },
    inputs: { ...file, girder },
    engineVersion: ENGINE_VERSION,
    policyVersion: `${policy.id}@${policy.version}`,
    signConvention: 'stresses: tension positive; moments: sagging positive',
    caution: RESULT_CAUTION,
  };
}

interface StationContext {
  readonly file: RateFile;
  readonly policy: RatingPolicy;
  readonly model: SectionModel;
  readonly deadLoads: GirderDeadLoads;
  readonly vehicles: readonly VehicleLive[];
  readonly xMm: number;
  readonly stationIndex: number;
  readonly spanLengthMm: number;
  readonly strength: ReturnType<typeof strainCompatibilityStrength>;
  readonly phiC: number;
  readonly phiS: number;
  readonly phiCPhiS: number;
  readonly distribution: MomentDistributionResult;
  readonly impactFactor: number;
  readonly damageIndexes: readonly number[];
}

function rateStation(context: StationContext): RatingStation {
  const { policy, model, strength, vehicles, stationIndex } = context;
  const dead = deadLoadMomentsAt(context.deadLoads, context.spanLengthMm, context.xMm);
  const capacityNmm = context.phiCPhiS * strength.phi * strength.nominalMomentKnm * 1e6;
  const girderBottom = model.girderSection.bottomModulusMm3;
  const compositeBottom = model.compositeSection!.bottomModulusMm3;
  const prestressMpa = prestressBottomStressMpa(model);
  const dc1Mpa = dead.dc1Nmm / girderBottom;
  const dc2Mpa = dead.dc2Nmm / compositeBottom;
  const dwMpa = dead.dwNmm / compositeBottom;
  const allowableTensionMpa = serviceTensionLimitMpa(model.girderConcrete.strengthMpa, policy.serviceIII.tensionCoefficientSqrtMpa, policy.serviceIII.tensionCapMpa ?? Infinity);
  const gammaDW = context.file.span.wearingSurface?.measured ? policy.deadLoad.gammaDWMeasured : policy.deadLoad.gammaDW;

  const live: Record<string, number> = {};
  const liveStress: Record<string, number> = {};
  const ratingFactors: RatingStation['ratingFactors'] = {};
  for (const { vehicle, momentsNmm } of vehicles) {
    const liveNmm = momentsNmm[stationIndex]!;
    live[vehicle.id] = liveNmm / 1e6;
    liveStress[vehicle.id] = liveNmm / compositeBottom;
    const factors: Partial<Record<RatingFactorKey, number>> = {};
    for (const level of strengthLevels(vehicle.category, policy, context.file.traffic.adtt)) {
      factors[level.key] = strengthRatingFactor(
        { capacityNmm, dcNmm: dead.dc1Nmm + dead.dc2Nmm, dwNmm: dead.dwNmm, liveNmm },
        { gammaDC: policy.deadLoad.gammaDC, gammaDW, gammaLL: level.gammaLL },
      );
    }
    for (const level of serviceLevels(vehicle.category, policy)) {
      factors[level.key] = serviceRatingFactor(
        { allowableTensionMpa, deadAndPrestressMpa: prestressMpa + dc1Mpa + dc2Mpa + dwMpa, liveMpa: liveNmm / compositeBottom },
        level.gammaLL,
      );
    }
    ratingFactors[vehicle.id] = factors;
  }
  return {
    xM: context.xMm / 1000,
    nominalMomentKnm: strength.nominalMomentKnm,
    phi: strength.phi,
    conditionFactor: context.phiC,
    systemFactor: context.phiS,
    factoredCapacityKnm: capacityNmm / 1e6,
    momentsKnm: { dc1: dead.dc1Nmm / 1e6, dc2: dead.dc2Nmm / 1e6, dw: dead.dwNmm / 1e6, live },
    distributionFactor: context.distribution.factor,
    impactFactor: context.impactFactor,
    bottomStressMpa: { prestress: prestressMpa, dc1: dc1Mpa, dc2: dc2Mpa, dw: dwMpa, live: liveStress },
    allowableTensionMpa,
    ratingFactors,
    rows: strength.rows,
    damageApplied: context.damageIndexes,
  };
}

/** The lowest rating factor of each vehicle at each level and limit state, with its station. */
export function controllingRatings(stations: readonly RatingStation[]): ControllingRating[] {
  const lowest = new Map<string, ControllingRating>();
  for (const station of stations) {
    for (const vehicle in station.ratingFactors) {
      const factors = station.ratingFactors[vehicle]!;
      for (const key in factors) {
        const ratingFactor = factors[key as RatingFactorKey]!;
        const id = vehicle + '/' + key;
        const current = lowest.get(id);
        if (!current || ratingFactor < current.ratingFactor) {
          const limitState = key.startsWith('service') ? 'service-iii' : 'strength-i';
          lowest.set(id, { vehicle, level: levelOf(key as RatingFactorKey), limitState, ratingFactor, xM: station.xM });
        }
      }
    }
  }
  return [...lowest.values()];
}

/** The lowest legal-level rating factor of each vehicle, over the limit states the policy rates. */
function lowestLegalRatings(controlling: readonly ControllingRating[]): ControllingRating[] {
  const lowest = new Map<string, ControllingRating>();
  for (const rating of controlling) {
    if (rating.level !== 'legal') continue;
    const current = lowest.get(rating.vehicle);
    if (!current || rating.ratingFactor < current.ratingFactor) lowest.set(rating.vehicle, rating);
  }
  return [...lowest.values()];
}

/** Posting loads for the legal-level vehicles whose controlling rating factor is below 1.0. */
function postings(controlling: readonly ControllingRating[], vehicles: readonly VehicleLive[], policy: RatingPolicy): RateOutput['summary']['posting'] {
  return lowestLegalRatings(controlling)
    .filter((rating) => rating.ratingFactor < 1)
    .map((rating) => {
      const vehicle = vehicles.find((candidate) => candidate.vehicle.id === rating.vehicle)!.vehicle;
      return { vehicle: rating.vehicle, ratingFactor: rating.ratingFactor, ...postingLoad(rating.ratingFactor, vehicle.weightKn, policy) };
    });
}
