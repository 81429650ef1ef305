/** Material models of the rating engine: strand, concrete, mild steel, φ and service limits. */
export { EngineInputError, joinPath } from './errors';
export {
  IS1343_STRAND_CURVE_POINTS,
  IS1343_STRAND_DESIGN_STRENGTH_RATIO,
  IS1343_STRAND_FINAL_INELASTIC_STRAIN,
  LOW_RELAXATION_POWER_CONSTANTS,
  PCI_250_KSI_CURVE,
  PCI_270_KSI_CURVE,
  PCI_CURVE_MODULUS_KSI,
  PCI_FPU_TOLERANCE,
  PCI_MODULUS_TOLERANCE,
  pciStrandCurveFor,
  pciStrandStressMpa,
  strandStressFor,
  strandStressIs1343Mpa,
  strandStressPowerMpa,
  type PciStrandCurve,
  type StrandCurveName,
  type StrandMaterial,
} from './strand';
export {
  AASHTO_ULTIMATE_CONCRETE_STRAIN,
  IS_DESIGN_PEAK_STRESS_RATIO,
  IS_PEAK_CONCRETE_STRAIN,
  IS_RECTANGULAR_ZONE_RESULTANT,
  IS_ULTIMATE_CONCRETE_STRAIN,
  TODESCHINI_PEAK_STRESS_RATIO,
  blockAlpha1,
  blockBeta1,
  isConcreteStressMpa,
  requireBasis,
  todeschiniPeakStrain,
  todeschiniStressMpa,
  type ConcreteStrength,
  type StrengthBasis,
  type TodeschiniConcrete,
} from './concrete';
export {
  ELASTIC_MODULUS_BASIS,
  elasticModulusMpa,
  type ElasticModulusFormula,
  type ElasticModulusInput,
} from './elastic-modulus';
export { MILD_STEEL_MODULUS_MPA, mildSteelStressMpa, type MildSteel } from './mild-steel';
export {
  COMPRESSION_CONTROLLED_STRAIN_LIMIT,
  TENSION_CONTROLLED_STRAIN_LIMIT,
  flexureResistanceFactor,
  type FlexureSectionKind,
} from './resistance-factor';
export { SERVICE_TENSION_CAP_MPA, SERVICE_TENSION_COEFFICIENTS, serviceTensionLimitMpa } from './service-limits';
