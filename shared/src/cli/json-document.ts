import { formatJsonPath } from '../engine/calc-file/json-path';

/** Path of the first number JSON cannot carry (NaN, ±Infinity), or null when there is none. */
function firstNonFiniteNumber(value: unknown, path: readonly PropertyKey[] = []): string | null {
  if (typeof value === 'number') return Number.isFinite(value) ? null : formatJsonPath(path) || '(output)';
  if (value === null || typeof value !== 'object') return null;
  const entries = Array.isArray(value) ? value.map((item, index) => [index, item] as const) : Object.entries(value);
  for (const [key, item] of entries) {
    const found = firstNonFiniteNumber(item, [...path, key]);
    if (found !== null) return found;
  }
  return null;
}

/**
 * The output as one pretty JSON document (2-space indent, trailing newline). JSON.stringify
 * would quietly print NaN or Infinity as null, so such a number is an error instead.
 */
export function jsonDocument(value: unknown): string {
  const nonFinite = firstNonFiniteNumber(value);
  if (nonFinite !== null) throw new Error(`the engine produced a number JSON cannot carry at ${nonFinite}`);
  return `${JSON.stringify(value, null, 2)}\n`;
}
