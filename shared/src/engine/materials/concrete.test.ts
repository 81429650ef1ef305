import fc from 'fast-check';
import c6 from '../fixtures/materials/c6-beta1.json';
import c8 from '../fixtures/materials/c8-alpha1.json';
import {
  IS_PEAK_CONCRETE_STRAIN,
  IS_RECTANGULAR_ZONE_RESULTANT,
  IS_ULTIMATE_CONCRETE_STRAIN,
  blockAlpha1,
  blockBeta1,
  isConcreteStressMpa,
  requireBasis,
  todeschiniPeakStrain,
  todeschiniStressMpa,
  type TodeschiniConcrete,
} from './concrete';
import { EngineInputError } from './errors';

describe(`${c6.id} ${c6.title} (${c6.source})`, () => {
  it.each(c6.cases)('β1 = $expectedBeta1 at f′c = $fcMpa MPa', ({ fcMpa, expectedBeta1 }) => {
    expect(blockBeta1(fcMpa)).toBeCloseTo(expectedBeta1, c6.precision.decimals);
  });
});

describe(`${c8.id} ${c8.title} (${c8.source})`, () => {
  it.each(c8.cases)('α1 = $expectedAlpha1 at f′c = $fcMpa MPa', ({ fcMpa, expectedAlpha1 }) => {
    expect(blockAlpha1(fcMpa)).toBeCloseTo(expectedAlpha1, c8.precision.decimals);
  });
});

describe('stress-block factor limits (AASHTO LRFD 5.6.2.2 [R], SI form, engineering.md §3)', () => {
  it('holds β1 at 0.85 up to 28 MPa and at 0.65 from 56 MPa', () => {
    expect(blockBeta1(20)).toBe(0.85);
    expect(blockBeta1(28)).toBe(0.85);
    expect(blockBeta1(56)).toBeCloseTo(0.65, 12);
    expect(blockBeta1(90)).toBe(0.65);
  });

  it('holds α1 at 0.85 up to 69 MPa and at 0.75 from 104 MPa', () => {
    expect(blockAlpha1(40)).toBe(0.85);
    expect(blockAlpha1(69)).toBe(0.85);
    expect(blockAlpha1(104)).toBeCloseTo(0.75, 12);
    expect(blockAlpha1(140)).toBe(0.75);
  });
});

describe('requireBasis', () => {
  it('passes a strength of the expected basis through', () => {
    expect(requireBasis({ strengthMpa: 34.5, basis: 'cylinder' }, 'cylinder', 'girder.concrete')).toBe(34.5);
  });

  it('refuses a cube strength given to an AASHTO block, at the JSON path of its basis', () => {
    const cube = { strengthMpa: 40, basis: 'cube' } as const;
    expect(() => requireBasis(cube, 'cylinder', 'girder.deck')).toThrow(EngineInputError);
    expect(() => requireBasis(cube, 'cylinder', 'girder.deck')).toThrow(
      /^girder\.deck\.basis: this method needs a cylinder strength but was given a cube strength/,
    );
  });

  it('refuses a cylinder strength given to an IS formula', () => {
    expect(() => requireBasis({ strengthMpa: 30, basis: 'cylinder' }, 'cube', '')).toThrow(/^basis:/);
  });
});

/** Normal to high-strength concrete with a modulus near 4700 √f′c (ranges: common practice, no source). */
const anyTodeschiniConcrete: fc.Arbitrary<TodeschiniConcrete> = fc
  .record({
    fcMpa: fc.double({ min: 20, max: 100, noNaN: true }),
    modulusScale: fc.double({ min: 0.8, max: 1.2, noNaN: true }),
  })
  .map(({ fcMpa, modulusScale }) => ({ fcMpa, ecMpa: modulusScale * 4700 * Math.sqrt(fcMpa) }));

