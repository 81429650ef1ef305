import fc from 'fast-check';
import { ftToM, knMToKipFt } from '../../units';
import c4 from '../fixtures/live-load/c4-midspan-moments.json';
import { EngineInputError } from '../materials/errors';
import { liveLoadMomentEnvelope } from './moment-envelope';
import {
  axlePositionsMm,
  bruteForceAxleMomentNmm,
  placementMomentNmm,
  roundingNmm,
  totalAxleLoadN,
  usEditionCase,
  spanFraction,
  vehicleCaseArbitrary,
} from './test-vehicles';
import { resolveVehicle } from './vehicle-library';
import type { LoadCase } from './vehicle-schema';

const NMM_PER_KNM = 1e6;
const hl93 = resolveVehicle('hl93');
const [designTruck, designTandem] = hl93.cases as [LoadCase, LoadCase];

/** The envelope of one load case alone, at one station. */
function caseMomentAt(loadCase: LoadCase, spanLengthMm: number, stationMm: number, impactFactor = 0) {
  return liveLoadMomentEnvelope({ spanLengthMm, stationsMm: [stationMm], vehicle: { cases: [loadCase] }, impactFactor })[0]!;
}

describe(`${c4.id} ${c4.title} (${c4.source})`, () => {
  const truck = usEditionCase(designTruck);
  const tandem = usEditionCase(designTandem);
  const { designTruck: truckLine, designTandem: tandemLine, designLane } = c4.formulasKipFt;
  const kipFtAtMidspan = (loadCase: LoadCase, spanFt: number) => {
    const spanLengthMm = ftToM(spanFt) * 1000;
    const { axleMomentNmm, laneMomentNmm } = caseMomentAt(loadCase, spanLengthMm, spanLengthMm / 2);
    return { axleKipFt: knMToKipFt(axleMomentNmm / NMM_PER_KNM), laneKipFt: knMToKipFt(laneMomentNmm / NMM_PER_KNM) };
  };

  it.each(c4.inputs.spanLengthsFt)('matches the formulas at midspan of %s ft, with the rear gap free from 14 to 30 ft', (spanFt) => {
    expect(kipFtAtMidspan(truck, spanFt).axleKipFt).toBeCloseTo(truckLine.perFt * spanFt + truckLine.constant, 3);
    expect(kipFtAtMidspan(tandem, spanFt).axleKipFt).toBeCloseTo(tandemLine.perFt * spanFt + tandemLine.constant, 3);
    expect(kipFtAtMidspan(truck, spanFt).laneKipFt).toBeCloseTo(designLane.perFt2 * spanFt * spanFt, 3);
  });

  it(`gives ${c4.expected.designTruckKipFt} / ${c4.expected.designTandemKipFt} / ${c4.expected.designLaneKipFt} k-ft at ${c4.expected.spanLengthFt} ft`, () => {
    const spanFt = c4.expected.spanLengthFt;
    const tolerance = c4.tolerance.momentKipFt;
    expect(Math.abs(kipFtAtMidspan(truck, spanFt).axleKipFt - c4.expected.designTruckKipFt)).toBeLessThanOrEqual(tolerance);
    expect(Math.abs(kipFtAtMidspan(tandem, spanFt).axleKipFt - c4.expected.designTandemKipFt)).toBeLessThanOrEqual(tolerance);
    expect(Math.abs(kipFtAtMidspan(truck, spanFt).laneKipFt - c4.expected.designLaneKipFt)).toBeLessThanOrEqual(tolerance);
  });
});

