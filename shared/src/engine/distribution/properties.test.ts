import fc from 'fast-check';
import { beamSlabMomentFactors } from './formulas';
import { momentDistributionFactor, type MomentDistributionInput } from './moment-distribution';

// Properties of the published formulas, checked without a published number.

const inRange = {
  spanLengthMm: fc.double({ min: 6000, max: 73_000, noNaN: true }),
  deckThicknessMm: fc.double({ min: 110, max: 300, noNaN: true }),
  longitudinalStiffnessMm4: fc.double({ min: 4e9, max: 3e12, noNaN: true }),
  girderCount: fc.integer({ min: 4, max: 12 }),
};

describe('type k factors (Table 4.6.2.2.2b-1 [R])', () => {
  // Whole-millimetre spacings: spacings a rounding error apart would give equal factors.
  const spacingMm = fc.integer({ min: 1100, max: 4900 });

  it('rise with the girder spacing S inside the range', () => {
    fc.assert(
      fc.property(spacingMm, spacingMm, fc.record(inRange), (a, b, rest) => {
        fc.pre(a !== b);
        const narrow = beamSlabMomentFactors({ ...rest, girderSpacingMm: Math.min(a, b) });
        const wide = beamSlabMomentFactors({ ...rest, girderSpacingMm: Math.max(a, b) });
        expect(wide.oneLane).toBeGreaterThan(narrow.oneLane);
        expect(wide.multiLane).toBeGreaterThan(narrow.multiLane);
      }),
    );
  });
});

describe('skew (Table 4.6.2.2.2e-1 [R])', () => {
  const girder: MomentDistributionInput = {
    section: { shape: 'tee', flangeWidthMm: 1200, flangeThicknessMm: 150, webWidthMm: 200, depthMm: 1200 },
    position: 'interior',
    distribution: { method: 'formula' },
    spanLengthMm: 25_000,
    girderSpacingMm: 2400,
    girderCount: 6,
    roadwayWidthMm: 12_000,
    deck: { thicknessMm: 200, nBeamToDeck: 1.2 },
  };
  const box: MomentDistributionInput = {
    ...girder,
    section: { shape: 'box', widthMm: 1200, depthMm: 900, voidWidthMm: 900, voidDepthMm: 600, voidBottomMm: 150 },
    girderSpacingMm: 1220,
    girderCount: 10,
  };

  it('never increases the moment factor, for any row, position or diaphragm layout', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(girder, box),
        fc.constantFrom<'interior' | 'exterior'>('interior', 'exterior'),
        fc.boolean(),
        fc.double({ min: 0, max: 89, noNaN: true }),
        (span, position, hasDiaphragms, skewDeg) => {
          const input = { ...span, position, hasDiaphragms, barrierFaceToGirderMm: 300 };
          expect(momentDistributionFactor({ ...input, skewDeg }).factor).toBeLessThanOrEqual(momentDistributionFactor(input).factor + 1e-12);
        },
      ),
    );
  });
});
