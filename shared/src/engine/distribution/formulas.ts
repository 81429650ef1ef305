import { EngineInputError } from '../materials';

/**
 * Rows of AASHTO LRFD Tables 4.6.2.2.2b-1 (interior girders, moment), 4.6.2.2.2d-1 (exterior
 * girders) and 4.6.2.2.2e-1 (skew), SI forms, lengths in mm, factors in lanes per girder with
 * multiple presence inside [R — recalled; confirm against the adopted edition]. Each formula
 * refuses values outside its published range of applicability.
 */

/** Where a refusal points: the file asked for the formula, so the method is what must change. */
export const DISTRIBUTION_METHOD_PATH = 'span.distribution.method';

/** Skew above which the skew tables say to use 60°. */
const SKEW_CAP_DEG = 60;
/** Table 4.6.2.2.2e-1 [R]: below this skew the beam-slab reduction c1 is 0. */
const BEAM_SLAB_SKEW_THRESHOLD_DEG = 30;

/** Factors for one loaded lane and for two or more, before skew. */
export interface LaneFactors {
  readonly oneLane: number;
  readonly multiLane: number;
}

interface RangeLimit {
  readonly symbol: string;
  readonly value: number;
  readonly unit: string;
  readonly min?: number;
  readonly max?: number;
}

const quantity = (value: number): string =>
  Math.abs(value) >= 1e6 ? Number(value.toPrecision(4)).toExponential() : String(Number(value.toFixed(1)));

function describeRange({ symbol, unit, min, max }: RangeLimit): string {
  const unitText = unit === '' ? '' : ` ${unit}`;
  if (min !== undefined && max !== undefined) return `${quantity(min)} ≤ ${symbol} ≤ ${quantity(max)}${unitText}`;
  if (min !== undefined) return `${symbol} ≥ ${quantity(min)}${unitText}`;
  return `${symbol} ≤ ${quantity(max!)}${unitText}`;
}

const isOutside = ({ value, min, max }: RangeLimit): boolean =>
  (min !== undefined && !(value >= min)) || (max !== undefined && !(value <= max));

/** Throws naming every parameter outside its range, and the two ways forward. */
function requireWithinRanges(formula: string, limits: readonly RangeLimit[]): void {
  const outside = limits.filter(isOutside);
  if (outside.length === 0) return;
  const problems = outside.map((limit) => `${limit.symbol} = ${quantity(limit.value)}${limit.unit === '' ? '' : ` ${limit.unit}`} is outside ${describeRange(limit)}`);
  throw new EngineInputError(
    DISTRIBUTION_METHOD_PATH,
    `${problems.join('; ')}: outside the range of the ${formula}; choose "lever" or a user value ({ "method": "user", "moment": … })`,
  );
}

/** Inputs of the beam-and-slab row (types a, e, k; i, j acting as a unit). */
export interface BeamSlabParameters {
  readonly girderSpacingMm: number;
  readonly spanLengthMm: number;
  /** ts, structural depth of the deck. */
  readonly deckThicknessMm: number;
  /** Kg = n (I + A eg²), n = Ec,beam / Ec,deck. */
  readonly longitudinalStiffnessMm4: number;
  readonly girderCount: number;
}

const stiffnessRatio = (p: BeamSlabParameters): number => p.longitudinalStiffnessMm4 / (p.spanLengthMm * p.deckThicknessMm ** 3);

/**
 * Interior girder, Table 4.6.2.2.2b-1 types a, e, k (and i, j when connected to act as a unit)
 * [R]: one lane 0.06 + (S/4300)^0.4 (S/L)^0.3 (Kg/(L ts³))^0.1, two or more lanes
 * 0.075 + (S/2900)^0.6 (S/L)^0.2 (Kg/(L ts³))^0.1; for 1100 ≤ S ≤ 4900, 110 ≤ ts ≤ 300,
 * 6000 ≤ L ≤ 73 000, Nb ≥ 4, 4×10⁹ ≤ Kg ≤ 3×10¹² (mm, mm⁴).
 */
