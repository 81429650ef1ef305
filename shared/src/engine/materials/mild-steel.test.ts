import fc from 'fast-check';
import { MILD_STEEL_MODULUS_MPA, mildSteelStressMpa } from './mild-steel';

describe('mildSteelStressMpa (elastic–perfectly plastic, engineering.md §3)', () => {
  it('is elastic with Es = 200 000 MPa below yield (hand check: 200 000 × 0.001 = 200 MPa)', () => {
    expect(mildSteelStressMpa(0.001, { fyMpa: 420 })).toBeCloseTo(200, 12);
    expect(mildSteelStressMpa(0.001, { fyMpa: 420, esMpa: 190_000 })).toBeCloseTo(190, 12);
  });

  it('holds ±fy beyond the yield strain', () => {
    expect(mildSteelStressMpa(0.01, { fyMpa: 420 })).toBe(420);
    expect(mildSteelStressMpa(-0.01, { fyMpa: 420 })).toBe(-420);
  });

  it('is the same in compression as in tension and never exceeds fy', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 200, max: 700, noNaN: true }),
        fc.double({ min: -0.05, max: 0.05, noNaN: true }),
        (fyMpa, strain) => {
          const stressMpa = mildSteelStressMpa(strain, { fyMpa });
          const yielded = Math.abs(strain) * MILD_STEEL_MODULUS_MPA >= fyMpa;
          expect(mildSteelStressMpa(-strain, { fyMpa }) + stressMpa).toBe(0);
          expect(Math.abs(stressMpa)).toBeLessThanOrEqual(fyMpa);
          if (yielded) expect(Math.abs(stressMpa)).toBe(fyMpa);
        },
      ),
    );
  });
});
