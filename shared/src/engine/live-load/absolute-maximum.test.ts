import fc from 'fast-check';
import { ftToM, knMToKipFt } from '../../units';
import c3 from '../fixtures/live-load/c3-hs20-truck-absolute-maximum.json';
import c5 from '../fixtures/live-load/c5-si-truck-absolute-maximum.json';
import { EngineInputError } from '../materials/errors';
import { absoluteMaximumMoment } from './absolute-maximum';
import { liveLoadMomentEnvelope } from './moment-envelope';
import { grid, roundingNmm, spanFraction, totalAxleLoadN, usEditionCase, vehicleCaseArbitrary } from './test-vehicles';
import { resolveVehicle } from './vehicle-library';
import type { LoadCase } from './vehicle-schema';

const NMM_PER_KNM = 1e6;

function libraryCase(vehicleId: string, caseId: string): LoadCase {
  return resolveVehicle(vehicleId).cases.find((loadCase) => loadCase.id === caseId)!;
}

/** The case with its variable gap held at the listed spacing, as C3 and C5 state it. */
function heldAtListedSpacing(loadCase: LoadCase): LoadCase {
  return { ...loadCase, variableSpacing: undefined };
}

describe(`${c3.id} ${c3.title} (${c3.source})`, () => {
  const truck = heldAtListedSpacing(usEditionCase(libraryCase(c3.inputs.vehicleId, c3.inputs.caseId)));

  it('uses the 14 ft rear spacing C3 states', () => {
    expect(truck.us?.axleSpacingsFt).toEqual([c3.inputs.rearSpacingFt, c3.inputs.rearSpacingFt]);
  });

  it.each(c3.inputs.spanLengthsFt.map((spanFt, index) => [spanFt, c3.expected.absoluteMaximumMomentKipFt[index]!]))(
    'gives %s ft: %s k-ft',
    (spanFt, expectedKipFt) => {
      const { momentNmm } = absoluteMaximumMoment({ spanLengthMm: ftToM(spanFt) * 1000, loadCase: truck });
      expect(Math.abs(knMToKipFt(momentNmm / NMM_PER_KNM) - expectedKipFt)).toBeLessThanOrEqual(c3.tolerance.absoluteMaximumMomentKipFt);
    },
  );
});

describe(`${c5.id} ${c5.title} (${c5.source})`, () => {
  const libraryTruck = libraryCase(c5.inputs.vehicleId, c5.inputs.caseId);

  it.each(c5.inputs.spanLengthsM.map((spanM, index) => [spanM, c5.expected.absoluteMaximumMomentKnm[index]!]))(
    'gives %s m: %s kN·m at the 4.3 m rear spacing, and the same with the gap free to open to 9 m',
    (spanM, expectedKnm) => {
      const fixedMoment = absoluteMaximumMoment({ spanLengthMm: spanM * 1000, loadCase: heldAtListedSpacing(libraryTruck) });
      const freeMoment = absoluteMaximumMoment({ spanLengthMm: spanM * 1000, loadCase: libraryTruck });
      expect(Math.abs(fixedMoment.momentNmm / NMM_PER_KNM - expectedKnm)).toBeLessThanOrEqual(c5.tolerance.absoluteMaximumMomentKnm);
      expect(freeMoment.momentNmm).toBe(fixedMoment.momentNmm);
    },
  );

  it('puts the middle axle 0.7277 m short of midspan on 20 m (hand check: resultant 1.4554 m from it)', () => {
    // Resultant of 35/145/145 kN from the middle axle: (145 × 4.3 − 35 × 4.3)/325 = 1.4554 m.
    const result = absoluteMaximumMoment({ spanLengthMm: 20_000, loadCase: heldAtListedSpacing(libraryTruck) });
    expect(result.criticalAxle).toBe(1);
    expect(result.stationMm).toBeCloseTo(10_000 - (110 * 4300) / 325 / 2, 6);
  });
});

describe('absoluteMaximumMoment against the envelope', () => {
  const spanArbitrary = fc.integer({ min: 2_000, max: 40_000 });

  it('is never below the envelope at any station (properties of the exact search)', () => {
    fc.assert(
      fc.property(vehicleCaseArbitrary(1), spanArbitrary, spanFraction, (loadCase, spanLengthMm, fraction) => {
        const { momentNmm } = absoluteMaximumMoment({ spanLengthMm, loadCase });
        const [station] = liveLoadMomentEnvelope({ spanLengthMm, stationsMm: [fraction * spanLengthMm], vehicle: { cases: [loadCase] }, impactFactor: 0 });
        expect(station!.axleMomentNmm).toBeLessThanOrEqual(momentNmm + roundingNmm(loadCase, spanLengthMm));
      }),
    );
  });

  it('equals the envelope at its own station and the largest envelope value on a 10 mm station grid within the grid error', () => {
    fc.assert(
      fc.property(vehicleCaseArbitrary(1), spanArbitrary, (loadCase, spanLengthMm) => {
        const result = absoluteMaximumMoment({ spanLengthMm, loadCase });
        const stationsMm = [result.stationMm, ...grid(0, spanLengthMm, 10)];
        const envelope = liveLoadMomentEnvelope({ spanLengthMm, stationsMm, vehicle: { cases: [loadCase] }, impactFactor: 0 });
        const gridBestNmm = Math.max(...envelope.slice(1).map((station) => station.axleMomentNmm));
        expect(Math.abs(envelope[0]!.axleMomentNmm - result.momentNmm)).toBeLessThanOrEqual(roundingNmm(loadCase, spanLengthMm));
        // The moment under an axle changes by at most the total load per mm of travel.
        expect(result.momentNmm - gridBestNmm).toBeLessThanOrEqual(totalAxleLoadN(loadCase) * 5 + roundingNmm(loadCase, spanLengthMm));
      }),
      { numRuns: 40 },
    );
  });

  it('rejects a span that is not positive', () => {
    expect(() => absoluteMaximumMoment({ spanLengthMm: 0, loadCase: libraryCase('type-3', 'axles') })).toThrow(EngineInputError);
  });
});
