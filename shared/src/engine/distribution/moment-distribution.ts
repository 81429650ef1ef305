import { EngineInputError } from '../materials';
import { sectionDepthMm, sectionProperties, shapeToPolygons, type SectionShape } from '../section';
import { TABLE_ROW, crossSectionTypeOf, type CrossSectionType } from './cross-section';
import {
  adjacentBeamExteriorFactors,
  adjacentBeamMomentFactors,
  beamSlabExteriorFactor,
  beamSlabMomentFactors,
  beamSlabSkewCorrection,
  boxSkewCorrection,
  spreadBoxExteriorFactor,
  spreadBoxMomentFactors,
  type BeamSlabParameters,
  type LaneFactors,
  type SkewCorrection,
} from './formulas';
import { numberOfDesignLanes } from './lanes';
import { exteriorLeverRule, interiorLeverRule, type LeverRuleCase } from './lever-rule';
import { exteriorRigidBody, type RigidBodyCase } from './rigid-body';
import { userDistributionSchema, type SpanDistribution } from './schema';
import { torsionConstantMm4, type AdjacentBeamSection } from './torsion';

/** The cast-in-place deck as the distribution formulas see it. */
export interface DistributionDeck {
  /** ts, structural thickness (no wearing surface). */
  readonly thicknessMm: number;
  /** Haunch between the girder's top and the deck's underside; it lengthens eg. */
  readonly haunchMm?: number;
  /** n = Ec,beam / Ec,deck, for Kg. */
  readonly nBeamToDeck: number;
}

/** Inputs, named after the calculation file's `girder` and `span` keys (calc-file.md), SI in mm. */
export interface MomentDistributionInput {
  /** `girder.section`: chooses the cross-section type for the formula method. */
  readonly section: SectionShape;
  /** `span.position`. */
  readonly position: 'interior' | 'exterior';
  /** `span.distribution`. */
  readonly distribution: SpanDistribution;
  /** `span.lengthM` in mm. */
  readonly spanLengthMm: number;
  readonly girderSpacingMm: number;
  readonly girderCount: number;
  readonly roadwayWidthMm: number;
  /** `span.skewDeg`; 0 when absent. */
  readonly skewDeg?: number;
  /** de: exterior girder centreline to the barrier's inside face, positive when the girder is inside the barrier. Needed for exterior girders. */
  readonly barrierFaceToGirderMm?: number;
  /** Girder centreline to the deck edge; when given, the barrier face must lie on the deck. */
  readonly overhangMm?: number;
  /** Whether `span.diaphragms` has any: then the exterior girder gets the rigid-body check. */
  readonly hasDiaphragms?: boolean;
  /** `girder.deck`, when there is one. */
  readonly deck?: DistributionDeck;
  /** Kg given by the caller; wins over the value from the section. */
  readonly longitudinalStiffnessMm4?: number;
  /** J given by the caller; wins over the approximations of `torsionConstantMm4`. */
  readonly torsionConstantMm4?: number;
}

/** Intermediate values, for a checker to sign. */
export interface DistributionDetails {
  /** floor(roadway / 3600 mm), at least 1; null for a user value. */
  readonly designLanes: number | null;
  readonly crossSectionType?: CrossSectionType;
  /** Kg = n (I + A eg²). */
  readonly longitudinalStiffnessMm4?: number;
  /** eg, centroid of the beam to the centroid of the deck (when Kg is computed here). */
  readonly centroidDistanceMm?: number;
  readonly torsionConstantMm4?: number;
  /** k = 2.5 Nb^−0.2 ≥ 1.5 of the adjacent-beam row. */
  readonly adjacentBeamK?: number;
  /** The interior-girder formula's factors, before skew. */
  readonly interior?: LaneFactors;
  /** Exterior e factors (null where the lever rule is used instead). */
  readonly exteriorE?: { readonly oneLane: number | null; readonly multiLane: number | null };
  readonly skewC1?: number | null;
  readonly leverRule?: readonly LeverRuleCase[];
  readonly rigidBody?: readonly RigidBodyCase[];
}

