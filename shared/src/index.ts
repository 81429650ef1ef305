/** The public API of Spanledger's shared code: what is not exported here is private. */
export * from './structures';
export * from './client-config';
export * from './units';
export * from './engine/geometry';
export * from './engine/section';
export * from './engine/materials';
export * from './engine/calc-file';
export * from './engine/capacity';
export { RESULT_CAUTION } from './engine/caution';
