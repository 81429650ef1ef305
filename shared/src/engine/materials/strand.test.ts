import fc from 'fast-check';
import { ksiToMpa, mpaToKsi } from '../../units';
import c1 from '../fixtures/materials/c1-pci-270-strand.json';
import c2 from '../fixtures/materials/c2-pci-250-strand.json';
import isCurve from '../fixtures/materials/is1343-strand-curve.json';
import powerFormula from '../fixtures/materials/power-formula-strand.json';
import { EngineInputError } from './errors';
import {
  IS1343_STRAND_DESIGN_STRENGTH_RATIO,
  PCI_250_KSI_CURVE,
  PCI_270_KSI_CURVE,
  pciStrandCurveFor,
  pciStrandStressMpa,
  strandStressFor,
  strandStressIs1343Mpa,
  strandStressPowerMpa,
  type StrandCurveName,
  type StrandMaterial,
} from './strand';

describe.each([c1, c2])('$id $title ($source)', (fixture) => {
  const curve = pciStrandCurveFor(fixture.inputs.fpuMpa, fixture.inputs.epsMpa);

  it.each(fixture.cases)('gives $expectedStressKsi ksi at ε = $strain', ({ strain, expectedStressKsi }) => {
    expect(mpaToKsi(pciStrandStressMpa(curve, strain))).toBeCloseTo(expectedStressKsi, fixture.precision.decimals);
  });
});

describe(`${powerFormula.id} ${powerFormula.title} (${powerFormula.source})`, () => {
  it.each(powerFormula.cases)('gives $expectedStressMpa MPa at ε = $strain', ({ strain, expectedStressMpa }) => {
    expect(strandStressPowerMpa(strain, powerFormula.inputs)).toBeCloseTo(expectedStressMpa, powerFormula.precision.decimals);
  });

  it('is elastic at working strains: within 0.1 % of Eps ε up to 0.5 fpy (hand check from the published formula)', () => {
    const row = powerFormula.inputs;
    fc.assert(
      fc.property(fc.double({ min: 1e-6, max: (0.5 * row.fpyMpa) / row.epsMpa, noNaN: true }), (strain) => {
        const elasticStressMpa = row.epsMpa * strain;
        expect(Math.abs(strandStressPowerMpa(strain, row) - elasticStressMpa)).toBeLessThanOrEqual(1e-3 * elasticStressMpa);
      }),
    );
  });
});

describe(`${isCurve.id} ${isCurve.title} (${isCurve.source})`, () => {
  it.each(isCurve.cases)(
    'passes through stress ratio $stressRatio at inelastic strain $inelasticStrain',
    ({ strain, expectedStressMpa }) => {
      expect(strandStressIs1343Mpa(strain, isCurve.inputs)).toBeCloseTo(expectedStressMpa, isCurve.precision.decimals);
    },
  );

  it('stays at 0.87 fp beyond the last point and is elastic below the first', () => {
    const row = isCurve.inputs;
    expect(strandStressIs1343Mpa(0.05, row)).toBeCloseTo(IS1343_STRAND_DESIGN_STRENGTH_RATIO * row.fpuMpa, 9);
    expect(strandStressIs1343Mpa(0.003, row)).toBeCloseTo(0.003 * row.epsMpa, 9);
  });
});

