import { parseCapacityFile, type CapacityFile } from '../calc-file/capacity-file';

/**
 * Calculation files for the capacity tests, built from plain objects and checked by the real
 * schema. The girders are invented for the tests; the checks beside them say what they rest on.
 */

export function parseOrThrow(input: unknown): CapacityFile {
  const result = parseCapacityFile(input);
  if (!result.ok) throw new Error(`test file rejected:\n${result.issues.map((i) => `${i.path}: ${i.message}`).join('\n')}`);
  return result.file;
}

export const strand127 = { strandAreaMm2: 98.7, strandDiameterMm: 12.7, fpuMpa: 1860, fpyMpa: 1674, epsMpa: 196500 };

/** A 1400 mm bulb-tee as a width profile under a 200 mm deck on a 25 mm haunch, six strand rows. */
export function bulbTeeFile(overrides: { damage?: unknown[]; options?: Record<string, unknown>; fcMpa?: number } = {}): unknown {
  return {
    units: 'si',
    girder: {
      section: {
        shape: 'profile',
        widthsMm: [
          [0, 650], [150, 650], [280, 160], [1200, 160], [1300, 400], [1350, 1000], [1400, 1000],
        ],
      },
      concrete: { strengthMpa: overrides.fcMpa ?? 55, basis: 'cylinder' },
      deck: { widthMm: 2400, thicknessMm: 200, haunchMm: 25, strengthMpa: 30, basis: 'cylinder' },
      strandRows: [
        { id: 'r1', yMm: 50, count: 12, ...strand127, fpeMpa: 1150 },
        { id: 'r2', yMm: 100, count: 12, ...strand127, fpeMpa: 1150 },
        { id: 'r3', yMm: 150, count: 8, ...strand127, fpeMpa: 1150 },
        { id: 'r4', yMm: 200, count: 4, ...strand127, fpeMpa: 1150 },
        { id: 'r5', yMm: 250, count: 2, ...strand127, fpeMpa: 1150 },
        { id: 't1', yMm: 1350, count: 2, ...strand127, fpeMpa: 1000 },
      ],
    },
    damage: overrides.damage ?? [],
    options: overrides.options ?? {},
  };
}

export function rectangleFile(overrides: { strandRows?: unknown[]; fcMpa?: number; damage?: unknown[]; options?: Record<string, unknown> } = {}): unknown {
  return {
    units: 'si',
    girder: {
      section: { shape: 'rectangle', widthMm: 400, depthMm: 900 },
      concrete: { strengthMpa: overrides.fcMpa ?? 40, basis: 'cylinder' },
      strandRows: overrides.strandRows ?? [
        { id: 'r1', yMm: 60, count: 6, ...strand127, fpeMpa: 1100 },
        { id: 'r2', yMm: 110, count: 4, ...strand127, fpeMpa: 1100 },
      ],
    },
    damage: overrides.damage ?? [],
    options: overrides.options ?? {},
  };
}