describe('liveLoadMomentEnvelope with HL-93 (SI values, AASHTO LRFD 3.6.1.2 [R])', () => {
  it('lets the tandem govern at midspan of 10 m: 484 kN·m against the truck 425.5 kN·m (hand check from statics)', () => {
    // Tandem: 110 × 2.5 + 110 × 3.8/2. Truck, middle axle at midspan: 145 × 2.5 + (145 + 35) × 0.7/2.
    const [midspan] = liveLoadMomentEnvelope({ spanLengthMm: 10_000, stationsMm: [5000], vehicle: hl93, impactFactor: 0 });
    expect(midspan!.caseId).toBe('design-tandem-lane');
    expect(midspan!.axleMomentNmm / NMM_PER_KNM).toBeCloseTo(484, 9);
    expect(caseMomentAt(designTruck, 10_000, 5000).axleMomentNmm / NMM_PER_KNM).toBeCloseTo(425.5, 9);
  });

  it('lets the truck govern at midspan of 30 m and adds IM to the axles only: 1.33 × 2050.5 + 1046.25 kN·m (hand check from statics)', () => {
    // Truck: 145 × 7.5 + (145 + 35) × 10.7/2; lane: 9.3 × 30²/8 (AASHTO LRFD 3.6.2.1 [R]: no IM on the lane load).
    const [midspan] = liveLoadMomentEnvelope({ spanLengthMm: 30_000, stationsMm: [15_000], vehicle: hl93, impactFactor: 0.33 });
    expect(midspan!.caseId).toBe('design-truck-lane');
    expect(midspan!.axleMomentNmm / NMM_PER_KNM).toBeCloseTo(2050.5, 9);
    expect(midspan!.laneMomentNmm / NMM_PER_KNM).toBeCloseTo(1046.25, 9);
    expect(midspan!.totalMomentNmm / NMM_PER_KNM).toBeCloseTo(1.33 * 2050.5 + 1046.25, 9);
  });

  it('gives w·x·(L − x)/2 for the lane load and zero at the supports (hand check from the published formula)', () => {
    const envelope = liveLoadMomentEnvelope({ spanLengthMm: 24_000, stationsMm: [0, 6000, 24_000], vehicle: hl93, impactFactor: 0.33 });
    expect(envelope.map((station) => station.laneMomentNmm)).toEqual([0, (9.3 * 6000 * 18_000) / 2, 0]);
    expect(envelope[0]!.totalMomentNmm).toBe(0);
    expect(envelope[2]!.totalMomentNmm).toBe(0);
  });

  it('applies IM to a lane load and not to the axles when a case says so', () => {
    const laneOnly: LoadCase = { ...designTruck, dynamicLoadAllowance: { axles: false, lane: true } };
    const moment = caseMomentAt(laneOnly, 30_000, 15_000, 0.25);
    expect(moment.totalMomentNmm).toBeCloseTo(moment.axleMomentNmm + 1.25 * moment.laneMomentNmm, 0);
  });

  it('applies the axle scale to the axles and not to the lane (the lane-type legal load, from memory — verify)', () => {
    const laneLegal = resolveVehicle('lane-legal').cases[0]!;
    const unscaled = caseMomentAt({ ...laneLegal, axleScale: 1 }, 70_000, 30_000);
    const scaled = caseMomentAt(laneLegal, 70_000, 30_000);
    expect(scaled.axleMomentNmm).toBeCloseTo(0.75 * unscaled.axleMomentNmm, 0);
    expect(scaled.laneMomentNmm).toBe(unscaled.laneMomentNmm);
  });

  it.each([
    [{ spanLengthMm: 0, stationsMm: [], impactFactor: 0 }, 'spanLengthMm'],
    [{ spanLengthMm: 10_000, stationsMm: [5000, 10_001], impactFactor: 0 }, 'stationsMm[1]'],
    [{ spanLengthMm: 10_000, stationsMm: [-1], impactFactor: 0 }, 'stationsMm[0]'],
    [{ spanLengthMm: 10_000, stationsMm: [5000], impactFactor: -0.1 }, 'impactFactor'],
  ])('rejects bad options at their path: %o', (options, path) => {
    expect(() => liveLoadMomentEnvelope({ ...options, vehicle: hl93 })).toThrow(expect.objectContaining({ path }));
    expect(() => liveLoadMomentEnvelope({ ...options, vehicle: hl93 })).toThrow(EngineInputError);
  });
});