export interface MomentDistributionResult {
  /** Live-load moment distribution factor for the girder, lanes per girder: the governing case. */
  readonly factor: number;
  readonly method: 'formula' | 'lever' | 'user';
  /** One loaded lane, skew and any rigid-body check applied; null for a user value. */
  readonly oneLane: number | null;
  /** Two or more loaded lanes, likewise; null with fewer than two design lanes or a user value. */
  readonly multiLane: number | null;
  readonly governing: 'one-lane' | 'multi-lane' | 'user';
  /** The skew reduction applied to the table's factors (1 for the lever rule and a user value). */
  readonly skewCorrection: number;
  /** The factors include multiple presence: do not apply it again to the live load. */
  readonly multiplePresenceIncluded: true;
  readonly details: DistributionDetails;
  readonly warnings: readonly string[];
}

/**
 * Live-load moment distribution factor of one girder (engineering.md §6):
 * - `formula`: AASHTO LRFD Table 4.6.2.2.2b-1 (interior) and 4.6.2.2.2d-1 (exterior) SI forms,
 *   the row chosen from the girder's shape (`crossSectionTypeOf`), with the skew reduction of
 *   Table 4.6.2.2.2e-1; refuses values outside a formula's range (`span.distribution.method`);
 * - `lever`: the lever rule for the girder, one lane and every greater number of design lanes,
 *   with multiple presence (Table 3.6.1.1.2-1); no skew reduction (conservative);
 * - `user`: the given factor, recorded in a warning.
 * Exterior girders on spans with diaphragms are never below the rigid-body result (4.6.2.2.2d).
 * Design lanes floor(roadway / 3600 mm) (3.6.1.1.1). All [R — recalled; confirm against the adopted edition].
 */
export function momentDistributionFactor(input: MomentDistributionInput): MomentDistributionResult {
  const { distribution } = input;
  if (distribution.method === 'user') return userFactor(distribution.moment);
  checkSpan(input);
  const warnings = laneCountWarnings(input.roadwayWidthMm);
  const outcome = distribution.method === 'formula' ? formulaMethod(input) : leverMethod(input);
  const withRigidBody = applyRigidBody(input, outcome);
  return {
    ...governingOf(withRigidBody.oneLane, withRigidBody.multiLane),
    method: distribution.method,
    oneLane: withRigidBody.oneLane,
    multiLane: withRigidBody.multiLane,
    skewCorrection: outcome.skewCorrection,
    multiplePresenceIncluded: true,
    details: withRigidBody.details,
    warnings: [...warnings, ...outcome.warnings],
  };
}

/** A method's result before the governing case is chosen. */
interface MethodOutcome {
  readonly designLanes: number;
  readonly oneLane: number;
  readonly multiLane: number | null;
  readonly skewCorrection: number;
  readonly details: DistributionDetails;
  readonly warnings: readonly string[];
}

function userFactor(moment: number): MomentDistributionResult {
  const parsed = userDistributionSchema.safeParse({ method: 'user', moment });
  if (!parsed.success) throw new EngineInputError('span.distribution.moment', parsed.error.issues[0]!.message);
  return {
    factor: moment,
    method: 'user',
    oneLane: null,
    multiLane: null,
    governing: 'user',
    skewCorrection: 1,
    multiplePresenceIncluded: true,
    details: { designLanes: null },
    warnings: [`distribution factor given by the user: ${moment}`],
  };
}

function governingOf(oneLane: number, multiLane: number | null): Pick<MomentDistributionResult, 'factor' | 'governing'> {
  if (multiLane !== null && multiLane > oneLane) return { factor: multiLane, governing: 'multi-lane' };
  return { factor: oneLane, governing: 'one-lane' };
}

function requireThat(ok: boolean, path: string, problem: string): void {
  if (!ok) throw new EngineInputError(path, problem);
}

