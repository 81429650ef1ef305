import { formatJsonPath } from '../../../shared/src/engine/calc-file/json-path';

/** Numbers within this relative difference count as equal: golden files survive harmless rounding. */
export const RELATIVE_TOLERANCE = 1e-9;

function numbersMatch(actual: number, expected: number): boolean {
  if (actual === expected) return true;
  return Math.abs(actual - expected) <= RELATIVE_TOLERANCE * Math.max(Math.abs(actual), Math.abs(expected));
}

const kindOf = (value: unknown): string => (value === null ? 'null' : Array.isArray(value) ? 'array' : typeof value);

/**
 * The first place where two JSON values differ, as `path: what differs`, or null when they
 * match: numbers to RELATIVE_TOLERANCE, everything else exactly, object keys in any order.
 */
export function firstJsonDifference(actual: unknown, expected: unknown, path: readonly PropertyKey[] = []): string | null {
  const where = formatJsonPath(path) || '(root)';
  if (kindOf(actual) !== kindOf(expected)) return `${where}: ${kindOf(actual)} where ${kindOf(expected)} was expected`;
  if (typeof actual === 'number') {
    return numbersMatch(actual, expected as number) ? null : `${where}: ${actual} where ${String(expected)} was expected`;
  }
  if (Array.isArray(actual)) return firstArrayDifference(actual, expected as unknown[], path);
  if (typeof actual === 'object' && actual !== null) return firstObjectDifference(actual, expected as object, path);
  return actual === expected ? null : `${where}: ${JSON.stringify(actual)} where ${JSON.stringify(expected)} was expected`;
}

function firstArrayDifference(actual: readonly unknown[], expected: readonly unknown[], path: readonly PropertyKey[]): string | null {
  if (actual.length !== expected.length) {
    return `${formatJsonPath(path) || '(root)'}: ${actual.length} items where ${expected.length} were expected`;
  }
  for (const [index, item] of actual.entries()) {
    const difference = firstJsonDifference(item, expected[index], [...path, index]);
    if (difference !== null) return difference;
  }
  return null;
}

function firstObjectDifference(actual: object, expected: object, path: readonly PropertyKey[]): string | null {
  const actualRecord = actual as Record<string, unknown>;
  const expectedRecord = expected as Record<string, unknown>;
  for (const key of Object.keys(expectedRecord)) {
    if (!(key in actualRecord)) return `${formatJsonPath([...path, key])}: missing`;
    const difference = firstJsonDifference(actualRecord[key], expectedRecord[key], [...path, key]);
    if (difference !== null) return difference;
  }
  const extra = Object.keys(actualRecord).find((key) => !(key in expectedRecord));
  return extra === undefined ? null : `${formatJsonPath([...path, extra])}: not expected`;
}
