/** Flexural strength of one girder section with its damage applied (engineering.md §4). */
export { computeCapacity, type CapacityOutput, type SectionPropertiesOutput } from './capacity';
export { buildSectionModel, type SectionModelInput } from './build-section-model';
export { strainCompatibilityStrength, FORCE_RESIDUAL_TOLERANCE, type ConcreteModelName, type StrainCompatibilityOptions } from './strain-compatibility';
export { aashtoApproximateStrength } from './aashto-approximate';
export { is1343Strength } from './is1343';
export type {
  BarLayer,
  CompressionFlange,
  ConcreteMaterial,
  ConcreteRegion,
  FlexuralStrength,
  SectionModel,
  StrandLayer,
  StrandRowResult,
} from './section-model';