export function beamSlabMomentFactors(p: BeamSlabParameters): LaneFactors {
  requireWithinRanges('type a, e, k formula of AASHTO LRFD Table 4.6.2.2.2b-1', [
    { symbol: 'S', value: p.girderSpacingMm, unit: 'mm', min: 1100, max: 4900 },
    { symbol: 'ts', value: p.deckThicknessMm, unit: 'mm', min: 110, max: 300 },
    { symbol: 'L', value: p.spanLengthMm, unit: 'mm', min: 6000, max: 73_000 },
    { symbol: 'Nb', value: p.girderCount, unit: '', min: 4 },
    { symbol: 'Kg', value: p.longitudinalStiffnessMm4, unit: 'mm⁴', min: 4e9, max: 3e12 },
  ]);
  const { girderSpacingMm: s, spanLengthMm: l } = p;
  const stiffnessTerm = stiffnessRatio(p) ** 0.1;
  return {
    oneLane: 0.06 + (s / 4300) ** 0.4 * (s / l) ** 0.3 * stiffnessTerm,
    multiLane: 0.075 + (s / 2900) ** 0.6 * (s / l) ** 0.2 * stiffnessTerm,
  };
}

/** A skew reduction and the c1 it used (c1 only for the beam-slab row). */
export interface SkewCorrection {
  readonly correction: number;
  readonly c1: number | null;
}

/**
 * Skew reduction of the beam-slab row, Table 4.6.2.2.2e-1 [R]: 1 − c1 (tan θ)^1.5 with
 * c1 = 0.25 (Kg/(L ts³))^0.25 (S/L)^0.5, c1 = 0 for θ < 30°, and θ = 60° for larger skews.
 */
export function beamSlabSkewCorrection(p: BeamSlabParameters, skewDeg: number): SkewCorrection {
  if (skewDeg < BEAM_SLAB_SKEW_THRESHOLD_DEG) return { correction: 1, c1: 0 };
  const c1 = 0.25 * stiffnessRatio(p) ** 0.25 * (p.girderSpacingMm / p.spanLengthMm) ** 0.5;
  const thetaRad = (Math.min(skewDeg, SKEW_CAP_DEG) * Math.PI) / 180;
  return { correction: 1 - c1 * Math.tan(thetaRad) ** 1.5, c1 };
}

/**
 * Skew reduction of the box and slab rows (types b, c, d, f, g), Table 4.6.2.2.2e-1 [R, from
 * memory — verify]: 1.05 − 0.25 tan θ ≤ 1.0, θ = 60° for larger skews.
 */
export function boxSkewCorrection(skewDeg: number): SkewCorrection {
  const thetaRad = (Math.min(skewDeg, SKEW_CAP_DEG) * Math.PI) / 180;
  return { correction: Math.min(1, 1.05 - 0.25 * Math.tan(thetaRad)), c1: null };
}

/** Inputs of the spread box row (types b, c). */
export interface SpreadBoxParameters {
  readonly girderSpacingMm: number;
  readonly spanLengthMm: number;
  /** d, depth of the box beam. */
  readonly beamDepthMm: number;
  readonly girderCount: number;
}

/**
 * Interior spread box beam, Table 4.6.2.2.2b-1 types b, c [R, from memory — verify]: one lane
 * (S/910)^0.35 (S d/L²)^0.25, two or more (S/1900)^0.6 (S d/L²)^0.125; for 1800 ≤ S ≤ 5500,
 * 6000 ≤ L ≤ 43 000, 450 ≤ d ≤ 1700 (mm), Nb ≥ 3.
 */
export function spreadBoxMomentFactors(p: SpreadBoxParameters): LaneFactors {
  requireWithinRanges('type b, c formula of AASHTO LRFD Table 4.6.2.2.2b-1', [
    { symbol: 'S', value: p.girderSpacingMm, unit: 'mm', min: 1800, max: 5500 },
    { symbol: 'L', value: p.spanLengthMm, unit: 'mm', min: 6000, max: 43_000 },
    { symbol: 'd', value: p.beamDepthMm, unit: 'mm', min: 450, max: 1700 },
    { symbol: 'Nb', value: p.girderCount, unit: '', min: 3 },
  ]);
  const { girderSpacingMm: s, spanLengthMm: l, beamDepthMm: d } = p;
  const depthTerm = (s * d) / l ** 2;
  return { oneLane: (s / 910) ** 0.35 * depthTerm ** 0.25, multiLane: (s / 1900) ** 0.6 * depthTerm ** 0.125 };
}