function checkSpan(input: MomentDistributionInput): void {
  requireThat(input.spanLengthMm > 0, 'span.lengthM', 'must be > 0');
  requireThat(input.girderSpacingMm > 0, 'span.girderSpacingMm', 'must be > 0');
  requireThat(Number.isInteger(input.girderCount) && input.girderCount >= 2, 'span.girderCount', 'must be a whole number >= 2');
  requireThat(input.roadwayWidthMm > 0, 'span.roadwayWidthMm', 'must be > 0');
  const skewDeg = input.skewDeg ?? 0;
  requireThat(skewDeg >= 0 && skewDeg < 90, 'span.skewDeg', 'must be >= 0 and < 90');
  if (input.longitudinalStiffnessMm4 !== undefined) requireThat(input.longitudinalStiffnessMm4 > 0, 'span.longitudinalStiffnessMm4', 'must be > 0');
  if (input.torsionConstantMm4 !== undefined) requireThat(input.torsionConstantMm4 > 0, 'span.torsionConstantMm4', 'must be > 0');
  if (input.deck !== undefined) requireThat(input.deck.nBeamToDeck > 0, 'girder.deck', 'the modular ratio Ec,beam / Ec,deck must be > 0');
  if (input.position === 'exterior') checkBarrier(input);
}

function checkBarrier({ barrierFaceToGirderMm, overhangMm }: MomentDistributionInput): void {
  requireThat(
    barrierFaceToGirderMm !== undefined && Number.isFinite(barrierFaceToGirderMm),
    'span.barrierFaceToGirderMm',
    'an exterior girder needs the distance from its centreline to the barrier face (positive when the girder is inside the barrier)',
  );
  if (overhangMm !== undefined) {
    requireThat(barrierFaceToGirderMm! <= overhangMm, 'span.barrierFaceToGirderMm', `the barrier face must lie on the deck: at most overhangMm (${overhangMm} mm)`);
  }
}

/** The spec counts floor(w / 3600); LRFD 3.6.1.1.1 as recalled makes 6000–7200 mm roadways two half-width lanes. */
function laneCountWarnings(roadwayWidthMm: number): string[] {
  if (roadwayWidthMm < 6000 || roadwayWidthMm >= 7200) return [];
  return [
    `roadway ${roadwayWidthMm} mm counts as one design lane (floor(w / 3600 mm)); AASHTO LRFD 3.6.1.1.1 as recalled gives roadways of 6000–7200 mm two lanes of half the width — from memory — verify`,
  ];
}

/** de of an exterior girder; checkBarrier has made sure it is given. */
function barrierDistanceMm(input: MomentDistributionInput): number {
  return input.barrierFaceToGirderMm!;
}

function lanesToLoad(designLanes: number): number[] {
  return Array.from({ length: designLanes }, (_, index) => index + 1);
}

const maxOf = (values: readonly number[]): number | null => (values.length === 0 ? null : Math.max(...values));

/** The lever rule for every number of loaded lanes the roadway holds. */
function leverMethod(input: MomentDistributionInput): MethodOutcome {
  const designLanes = numberOfDesignLanes(input.roadwayWidthMm);
  const cases = lanesToLoad(designLanes).map((loadedLanes) =>
    input.position === 'exterior'
      ? exteriorLeverRule({ girderSpacingMm: input.girderSpacingMm, barrierFaceToGirderMm: barrierDistanceMm(input), loadedLanes })
      : interiorLeverRule({ girderSpacingMm: input.girderSpacingMm, loadedLanes }),
  );
  const skewWarnings = (input.skewDeg ?? 0) > 0 ? ['skew reduction not applied to the lever rule (conservative)'] : [];
  return {
    designLanes,
    oneLane: cases[0]!.factor,
    multiLane: maxOf(cases.slice(1).map((leverCase) => leverCase.factor)),
    skewCorrection: 1,
    details: { designLanes, leverRule: cases },
    warnings: skewWarnings,
  };
}

/** Exterior girders with diaphragms: each lane count's factor is at least the rigid-body one. */
function applyRigidBody(input: MomentDistributionInput, outcome: MethodOutcome): MethodOutcome {
  if (input.position !== 'exterior' || !input.hasDiaphragms) return outcome;
  const cases = lanesToLoad(outcome.designLanes).map((loadedLanes) =>
    exteriorRigidBody({ girderSpacingMm: input.girderSpacingMm, girderCount: input.girderCount, barrierFaceToGirderMm: barrierDistanceMm(input), loadedLanes }),
  );
  const multiRigid = maxOf(cases.slice(1).map((rigidCase) => rigidCase.factor));
  return {
    ...outcome,
    oneLane: Math.max(outcome.oneLane, cases[0]!.factor),
    multiLane: outcome.multiLane === null || multiRigid === null ? outcome.multiLane : Math.max(outcome.multiLane, multiRigid),
    details: { ...outcome.details, rigidBody: cases },
  };
}

