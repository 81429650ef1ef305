/** Loss of prestress in a pretensioned girder and the effective prestress per strand row (engineering.md §5). */
export { effectivePrestress, type EffectivePrestressResult, type LossChecks, type RowEffectivePrestress } from './effective-prestress';
export type { EciFromFormula, EffectivePrestressInput, LossStrandRow } from './check-input';
export { elasticShortening, type ElasticShortening, type ElasticShorteningOptions, type GrossSection, type JackedRow } from './elastic-shortening';
export {
  LONG_TERM_CONSTANT_TERM_MPA,
  RELAXATION_LOSS_MPA,
  STRAND_TYPES,
  approximateLongTermLoss,
  humidityFactor,
  strengthFactor,
  type LongTermLoss,
  type LongTermLossOptions,
  type StrandType,
} from './long-term';
export { lossesSchema, type Losses } from './schema';