/** Inputs of the adjacent beam row (types f, g). */
export interface AdjacentBeamParameters {
  /** b, width of one beam. */
  readonly beamWidthMm: number;
  readonly spanLengthMm: number;
  readonly inertiaMm4: number;
  /** J, St Venant torsion constant of one beam. */
  readonly torsionConstantMm4: number;
  readonly girderCount: number;
}

/** The adjacent-beam row's factors and its k = 2.5 Nb^−0.2 ≥ 1.5. */
export interface AdjacentBeamFactors extends LaneFactors {
  readonly k: number;
}

/**
 * Interior adjacent box beam or voided slab, Table 4.6.2.2.2b-1 types f, g (connected to act as
 * a unit) [R, from memory — verify]: one lane k (b/2.8L)^0.5 (I/J)^0.25, two or more
 * k (b/7600)^0.6 (b/L)^0.2 (I/J)^0.06, k = 2.5 Nb^−0.2 ≥ 1.5; for 900 ≤ b ≤ 1500,
 * 6000 ≤ L ≤ 37 000 (mm), 5 ≤ Nb ≤ 20.
 */
export function adjacentBeamMomentFactors(p: AdjacentBeamParameters): AdjacentBeamFactors {
  requireWithinRanges('type f, g formula of AASHTO LRFD Table 4.6.2.2.2b-1', [
    { symbol: 'b', value: p.beamWidthMm, unit: 'mm', min: 900, max: 1500 },
    { symbol: 'L', value: p.spanLengthMm, unit: 'mm', min: 6000, max: 37_000 },
    { symbol: 'Nb', value: p.girderCount, unit: '', min: 5, max: 20 },
  ]);
  const { beamWidthMm: b, spanLengthMm: l } = p;
  const k = Math.max(1.5, 2.5 * p.girderCount ** -0.2);
  const torsionRatio = p.inertiaMm4 / p.torsionConstantMm4;
  return {
    k,
    oneLane: k * (b / (2.8 * l)) ** 0.5 * torsionRatio ** 0.25,
    multiLane: k * (b / 7600) ** 0.6 * (b / l) ** 0.2 * torsionRatio ** 0.06,
  };
}

/**
 * Exterior girder, two or more lanes, beam-slab row of Table 4.6.2.2.2d-1 [R]: e = 0.77 + de/2800
 * for −300 ≤ de ≤ 1700 mm, de from the exterior web's centreline to the inside face of the
 * barrier, positive when the web is inside the barrier.
 */
export function beamSlabExteriorFactor(deMm: number): number {
  requireWithinRanges('exterior-girder e factor of AASHTO LRFD Table 4.6.2.2.2d-1 (types a, e, k)', [
    { symbol: 'de', value: deMm, unit: 'mm', min: -300, max: 1700 },
  ]);
  return 0.77 + deMm / 2800;
}

/** Exterior spread box, two or more lanes, Table 4.6.2.2.2d-1 types b, c [R, from memory — verify]: e = 0.97 + de/8700, 0 ≤ de ≤ 1400 mm. */
export function spreadBoxExteriorFactor(deMm: number): number {
  requireWithinRanges('exterior-girder e factor of AASHTO LRFD Table 4.6.2.2.2d-1 (types b, c)', [
    { symbol: 'de', value: deMm, unit: 'mm', min: 0, max: 1400 },
  ]);
  return 0.97 + deMm / 8700;
}

/**
 * Exterior adjacent beam, Table 4.6.2.2.2d-1 types f, g [R, from memory — verify]: one lane
 * e = 1.125 + de/9100 ≥ 1.0, two or more e = 1.04 + de/7600 ≥ 1.0, de ≤ 600 mm; each times the
 * interior factor for the same lanes.
 */
export function adjacentBeamExteriorFactors(deMm: number): LaneFactors {
  requireWithinRanges('exterior-girder e factor of AASHTO LRFD Table 4.6.2.2.2d-1 (types f, g)', [
    { symbol: 'de', value: deMm, unit: 'mm', max: 600 },
  ]);
  return { oneLane: Math.max(1, 1.125 + deMm / 9100), multiLane: Math.max(1, 1.04 + deMm / 7600) };
}