describe('liveLoadMomentEnvelope properties (engineering.md §8: exact envelope, symmetry)', () => {
  const spanArbitrary = (quantumMm: number) => fc.integer({ min: 1, max: Math.floor(30_000 / quantumMm) }).map((steps) => steps * quantumMm);

  it('equals a brute-force search in 100 mm steps of travel and gap, exactly, when every length is a multiple of 100 mm', () => {
    fc.assert(
      fc.property(vehicleCaseArbitrary(100), spanArbitrary(100), spanFraction, (loadCase, spanLengthMm, fraction) => {
        // A station on the 100 mm grid, so the brute force meets every breakpoint of the exact search.
        const stationMm = Math.round((fraction * spanLengthMm) / 100) * 100;
        const exactNmm = caseMomentAt(loadCase, spanLengthMm, stationMm).axleMomentNmm;
        const bruteNmm = bruteForceAxleMomentNmm(spanLengthMm, stationMm, loadCase, 100, 100);
        expect(Math.abs(exactNmm - bruteNmm)).toBeLessThanOrEqual(roundingNmm(loadCase, spanLengthMm));
      }),
      { numRuns: 60 },
    );
  });

  it('lies within the step error above a brute-force search in 10 mm steps of travel and 100 mm of gap, for any lengths', () => {
    fc.assert(
      fc.property(vehicleCaseArbitrary(0.001), spanArbitrary(0.001), spanFraction, (loadCase, spanLengthMm, fraction) => {
        const stationMm = fraction * spanLengthMm;
        const exactNmm = caseMomentAt(loadCase, spanLengthMm, stationMm).axleMomentNmm;
        const bruteNmm = bruteForceAxleMomentNmm(spanLengthMm, stationMm, loadCase, 10, 100);
        // Travel and gap move an axle at most 5 mm and 50 mm from the best placement; the moment changes by at most the total load per mm.
        const stepErrorNmm = totalAxleLoadN(loadCase) * (5 + 50);
        expect(bruteNmm).toBeLessThanOrEqual(exactNmm + roundingNmm(loadCase, spanLengthMm));
        expect(exactNmm - bruteNmm).toBeLessThanOrEqual(stepErrorNmm);
      }),
      { numRuns: 40 },
    );
  });

  it('is never below the moment of any single placement of the vehicle', () => {
    fc.assert(
      fc.property(
        vehicleCaseArbitrary(0.001),
        spanArbitrary(0.001),
        spanFraction,
        spanFraction.map((fraction) => 3 * fraction - 1),
        spanFraction,
        fc.constantFrom(1 as const, -1 as const),
        (loadCase, spanLengthMm, stationFraction, leadFraction, gapFraction, direction) => {
          const stationMm = stationFraction * spanLengthMm;
          const range = loadCase.variableSpacing;
          const gapMm = range === undefined ? 0 : range.minMm + gapFraction * (range.maxMm - range.minMm);
          const positionsMm = axlePositionsMm(loadCase, leadFraction * spanLengthMm, direction, gapMm);
          const loadsN = loadCase.axleLoadsKn.map((loadKn) => loadKn * 1000);
          const placedNmm = placementMomentNmm(spanLengthMm, stationMm, loadsN, positionsMm);
          expect(placedNmm).toBeLessThanOrEqual(caseMomentAt(loadCase, spanLengthMm, stationMm).axleMomentNmm + roundingNmm(loadCase, spanLengthMm));
        },
      ),
    );
  });

  it('is symmetric about midspan for a symmetric vehicle', () => {
    const symmetricCase = fc
      .record({
        loads: fc.array(fc.double({ min: 5, max: 150, noNaN: true }), { minLength: 1, maxLength: 4 }),
        spacings: fc.array(fc.double({ min: 500, max: 6000, noNaN: true }), { minLength: 4, maxLength: 4 }),
        middleAxle: fc.boolean(),
      })
      .map(({ loads, spacings, middleAxle }): LoadCase => {
        const half = spacings.slice(0, loads.length - 1);
        const middleMm = spacings[3]!;
        const mirroredLoads = middleAxle ? [...loads, ...loads.slice(0, -1).reverse()] : [...loads, ...loads.slice().reverse()];
        const mirroredSpacings = middleAxle ? [...half, ...half.slice().reverse()] : [...half, middleMm, ...half.slice().reverse()];
        return { id: 'symmetric', axleLoadsKn: mirroredLoads, axleSpacingsMm: mirroredSpacings, axleScale: 1, dynamicLoadAllowance: { axles: true, lane: false } };
      });
    fc.assert(
      fc.property(symmetricCase, spanArbitrary(0.001), spanFraction, (loadCase, spanLengthMm, fraction) => {
        const stationMm = fraction * spanLengthMm;
        const near = caseMomentAt(loadCase, spanLengthMm, stationMm).axleMomentNmm;
        const mirrored = caseMomentAt(loadCase, spanLengthMm, spanLengthMm - stationMm).axleMomentNmm;
        expect(Math.abs(near - mirrored)).toBeLessThanOrEqual(roundingNmm(loadCase, spanLengthMm));
      }),
    );
  });

  it('is symmetric about midspan for any vehicle too, since both directions of travel are searched', () => {
    fc.assert(
      fc.property(vehicleCaseArbitrary(0.001), spanArbitrary(0.001), spanFraction, (loadCase, spanLengthMm, fraction) => {
        const stationMm = fraction * spanLengthMm;
        const near = caseMomentAt(loadCase, spanLengthMm, stationMm).axleMomentNmm;
        const mirrored = caseMomentAt(loadCase, spanLengthMm, spanLengthMm - stationMm).axleMomentNmm;
        expect(Math.abs(near - mirrored)).toBeLessThanOrEqual(roundingNmm(loadCase, spanLengthMm));
      }),
    );
  });

  it('scales with the axle loads', () => {
    fc.assert(
      fc.property(
        vehicleCaseArbitrary(0.001),
        spanArbitrary(0.001),
        spanFraction,
        fc.double({ min: 0.1, max: 10, noNaN: true }),
        (loadCase, spanLengthMm, fraction, factor) => {
          const stationMm = fraction * spanLengthMm;
          const scaledCase = { ...loadCase, axleLoadsKn: loadCase.axleLoadsKn.map((loadKn) => factor * loadKn) };
          const base = caseMomentAt(loadCase, spanLengthMm, stationMm).axleMomentNmm;
          const scaled = caseMomentAt(scaledCase, spanLengthMm, stationMm).axleMomentNmm;
          expect(Math.abs(scaled - factor * base)).toBeLessThanOrEqual(roundingNmm(scaledCase, spanLengthMm));
        },
      ),
    );
  });
});