/** A table row's factors for the girder before skew (multiLane null when only one lane is loaded), and what a checker needs to see. */
interface RowOutcome {
  readonly factors: { readonly oneLane: number; readonly multiLane: number | null };
  readonly skew: SkewCorrection;
  readonly details: Omit<DistributionDetails, 'designLanes' | 'crossSectionType' | 'skewC1'>;
  readonly warnings: readonly string[];
}

function formulaMethod(input: MomentDistributionInput): MethodOutcome {
  const designLanes = numberOfDesignLanes(input.roadwayWidthMm);
  const choice = crossSectionTypeOf(input.section, { girderSpacingMm: input.girderSpacingMm, hasDeck: input.deck !== undefined });
  const multiLaneLoaded = designLanes >= 2;
  const row = rowOutcome(input, choice.type, multiLaneLoaded);
  const { correction } = row.skew;
  const { oneLane, multiLane } = row.factors;
  return {
    designLanes,
    oneLane: oneLane * correction,
    multiLane: multiLaneLoaded && multiLane !== null ? multiLane * correction : null,
    skewCorrection: correction,
    details: { designLanes, crossSectionType: choice.type, skewC1: row.skew.c1, ...row.details },
    warnings: [...choice.warnings, ...row.warnings, ...skewCapWarnings(input.skewDeg ?? 0)],
  };
}

function skewCapWarnings(skewDeg: number): string[] {
  return skewDeg > 60 ? [`skew ${skewDeg}° exceeds 60°: the skew reduction uses 60° (AASHTO LRFD Table 4.6.2.2.2e-1)`] : [];
}

function rowOutcome(input: MomentDistributionInput, type: CrossSectionType, multiLaneLoaded: boolean): RowOutcome {
  switch (TABLE_ROW[type]) {
    case 'beam-slab':
      return beamSlabRow(input, multiLaneLoaded);
    case 'spread-box':
      return spreadBoxRow(input, multiLaneLoaded);
    case 'adjacent':
      return adjacentRow(input, multiLaneLoaded);
  }
}

const FROM_MEMORY = (rows: string) =>
  `the ${rows} rows of AASHTO LRFD Tables 4.6.2.2.2b-1, 4.6.2.2.2d-1 and 4.6.2.2.2e-1 are from memory — verify against the adopted edition`;

/** Kg = n (I + A eg²) of the girder under its deck, or the caller's Kg. */
function longitudinalStiffness(input: MomentDistributionInput, deck: DistributionDeck): { kgMm4: number; egMm?: number } {
  if (input.longitudinalStiffnessMm4 !== undefined) return { kgMm4: input.longitudinalStiffnessMm4 };
  const beam = sectionProperties(shapeToPolygons(input.section));
  const egMm = beam.topYMm - beam.centroidFromSoffitMm + (deck.haunchMm ?? 0) + deck.thicknessMm / 2;
  return { kgMm4: deck.nBeamToDeck * (beam.inertiaMm4 + beam.areaMm2 * egMm ** 2), egMm };
}

function beamSlabRow(input: MomentDistributionInput, multiLaneLoaded: boolean): RowOutcome {
  const deck = input.deck!; // crossSectionTypeOf refuses the beam-slab types without a deck
  const { kgMm4, egMm } = longitudinalStiffness(input, deck);
  const parameters: BeamSlabParameters = {
    girderSpacingMm: input.girderSpacingMm,
    spanLengthMm: input.spanLengthMm,
    deckThicknessMm: deck.thicknessMm,
    longitudinalStiffnessMm4: kgMm4,
    girderCount: input.girderCount,
  };
  const interior = beamSlabMomentFactors(parameters);
  const stiffnessDetails = { longitudinalStiffnessMm4: kgMm4, ...(egMm === undefined ? {} : { centroidDistanceMm: egMm }) };
  const skew = beamSlabSkewCorrection(parameters, input.skewDeg ?? 0);
  if (input.position === 'interior') return { factors: interior, skew, details: { ...stiffnessDetails, interior }, warnings: [] };
  const exterior = leverOneLaneWithE(input, interior, multiLaneLoaded, beamSlabExteriorFactor);
  return { factors: exterior.factors, skew, details: { ...stiffnessDetails, interior, ...exterior.details }, warnings: [] };
}

