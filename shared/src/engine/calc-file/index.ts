/** The calculation file (calc-file.md): schemas that are both validator and type, and their checks. */
export {
  barSchema,
  capacityOptionsSchema,
  concreteSchema,
  damageEntrySchema,
  deckSchema,
  girderSchema,
  strandRowSchema,
  type Bar,
  type CapacityOptions,
  type Concrete,
  type DamageEntry,
  type Deck,
  type Girder,
  type StrandDamageEntry,
  type StrandRow,
} from './girder';
export { capacityFileIssues, capacityFileSchema, parseCapacityFile, type CapacityFile, type ParseResult } from './capacity-file';
export { describeIssues, formatJsonPath, type CalcFileIssue } from './json-path';
export { applyStrandDamage, type StrandDamageResult, type StrandState } from './strand-damage';