describe('pciStrandCurveFor', () => {
  it('picks the curve of the row grade within 1 % of fpu', () => {
    expect(pciStrandCurveFor(1860, 196_500)).toBe(PCI_270_KSI_CURVE);
    expect(pciStrandCurveFor(ksiToMpa(270), 197_000)).toBe(PCI_270_KSI_CURVE);
    expect(pciStrandCurveFor(1878, 196_500)).toBe(PCI_270_KSI_CURVE);
    expect(pciStrandCurveFor(1725, 200_000)).toBe(PCI_250_KSI_CURVE);
  });

  it('refuses 1600 MPa strand, naming the JSON path of its fpu', () => {
    const refusal = () => pciStrandCurveFor(1600, 196_500, 'girder.strandRows[2]');
    expect(refusal).toThrow(EngineInputError);
    expect(refusal).toThrow(/^girder\.strandRows\[2\]\.fpuMpa: the PCI strand curves cover only 1860 or 1725 MPa/);
  });

  it('refuses strand just over 1 % from 1860 MPa', () => {
    expect(() => pciStrandCurveFor(1880, 196_500)).toThrow(/^fpuMpa:/);
  });

  it('refuses a modulus more than 2 % from 196 500 MPa, naming the JSON path of its Eps', () => {
    let caught: unknown;
    try {
      pciStrandCurveFor(1860, 201_000, 'girder.strandRows[0]');
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(EngineInputError);
    expect((caught as EngineInputError).path).toBe('girder.strandRows[0].epsMpa');
  });

  it('refuses through strandStressFor as well', () => {
    expect(() => strandStressFor('pci', 0.01, { epsMpa: 196_500, fpuMpa: 1600, fpyMpa: 1440 })).toThrow(EngineInputError);
  });
});

describe('the PCI 270 ksi curve where its branches meet', () => {
  it('keeps the published 0.1 ksi step down just past ε = 0.0086 (hand check from the published formula)', () => {
    const atLimit = mpaToKsi(pciStrandStressMpa(PCI_270_KSI_CURVE, 0.0086));
    const justPast = mpaToKsi(pciStrandStressMpa(PCI_270_KSI_CURVE, 0.0086 + 1e-12));
    expect(atLimit).toBeCloseTo(245.1, 9);
    expect(justPast).toBeCloseTo(245.0, 6);
  });
});

const grade270: StrandMaterial = { epsMpa: 196_500, fpuMpa: 1860, fpyMpa: 1674 };
const grade250: StrandMaterial = { epsMpa: 196_500, fpuMpa: 1725, fpyMpa: 1552.5 };

/** Strand rows of plausible grade and modulus (ranges: common practice, no source). */
const anyStrandRow = fc
  .record({
    fpuMpa: fc.double({ min: 1400, max: 2100, noNaN: true }),
    epsMpa: fc.double({ min: 185_000, max: 205_000, noNaN: true }),
  })
  .map(({ fpuMpa, epsMpa }): StrandMaterial => ({ fpuMpa, epsMpa, fpyMpa: 0.9 * fpuMpa }));

interface CurveUnderTest {
  readonly curve: StrandCurveName;
  readonly rows: fc.Arbitrary<StrandMaterial>;
  readonly ceilingMpa: (row: StrandMaterial) => number;
}

const curvesUnderTest: CurveUnderTest[] = [
  { curve: 'power', rows: anyStrandRow, ceilingMpa: (row) => row.fpuMpa },
  { curve: 'pci', rows: fc.constantFrom(grade270, grade250), ceilingMpa: (row) => row.fpuMpa },
  { curve: 'is1343', rows: anyStrandRow, ceilingMpa: (row) => IS1343_STRAND_DESIGN_STRENGTH_RATIO * row.fpuMpa },
];

const anyStrain = fc.double({ min: -0.05, max: 0.1, noNaN: true });

/** The only fall any curve is allowed: the published step of the PCI 270 ksi curve at ε = 0.0086. */
function allowedFallMpa(curve: StrandCurveName, row: StrandMaterial, lower: number, upper: number): number {
  const limit = PCI_270_KSI_CURVE.elasticLimitStrain;
  const crossesStep = (from: number, to: number) => from <= limit && to > limit;
  const isPci270 = curve === 'pci' && row === grade270;
  return isPci270 && (crossesStep(lower, upper) || crossesStep(-upper, -lower)) ? ksiToMpa(0.1) + 1e-9 : 0;
}

describe.each(curvesUnderTest)('the $curve strand curve', ({ curve, rows, ceilingMpa }) => {
  it('never falls as strain grows', () => {
    fc.assert(
      fc.property(rows, anyStrain, anyStrain, (row, a, b) => {
        const [lower, upper] = a <= b ? [a, b] : [b, a];
        const rise = strandStressFor(curve, upper, row) - strandStressFor(curve, lower, row);
        expect(rise).toBeGreaterThanOrEqual(-allowedFallMpa(curve, row, lower, upper) - 1e-9);
      }),
    );
  });

  it('never exceeds its ceiling (fpu, or 0.87 fp for IS 1343)', () => {
    fc.assert(
      fc.property(rows, anyStrain, (row, strain) => {
        expect(Math.abs(strandStressFor(curve, strain, row))).toBeLessThanOrEqual(ceilingMpa(row) * (1 + 1e-12));
      }),
    );
  });

  it('is odd in strain', () => {
    fc.assert(
      fc.property(rows, anyStrain, (row, strain) => {
        expect(strandStressFor(curve, -strain, row) + strandStressFor(curve, strain, row)).toBe(0);
      }),
    );
  });
});

describe('strandStressFor', () => {
  it('dispatches to the curve it names', () => {
    expect(strandStressFor('power', 0.012, grade270)).toBe(strandStressPowerMpa(0.012, grade270));
    expect(strandStressFor('pci', 0.012, grade270)).toBe(pciStrandStressMpa(PCI_270_KSI_CURVE, 0.012));
    expect(strandStressFor('is1343', 0.012, grade270)).toBe(strandStressIs1343Mpa(0.012, grade270));
  });
});
