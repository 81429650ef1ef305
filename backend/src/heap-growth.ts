import v8 from 'node:v8';

/**
 * How much V8 lets the heap grow past what survived its last full collection before collecting
 * again. Left to itself it picks up to four times when collecting is cheap: a bulk import of
 * 100 000 rows, a few hundred megabytes of short-lived objects over a live set under 150 MB,
 * then took the server past 700 MB. Growing by 20 % keeps its peak near the live data, for a
 * few more collections (measured by `npm run bench`, bench/import-girders.bench.ts: 40 % left
 * the check of 50 000 girders at 420 MB, 20 % at 375 MB, in about the same time).
 */
const HEAP_GROWING_PERCENT = 20;

/** Sets the server process's heap growth; V8 reads it at every full collection, so setting it at start is enough. */
export function keepHeapGrowthModest(): void {
  v8.setFlagsFromString(`--heap-growing-percent=${HEAP_GROWING_PERCENT}`);
}
