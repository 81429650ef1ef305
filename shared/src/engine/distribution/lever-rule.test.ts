import fc from 'fast-check';
import { exteriorLeverRule, interiorLeverRule } from './lever-rule';
import { exteriorRigidBody } from './rigid-body';

// Statics of every lever-rule check: each wheel line carries half a lane (P/2 of a truck P);
// the deck panel is a simple beam over the girders, so a wheel at u from the girder gives the
// girder ½ (S − u)/S (exterior panel, u < S, u < 0 on the overhang) or ½ (1 − |u|/S) (interior,
// either panel); the sum times the multiple presence factor m (1.2 one lane, 1.0 two).

describe('exteriorLeverRule (AASHTO LRFD 4.6.2.2.2d [R]; hand checks from the published method)', () => {
  it('takes the C10 spacing with the girder 450 mm inside the barrier', () => {
    // wheels 600 − 450 = 150 mm and 150 + 1800 = 1950 mm inboard of the girder, S = 2946:
    // R = ½ (2796/2946) + ½ (996/2946) = 0.474542 + 0.169043 = 0.643585 lanes; × 1.2 = 0.772301
    const lever = exteriorLeverRule({ girderSpacingMm: 2946, barrierFaceToGirderMm: 450, loadedLanes: 1 });
    expect(lever.wheelOffsetsMm).toEqual([150, 1950]);
    expect(lever.reactionLanes).toBeCloseTo(0.643585, 6);
    expect(lever.factor).toBeCloseTo(0.772301, 6);
  });

  it('counts a wheel on the overhang at more than its share', () => {
    // de = 900, S = 2400: wheels at −300 (on the overhang) and 1500:
    // R = ½ (2700/2400) + ½ (900/2400) = 0.5625 + 0.1875 = 0.75; × 1.2 = 0.90
    const lever = exteriorLeverRule({ girderSpacingMm: 2400, barrierFaceToGirderMm: 900, loadedLanes: 1 });
    expect(lever.reactionLanes).toBeCloseTo(0.75, 12);
    expect(lever.factor).toBeCloseTo(0.9, 12);
  });

  it('puts the second truck in the next lane, 3600 mm on, with m = 1.0', () => {
    // de = 450, S = 2400: wheels 150, 1950, 3750, 5550; only the first two are inside S:
    // R = ½ (2250/2400) + ½ (450/2400) = 0.5625; × 1.0
    const lever = exteriorLeverRule({ girderSpacingMm: 2400, barrierFaceToGirderMm: 450, loadedLanes: 2 });
    expect(lever.wheelOffsetsMm).toEqual([150, 1950, 3750, 5550]);
    expect(lever.factor).toBeCloseTo(0.5625, 12);
  });

  it('gives 0.6 for one lane when the outer wheel stands over the girder and the other beyond the next girder', () => {
    // de = 600 puts the outer wheel at u = 0: R = ½; the inner wheel at 1800 ≥ S gives nothing; 0.5 × 1.2 = 0.6
    fc.assert(
      fc.property(fc.double({ min: 1100, max: 1800, noNaN: true }), (girderSpacingMm) => {
        const lever = exteriorLeverRule({ girderSpacingMm, barrierFaceToGirderMm: 600, loadedLanes: 1 });
        expect(lever.factor).toBeCloseTo(0.6, 12);
      }),
    );
  });
});

describe('interiorLeverRule (AASHTO LRFD 4.6.2.2.2 [R]; hand checks from the published method)', () => {
  it('gives 1 − 900/S for one lane when S ≥ 1800', () => {
    // any placement with one wheel on each side of the girder, both within S: ½ (2 − 1800/S) = 0.625 at S = 2400; × 1.2 = 0.75
    expect(interiorLeverRule({ girderSpacingMm: 2400, loadedLanes: 1 }).factor).toBeCloseTo(0.75, 12);
  });

  it('gives ½ for one lane when the wheels are farther apart than S', () => {
    // S = 1500: one wheel over the girder, the other 1800 mm away beyond the neighbour: ½ × 1.2 = 0.6
    expect(interiorLeverRule({ girderSpacingMm: 1500, loadedLanes: 1 }).factor).toBeCloseTo(0.6, 12);
  });

  it('finds the two-lane maximum with a wheel over the girder and the next truck 1200 mm away', () => {
    // S = 2400, wheels at −1800, 0, 1200, 3000: ½ (0.25 + 1 + 0.5 + 0) = 0.875 lanes, m = 1.0.
    // Straddling the girder (wheels −2400, −600, 600, 2400) gives only ½ (0 + 0.75 + 0.75 + 0) = 0.75.
    const lever = interiorLeverRule({ girderSpacingMm: 2400, loadedLanes: 2 });
    expect(lever.reactionLanes).toBeCloseTo(0.875, 12);
    expect(lever.multiplePresence).toBe(1);
    expect(lever.factor).toBeCloseTo(0.875, 12);
  });

  it('is never beaten by a fine sweep of truck positions', () => {
    fc.assert(
      fc.property(fc.double({ min: 900, max: 5500, noNaN: true }), fc.integer({ min: 1, max: 3 }), (girderSpacingMm, loadedLanes) => {
        const best = interiorLeverRule({ girderSpacingMm, loadedLanes });
        const pattern = best.wheelOffsetsMm.map((offsetMm) => offsetMm - best.wheelOffsetsMm[0]!);
        for (let shiftMm = -12_000; shiftMm <= 6000; shiftMm += 25) {
          const reaction = pattern.reduce((sum, offsetMm) => sum + 0.5 * Math.max(0, 1 - Math.abs(offsetMm + shiftMm) / girderSpacingMm), 0);
          expect(reaction).toBeLessThanOrEqual(best.reactionLanes + 1e-9);
        }
      }),
      { numRuns: 40 },
    );
  });
});

describe('exteriorRigidBody (AASHTO LRFD Eq. C4.6.2.2.2d-1 [R]; hand checks from the published formula)', () => {
  // Six girders at 2400 mm: x = ±1200, ±3600, ±6000, Σx² = 1.008e8 mm², Xext = 6000 mm.
  // de = 450: the first truck's centre is 600 + 900 = 1500 mm inside the barrier, e1 = 6000 + 450 − 1500 = 4950 mm.
  const span = { girderSpacingMm: 2400, girderCount: 6, barrierFaceToGirderMm: 450 };

  it('gives R = 1/6 + 6000 × 4950/1.008e8 = 0.461310 for one lane, × 1.2 = 0.553571', () => {
    const rigid = exteriorRigidBody({ ...span, loadedLanes: 1 });
    expect(rigid.truckEccentricitiesMm).toEqual([4950]);
    expect(rigid.reactionLanes).toBeCloseTo(0.46131, 5);
    expect(rigid.factor).toBeCloseTo(0.553571, 6);
  });

  it('gives R = 2/6 + 6000 × (4950 + 1350)/1.008e8 = 0.708333 for two lanes, × 1.0', () => {
    expect(exteriorRigidBody({ ...span, loadedLanes: 2 }).factor).toBeCloseTo(0.708333, 6);
  });

  it('gives R = 3/6 + 6000 × 4050/1.008e8 = 0.741071 for three lanes, × 0.85 = 0.629911', () => {
    const rigid = exteriorRigidBody({ ...span, loadedLanes: 3 });
    expect(rigid.truckEccentricitiesMm).toEqual([4950, 1350, -2250]);
    expect(rigid.factor).toBeCloseTo(0.629911, 6);
  });
});
