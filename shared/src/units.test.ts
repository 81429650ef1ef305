import fc from 'fast-check';
import {
  convert,
  in2ToMm2,
  in4ToMm4,
  inToMm,
  kcfToKnPerM3,
  kipFtToKnM,
  kipPerFtToKnPerM,
  kipToKn,
  knMToKipFt,
  knPerM3ToKcf,
  knPerM3ToPcf,
  knPerMToKipPerFt,
  knToKip,
  knToTonnes,
  knToUsTons,
  kpaToKsf,
  ksfToKpa,
  ksiToMpa,
  mm2ToIn2,
  mm4ToIn4,
  mmToIn,
  mpaToKsi,
  mToFt,
  ftToM,
  pcfToKnPerM3,
  tonnesToKn,
  unitsOf,
  usTonsToKn,
  type Quantity,
  type Unit,
} from './units';

/** `convert` as untyped input (an import file's column) reaches it. */
const untypedConvert = convert as (value: number, fromUnit: string, toUnit: string) => number;

/** Relative agreement for values that pass through a multiply and a divide. */
function expectRelativelyClose(actual: number, expected: number, relativeTolerance = 1e-12): void {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(relativeTolerance * Math.max(Math.abs(expected), 1e-300));
}

describe('defining constants (engineering.md §1)', () => {
  it('converts one of each defining unit to its stated SI value', () => {
    expect(ksiToMpa(1)).toBe(6.894757);
    expect(inToMm(1)).toBe(25.4);
    expect(kipToKn(1)).toBeCloseTo(4.448222, 12);
    expect(ftToM(1)).toBeCloseTo(0.3048, 12);
  });
});

describe('derived conversions — hand checks from the defining constants', () => {
  it.each([
    ['k-ft → kN·m: 4.448222 × 0.3048', kipFtToKnM(1), 1.3558180656],
    ['kip/ft → kN/m: 4.448222 / 0.3048', kipPerFtToKnPerM(1), 14.593904199475066],
    ['in² → mm²: 25.4²', in2ToMm2(1), 645.16],
    ['in⁴ → mm⁴: 25.4⁴', in4ToMm4(1), 416231.4256],
    ['ksf → kPa: 6894.757 / 144', ksfToKpa(1), 47.88025694444444],
    ['pcf → kN/m³: 4.448222e-3 / 0.3048³', pcfToKnPerM3(1), 0.1570874774331934],
    ['kcf → kN/m³: 4.448222 / 0.3048³', kcfToKnPerM3(1), 157.0874774331934],
    ['US ton → kN: 2 × 4.448222', usTonsToKn(1), 8.896444],
    ['tonne → kN: 9.80665', tonnesToKn(1), 9.80665],
  ])('%s', (_label, actual, expected) => {
    expectRelativelyClose(actual, expected, 1e-12);
  });

  it('gives 150 pcf concrete as 23.56 kN/m³ (hand check: 150 × 0.157087)', () => {
    expect(pcfToKnPerM3(150)).toBeCloseTo(23.563, 3);
  });

  it('gives a 36-ton legal load as 320.27 kN and a 25 t load as 245.17 kN (hand check)', () => {
    expect(usTonsToKn(36)).toBeCloseTo(320.272, 3);
    expect(tonnesToKn(25)).toBeCloseTo(245.166, 3);
  });
});

describe('named conversions undo each other', () => {
  const pairs: [string, (x: number) => number, (x: number) => number][] = [
    ['ksi/MPa', ksiToMpa, mpaToKsi],
    ['ksf/kPa', ksfToKpa, kpaToKsf],
    ['in/mm', inToMm, mmToIn],
    ['ft/m', ftToM, mToFt],
    ['in²/mm²', in2ToMm2, mm2ToIn2],
    ['in⁴/mm⁴', in4ToMm4, mm4ToIn4],
    ['kip/kN', kipToKn, knToKip],
    ['k-ft/kN·m', kipFtToKnM, knMToKipFt],
    ['kip/ft / kN/m', kipPerFtToKnPerM, knPerMToKipPerFt],
    ['pcf/kN/m³', pcfToKnPerM3, knPerM3ToPcf],
    ['kcf/kN/m³', kcfToKnPerM3, knPerM3ToKcf],
    ['US ton/kN', usTonsToKn, knToUsTons],
    ['tonne/kN', tonnesToKn, knToTonnes],
  ];

  it.each(pairs)('%s round trip', (_label, there, back) => {
    fc.assert(
      fc.property(fc.double({ min: -1e9, max: 1e9, noNaN: true }), (value) => {
        expectRelativelyClose(back(there(value)), value);
      }),
    );
  });
});

describe('convert', () => {
  const quantities: Quantity[] = [
    'length',
    'area',
    'secondMomentOfArea',
    'force',
    'stress',
    'moment',
    'lineLoad',
    'unitWeight',
  ];

  it.each(quantities)('round-trips every pair of %s units', (quantity) => {
    const units = unitsOf(quantity) as Unit[];
    fc.assert(
      fc.property(
        fc.constantFrom(...units),
        fc.constantFrom(...units),
        // Subnormal inputs would underflow through mm⁴ ↔ m⁴ (a factor of 1e−12); no quantity of a bridge is that small.
        fc.double({ min: -1e9, max: 1e9, noNaN: true }).filter((value) => value === 0 || Math.abs(value) > 1e-200),
        (fromUnit, toUnit, value) => {
          expectRelativelyClose(untypedConvert(untypedConvert(value, fromUnit, toUnit), toUnit, fromUnit), value);
        },
      ),
    );
  });

  it('agrees with the named conversions', () => {
    expect(convert(2.5, 'ksi', 'MPa')).toBe(ksiToMpa(2.5));
    expect(convert(100, 'kipFt', 'kNm')).toBeCloseTo(kipFtToKnM(100), 10);
    expect(convert(3, 'ton', 'kN')).toBeCloseTo(usTonsToKn(3), 12);
  });

  it('returns the same number when both units are the same size', () => {
    expect(convert(0.1 + 0.2, 'kN/m', 'N/mm')).toBe(0.1 + 0.2);
  });

  it('refuses a unit it does not know and a pair of different quantities', () => {
    expect(() => untypedConvert(1, 'furlong', 'mm')).toThrow(/unknown unit "furlong"/);
    expect(() => untypedConvert(1, 'ksi', 'mm')).toThrow(/cannot convert stress \(ksi\) to length \(mm\)/);
  });
});
