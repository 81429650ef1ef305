/** Live-load moment distribution factors for a girder (engineering.md §6). */
export { ADJACENT_GAP_LIMIT_MM, crossSectionTypeOf, type CrossSectionChoice, type CrossSectionContext, type CrossSectionType, type TableRow } from './cross-section';
export {
  DISTRIBUTION_METHOD_PATH,
  adjacentBeamExteriorFactors,
  adjacentBeamMomentFactors,
  beamSlabExteriorFactor,
  beamSlabMomentFactors,
  beamSlabSkewCorrection,
  boxSkewCorrection,
  spreadBoxExteriorFactor,
  spreadBoxMomentFactors,
  type AdjacentBeamFactors,
  type AdjacentBeamParameters,
  type BeamSlabParameters,
  type LaneFactors,
  type SkewCorrection,
  type SpreadBoxParameters,
} from './formulas';
export { DESIGN_LANE_WIDTH_MM, WHEEL_GAUGE_MM, WHEEL_TO_LANE_EDGE_MM, multiplePresenceFactor, numberOfDesignLanes } from './lanes';
export { exteriorLeverRule, interiorLeverRule, type ExteriorLeverRuleOptions, type InteriorLeverRuleOptions, type LeverRuleCase } from './lever-rule';
export {
  momentDistributionFactor,
  type DistributionDeck,
  type DistributionDetails,
  type MomentDistributionInput,
  type MomentDistributionResult,
} from './moment-distribution';
export { exteriorRigidBody, type RigidBodyCase, type RigidBodyOptions } from './rigid-body';
export { USER_MOMENT_FACTOR_MAX, spanDistributionSchema, userDistributionSchema, type SpanDistribution } from './schema';
export {
  boxTorsionConstantMm4,
  rectangleTorsionConstantMm4,
  torsionConstantMm4,
  voidedSlabTorsionConstantMm4,
  type AdjacentBeamSection,
} from './torsion';
