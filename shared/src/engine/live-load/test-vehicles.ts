import fc from 'fast-check';
import { ftToM, kipToKn } from '../../units';
import type { LoadCase } from './vehicle-schema';

const MM_PER_M = 1000;

/** A load case in SI converted exactly from its published US customary values (1 kip = 4.448222 kN, 1 ft = 304.8 mm). */
export function usEditionCase(loadCase: LoadCase): LoadCase {
  const us = loadCase.us;
  if (us === undefined) throw new Error(`load case "${loadCase.id}" has no US customary values`);
  const ftToMm = (lengthFt: number) => ftToM(lengthFt) * MM_PER_M;
  return {
    ...loadCase,
    axleLoadsKn: us.axleLoadsKip.map(kipToKn),
    axleSpacingsMm: us.axleSpacingsFt.map(ftToMm),
    variableSpacing:
      us.variableSpacingFt && loadCase.variableSpacing
        ? { gapIndex: loadCase.variableSpacing.gapIndex, minMm: ftToMm(us.variableSpacingFt.minFt), maxMm: ftToMm(us.variableSpacingFt.maxFt) }
        : undefined,
    laneLoadKnPerM: us.laneLoadKipPerFt === undefined ? undefined : kipToKn(us.laneLoadKipPerFt) / ftToM(1),
  };
}

/** A load case with only the fields the moment searches read; the rest at their schema defaults. */
export function axleCase(axleLoadsKn: number[], axleSpacingsMm: number[], variableSpacing?: LoadCase['variableSpacing']): LoadCase {
  return { id: 'axles', axleLoadsKn, axleSpacingsMm, variableSpacing, axleScale: 1, dynamicLoadAllowance: { axles: true, lane: false } };
}

/**
 * Moment (N·mm) at a station for axles at given positions, by the reactions rather than the
 * influence line the engine uses: M = R_start·x − Σ P (x − y) over the axles left of x.
 */
export function placementMomentNmm(spanLengthMm: number, stationMm: number, loadsN: readonly number[], positionsMm: readonly number[]): number {
  let startReactionN = 0;
  let leftMomentNmm = 0;
  loadsN.forEach((loadN, axle) => {
    const positionMm = positionsMm[axle]!;
    if (positionMm < 0 || positionMm > spanLengthMm) return;
    startReactionN += (loadN * (spanLengthMm - positionMm)) / spanLengthMm;
    if (positionMm < stationMm) leftMomentNmm += loadN * (stationMm - positionMm);
  });
  return startReactionN * stationMm - leftMomentNmm;
}

/** Axle positions with the first axle at `leadMm`, the vehicle facing `direction` and the variable gap at `gapMm`. */
export function axlePositionsMm(loadCase: LoadCase, leadMm: number, direction: 1 | -1, gapMm: number): number[] {
  const positions = [leadMm];
  loadCase.axleSpacingsMm.forEach((spacingMm, gap) => {
    const usedMm = gap === loadCase.variableSpacing?.gapIndex ? gapMm : spacingMm;
    positions.push(positions[gap]! + direction * usedMm);
  });
  return positions;
}

/** Grid from `fromMm` to `toMm` in steps, with `toMm` itself always included. */
export function grid(fromMm: number, toMm: number, stepMm: number): number[] {
  const values: number[] = [];
  for (let index = 0; fromMm + index * stepMm < toMm; index++) values.push(fromMm + index * stepMm);
  values.push(toMm);
  return values;
}

/**
 * The largest axle moment at a station found by moving the vehicle in fixed steps from wholly
 * before the span to wholly beyond it, in both directions, with the variable gap stepped too.
 */
export function bruteForceAxleMomentNmm(
  spanLengthMm: number,
  stationMm: number,
  loadCase: LoadCase,
  stepMm: number,
  gapStepMm: number,
): number {
  const loadsN = loadCase.axleLoadsKn.map((loadKn) => loadKn * 1000 * loadCase.axleScale);
  const range = loadCase.variableSpacing;
  const gapsMm = range === undefined ? [0] : grid(range.minMm, range.maxMm, gapStepMm);
  const longestMm = loadCase.axleSpacingsMm.reduce((sum, spacingMm) => sum + spacingMm, 0) + (range ? range.maxMm : 0);
  const firstLeadMm = Math.floor(-longestMm / stepMm) * stepMm;
  let best = 0;
  for (const gapMm of gapsMm) {
    for (const direction of [1, -1] as const) {
      const leads = direction === 1 ? grid(firstLeadMm, spanLengthMm, stepMm) : grid(0, spanLengthMm + longestMm + stepMm, stepMm);
      for (const leadMm of leads) {
        best = Math.max(best, placementMomentNmm(spanLengthMm, stationMm, loadsN, axlePositionsMm(loadCase, leadMm, direction, gapMm)));
      }
    }
  }
  return best;
}

/** A fraction of the span, spread evenly over [0, 1] (a plain double clusters at the ends, i.e. the supports). */
export const spanFraction = fc.integer({ min: 0, max: 1_000_000 }).map((millionths) => millionths / 1_000_000);

/** Random vehicles: 1–6 axles of 5–150 kN, spacings 0.5–6 m, sometimes one variable gap up to 3 m wider. */
export function vehicleCaseArbitrary(quantumMm: number): fc.Arbitrary<LoadCase> {
  const lengthMm = (minMm: number, maxMm: number) =>
    fc.integer({ min: Math.ceil(minMm / quantumMm), max: Math.floor(maxMm / quantumMm) }).map((steps) => steps * quantumMm);
  return fc
    .integer({ min: 1, max: 6 })
    .chain((axleCount) =>
      fc.record({
        loads: fc.array(fc.double({ min: 5, max: 150, noNaN: true }), { minLength: axleCount, maxLength: axleCount }),
        spacings: fc.array(lengthMm(500, 6000), { minLength: axleCount - 1, maxLength: axleCount - 1 }),
        widening: fc.option(fc.record({ gap: fc.nat(), extraMm: lengthMm(quantumMm, 3000) }), { nil: undefined }),
      }),
    )
    .map(({ loads, spacings, widening }) => {
      if (widening === undefined || spacings.length === 0) return axleCase(loads, spacings);
      const gapIndex = widening.gap % spacings.length;
      const minMm = spacings[gapIndex]!;
      return axleCase(loads, spacings, { gapIndex, minMm, maxMm: minMm + widening.extraMm });
    });
}

/** Total axle load of a case in N: the bound on how fast its moment changes per mm of travel or gap. */
export function totalAxleLoadN(loadCase: LoadCase): number {
  return loadCase.axleLoadsKn.reduce((sum, loadKn) => sum + loadKn * 1000 * loadCase.axleScale, 0);
}

/** Floating-point noise on moments of this case and span: 1e-12 of the largest possible moment's scale, R·L. */
export function roundingNmm(loadCase: LoadCase, spanLengthMm: number): number {
  return 1e-12 * totalAxleLoadN(loadCase) * spanLengthMm;
}