describe('todeschiniStressMpa (Todeschini parabola [R], engineering.md §3)', () => {
  it('peaks at 0.9 f′c at ε0 = 1.71 f′c/Ec', () => {
    fc.assert(
      fc.property(anyTodeschiniConcrete, (concrete) => {
        expect(todeschiniStressMpa(todeschiniPeakStrain(concrete), concrete)).toBeCloseTo(0.9 * concrete.fcMpa, 9);
        expect(todeschiniPeakStrain(concrete)).toBeCloseTo((1.71 * concrete.fcMpa) / concrete.ecMpa, 15);
      }),
    );
  });

  it('rises to ε0 and falls after it, never above the peak', () => {
    const shareOfPeakStrain = fc.double({ min: 0, max: 1, noNaN: true });
    fc.assert(
      fc.property(anyTodeschiniConcrete, shareOfPeakStrain, shareOfPeakStrain, (concrete, a, b) => {
        const peakStrain = todeschiniPeakStrain(concrete);
        const stressAt = (share: number) => todeschiniStressMpa(share * peakStrain, concrete);
        const [lower, upper] = a <= b ? [a, b] : [b, a];
        expect(stressAt(upper) - stressAt(lower)).toBeGreaterThanOrEqual(-1e-9);
        expect(stressAt(1 + upper) - stressAt(1 + lower)).toBeLessThanOrEqual(1e-9);
        expect(stressAt(1 + upper)).toBeLessThanOrEqual(0.9 * concrete.fcMpa * (1 + 1e-12));
      }),
    );
  });

  it('carries nothing in tension', () => {
    expect(todeschiniStressMpa(-0.0001, { fcMpa: 34.5, ecMpa: 27_600 })).toBe(0);
    expect(todeschiniStressMpa(0, { fcMpa: 34.5, ecMpa: 27_600 })).toBe(0);
  });
});

describe('isConcreteStressMpa (IS 456 / IS 1343 parabolic-rectangular design curve [R])', () => {
  it('reaches 0.446 fck at a strain of 0.002 and holds it to 0.0035', () => {
    expect(isConcreteStressMpa(IS_PEAK_CONCRETE_STRAIN, 40)).toBeCloseTo(0.446 * 40, 12);
    expect(isConcreteStressMpa(IS_ULTIMATE_CONCRETE_STRAIN, 40)).toBeCloseTo(0.446 * 40, 12);
  });

  it('gives 0.75 of the peak at half the peak strain (hand check from the published parabola: 2r − r² at r = ½)', () => {
    expect(isConcreteStressMpa(0.001, 40)).toBeCloseTo(0.75 * 0.446 * 40, 12);
  });

  it('never falls as strain grows, and carries nothing in tension', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 15, max: 80, noNaN: true }),
        fc.double({ min: -0.001, max: IS_ULTIMATE_CONCRETE_STRAIN, noNaN: true }),
        fc.double({ min: -0.001, max: IS_ULTIMATE_CONCRETE_STRAIN, noNaN: true }),
        (fckMpa, a, b) => {
          const [lower, upper] = a <= b ? [a, b] : [b, a];
          expect(isConcreteStressMpa(upper, fckMpa)).toBeGreaterThanOrEqual(isConcreteStressMpa(lower, fckMpa));
        },
      ),
    );
    expect(isConcreteStressMpa(-0.0005, 40)).toBe(0);
  });

  it('integrates over a rectangular zone to 0.36 fck xu at 0.42 xu (hand check of the published constants)', () => {
    const slices = 20_000;
    let forcePerFckXu = 0;
    let momentAboutTop = 0;
    for (let i = 0; i < slices; i++) {
      const depthRatio = (i + 0.5) / slices;
      const stressRatio = isConcreteStressMpa(IS_ULTIMATE_CONCRETE_STRAIN * (1 - depthRatio), 1) / slices;
      forcePerFckXu += stressRatio;
      momentAboutTop += stressRatio * depthRatio;
    }
    expect(forcePerFckXu).toBeCloseTo(IS_RECTANGULAR_ZONE_RESULTANT.forceRatio, 2);
    expect(momentAboutTop / forcePerFckXu).toBeCloseTo(IS_RECTANGULAR_ZONE_RESULTANT.depthRatio, 2);
  });
});
