/** The public API of Spanledger's shared code: what is not exported here is private. */
export * from './structures';
export * from './inventory';
export * from './client-config';
export * from './access';
export * from './units';
export * from './engine/geometry';
export * from './engine/section';
export * from './engine/materials';
export * from './engine/calc-file';
export * from './engine/capacity';
export { RESULT_CAUTION } from './engine/caution';
export * from './engine/live-load';
export * from './engine/distribution';
export { POLICY_LIBRARY, DEFAULT_POLICY_ID, ratingPolicySchema, type RatingPolicy } from './engine/policy/rating-policy';
export { parseRateFile, rateFileSchema, spanSchema, type RateFile, type Span } from './engine/calc-file/rate-file';
export { rateGirderLine, type RateOutput, type RatingStation, type ControllingRating } from './engine/rating/rate';
export type { RatingFactorKey } from './engine/rating/lrfr';
export { ENGINE_VERSION } from './engine/version';