function spreadBoxRow(input: MomentDistributionInput, multiLaneLoaded: boolean): RowOutcome {
  const interior = spreadBoxMomentFactors({
    girderSpacingMm: input.girderSpacingMm,
    spanLengthMm: input.spanLengthMm,
    beamDepthMm: sectionDepthMm(input.section),
    girderCount: input.girderCount,
  });
  const skew = boxSkewCorrection(input.skewDeg ?? 0);
  const warnings = [FROM_MEMORY('type b, c (spread box)')];
  if (input.position === 'interior') return { factors: interior, skew, details: { interior }, warnings };
  const exterior = leverOneLaneWithE(input, interior, multiLaneLoaded, spreadBoxExteriorFactor);
  return { factors: exterior.factors, skew, details: { interior, ...exterior.details }, warnings };
}

/** Exterior beam-slab and spread-box girders: lever rule for one lane, e × interior for more. */
function leverOneLaneWithE(
  input: MomentDistributionInput,
  interior: LaneFactors,
  multiLaneLoaded: boolean,
  exteriorFactor: (deMm: number) => number,
): Pick<RowOutcome, 'factors'> & { details: Pick<DistributionDetails, 'exteriorE' | 'leverRule'> } {
  const lever = exteriorLeverRule({ girderSpacingMm: input.girderSpacingMm, barrierFaceToGirderMm: barrierDistanceMm(input), loadedLanes: 1 });
  const e = multiLaneLoaded ? exteriorFactor(barrierDistanceMm(input)) : null;
  return {
    factors: { oneLane: lever.factor, multiLane: e === null ? null : e * interior.multiLane },
    details: { exteriorE: { oneLane: null, multiLane: e }, leverRule: [lever] },
  };
}

function adjacentRow(input: MomentDistributionInput, multiLaneLoaded: boolean): RowOutcome {
  const section = input.section as AdjacentBeamSection; // crossSectionTypeOf gives f, g only for these shapes
  const beam = sectionProperties(shapeToPolygons(section));
  const torsion = input.torsionConstantMm4 ?? torsionConstantMm4(section);
  const { k, ...interior } = adjacentBeamMomentFactors({
    beamWidthMm: section.widthMm,
    spanLengthMm: input.spanLengthMm,
    inertiaMm4: beam.inertiaMm4,
    torsionConstantMm4: torsion,
    girderCount: input.girderCount,
  });
  const skew = boxSkewCorrection(input.skewDeg ?? 0);
  const warnings = [FROM_MEMORY('type f, g (adjacent beam)'), ...torsionWarnings(input, section)];
  const details = { torsionConstantMm4: torsion, adjacentBeamK: k, interior };
  if (input.position === 'interior') return { factors: interior, skew, details, warnings };
  const e = adjacentBeamExteriorFactors(barrierDistanceMm(input));
  const multiLaneE = multiLaneLoaded ? e.multiLane : null;
  return {
    factors: { oneLane: e.oneLane * interior.oneLane, multiLane: e.multiLane * interior.multiLane },
    skew,
    details: { ...details, exteriorE: { oneLane: e.oneLane, multiLane: multiLaneE } },
    warnings,
  };
}

function torsionWarnings(input: MomentDistributionInput, section: AdjacentBeamSection): string[] {
  if (input.torsionConstantMm4 !== undefined || section.shape !== 'voided-slab') return [];
  return ['the voided slab\'s torsion constant J is approximated (solid rectangle less the voids\' polar moments; common practice, no source): give torsionConstantMm4 from a finer analysis where it matters'];
}
