import fc from 'fast-check';
import c6 from '../fixtures/capacity/c6-aashto-approximate.json';
import { EngineInputError } from '../materials';
import type { RectangleSection } from '../section';
import { aashtoApproximateStrength } from './aashto-approximate';
import { testConcrete, testSectionModel, type TestModelSpec } from './test-models';

/** Expects `actual` within ± `tolerance` of `expected`. */
function expectWithin(actual: number, expected: number, tolerance: number): void {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(tolerance);
}

/** The C6 section with its rows replaced: b = 305 mm, depth 610 mm, f'c = 34.5 MPa (engineering.md §8 rows C6, C13). */
function c6Section(strandRows: TestModelSpec['strandRows'], bars: TestModelSpec['bars'] = []): TestModelSpec {
  return { section: { shape: 'rectangle', widthMm: 305, depthMm: 610 }, concrete: testConcrete(34.5), strandRows, bars };
}

describe(`${c6.id} ${c6.title} (${c6.source})`, () => {
  const { inputs, expected, tolerance } = c6;
  const result = aashtoApproximateStrength(
    testSectionModel({
      section: inputs.section as RectangleSection,
      concrete: testConcrete(inputs.concrete.strengthMpa, 'cylinder'),
      strandRows: inputs.strandRows,
    }),
  );

  it('gives β1, c, fps, Mn and φ of the fixture', () => {
    expectWithin(result.blockDepthMm! / result.neutralAxisDepthMm, expected.beta1, tolerance.beta1);
    expectWithin(result.neutralAxisDepthMm, expected.neutralAxisDepthMm, tolerance.neutralAxisDepthMm);
    expectWithin(result.rows[0]!.stressMpa, expected.stressMpa, tolerance.stressMpa);
    expectWithin(result.nominalMomentKnm, expected.nominalMomentKnm, tolerance.nominalMomentKnm);
    expectWithin(result.phi, expected.phi, tolerance.phi);
  });

  it('reports the row, the method and φMn, with no warnings', () => {
    expect(result.method).toBe('aashto-approximate');
    expect(result.rows).toEqual([{ rowId: 'r1', yMm: 102, effectiveStrands: 4, totalStrain: null, stressMpa: result.rows[0]!.stressMpa }]);
    expect(result.factoredMomentKnm).toBeCloseTo(result.phi * result.nominalMomentKnm, 12);
    expect(result.warnings).toEqual([]);
  });
});

describe('aashtoApproximateStrength, flanged behaviour (AASHTO LRFD 5.6.3.1.1 [R])', () => {
  // Hand check from the published formula. Tee: b = 1000, hf = 100, bw = 200, depth 800 mm;
  // f'c = 35 MPa → β1 = 0.85 − 0.05 (35 − 28)/7 = 0.80, α1 = 0.85; 2 rows of 10 strands at
  // y = 60 and 100 → Aps = 1974 mm² at their centroid dp = 720 mm; k = 0.28, Aps fpu = 3 671 640 N.
  // Rectangular trial: c = 3 671 640/(0.85·35·0.80·1000 + 0.28·3 671 640/720) = 145.5 mm,
  //   a = 116.4 mm > hf → flanged.
  // Overhang 0.85·35·(1000 − 200)·100 = 2 380 000 N;
  // c = (3 671 640 − 2 380 000)/(0.85·35·0.80·200 + 1427.86) = 1 291 640/6187.86 = 208.74 mm;
  // a = 166.99 mm; fps = 1860 (1 − 0.28·208.74/720) = 1709.0 MPa;
  // Mn = 1974·1709.0·(720 − 83.50) + 2 380 000·(83.50 − 50) = 2147.31 + 79.72 = 2227.0 kN·m;
  // εt = 0.003 (740 − 208.74)/208.74 = 0.0076 → φ = 1.0.
  const result = aashtoApproximateStrength(
    testSectionModel({
      section: { shape: 'tee', flangeWidthMm: 1000, flangeThicknessMm: 100, webWidthMm: 200, depthMm: 800 },
      concrete: testConcrete(35),
      strandRows: [
        { yMm: 60, count: 10 },
        { yMm: 100, count: 10 },
      ],
    }),
  );

  it('gives c, a, fps, Mn and φ of the hand check', () => {
    expect(result.neutralAxisDepthMm).toBeCloseTo(208.74, 2);
    expect(result.blockDepthMm).toBeCloseTo(166.99, 2);
    expect(result.rows.map((row) => row.stressMpa)).toEqual([expect.closeTo(1709.0, 1), expect.closeTo(1709.0, 1)]);
    expect(result.nominalMomentKnm).toBeCloseTo(2227.0, 1);
    expect(result.extremeTensionStrain).toBeCloseTo(0.003 * (740 - 208.7377) / 208.7377, 6);
    expect(result.phi).toBe(1);
  });

  it('balances the tension with the web block and the overhang', () => {
    const tensionN = 1974 * result.rows[0]!.stressMpa;
    const compressionN = 0.85 * 35 * (200 * result.blockDepthMm! + 800 * 100);
    expect(tensionN / compressionN).toBeCloseTo(1, 12);
  });
});

describe('aashtoApproximateStrength with a deck as the compression flange', () => {
  const girder = { shape: 'rectangle', widthMm: 400, depthMm: 900 } as const;
  const deck = { widthMm: 1200, thicknessMm: 150, concrete: testConcrete(28) };
  const withDeck = (count: number) =>
    aashtoApproximateStrength(testSectionModel({ section: girder, concrete: testConcrete(50), deck, strandRows: [{ yMm: 80, count }] }));

  it('takes b and f′c from the deck: a block within it matches a 1200 mm rectangle of deck concrete', () => {
    const rectangleOfDeckConcrete = aashtoApproximateStrength(
      testSectionModel({
        section: { shape: 'rectangle', widthMm: 1200, depthMm: 1050 },
        concrete: testConcrete(28),
        strandRows: [{ yMm: 80, count: 10 }],
      }),
    );
    const result = withDeck(10);
    expect(result.blockDepthMm!).toBeLessThan(150);
    expect(result.neutralAxisDepthMm).toBeCloseTo(rectangleOfDeckConcrete.neutralAxisDepthMm, 9);
    expect(result.nominalMomentKnm).toBeCloseTo(rectangleOfDeckConcrete.nominalMomentKnm, 9);
    expect(result.warnings).toEqual([]);
  });

  it('warns when the block passes below the deck', () => {
    const result = withDeck(30);
    expect(result.blockDepthMm!).toBeGreaterThan(150);
    expect(result.warnings).toContain(
      'the stress block reaches below the deck: the girder concrete is treated as deck concrete; use strain compatibility',
    );
  });
});

describe('aashtoApproximateStrength, unbonded strand (AASHTO LRFD 5.6.3.1.2 [R], SI form)', () => {
  it('solves c with fps = fpe + 6200 (dp − c)/le', () => {
    // Hand check from the published formula, C6 section, 4 unbonded strands, fpe = 1100, le = 10 000 mm:
    // α1 f'c β1 b = 0.85·34.5·0.8036·305 = 7187.24 N/mm; Aps = 394.8 mm²;
    // c = 394.8 (1100 + 6200·508/10 000)/(7187.24 + 394.8·6200/10 000) = 558 627/7432.0 = 75.16 mm;
    // fps = 1100 + 6200 (508 − 75.16)/10 000 = 1368.4 MPa; Mn = 394.8·1368.4·(508 − 30.20) = 258.1 kN·m.
    const unbonded = { yMm: 102, count: 4, bonded: false, unbondedLengthMm: 10_000 };
    const result = aashtoApproximateStrength(testSectionModel(c6Section([unbonded])));
    expect(result.neutralAxisDepthMm).toBeCloseTo(75.16, 2);
    expect(result.rows[0]!.stressMpa).toBeCloseTo(1368.4, 1);
    expect(result.nominalMomentKnm).toBeCloseTo(258.1, 1);
    expect(result.warnings).toContain(
      'unbonded strand: le is taken as the tendon length between anchorages; ' +
        'AASHTO LRFD 5.6.3.1.2 reduces it to 2 li/(2 + Ns) for continuous tendons',
    );
  });

  it('holds the stress at fpy when the formula passes it', () => {
    // Hand check from the published formula: le = 1000 mm would give fps ≈ 3679 MPa > fpy = 1674, so
    // c = 394.8·1674/7187.24 = 91.95 mm and Mn = 394.8·1674·(508 − 0.8036·91.95/2) = 311.3 kN·m.
    const result = aashtoApproximateStrength(testSectionModel(c6Section([{ yMm: 102, count: 4, bonded: false, unbondedLengthMm: 1000 }])));
    expect(result.rows[0]!.stressMpa).toBe(1674);
    expect(result.neutralAxisDepthMm).toBeCloseTo(91.95, 2);
    expect(result.nominalMomentKnm).toBeCloseTo(311.3, 1);
  });

  it('refuses an unbonded row without its length', () => {
    const model = testSectionModel(c6Section([{ yMm: 102, count: 4, bonded: false }]));
    expect(() => aashtoApproximateStrength(model)).toThrow(/^girder\.strandRows\[0\]\.unbondedLengthMm: /);
  });
});

describe('aashtoApproximateStrength, exposed strands and bars', () => {
  it('counts exposed strands at fpe outside the bonded resultant', () => {
    // Hand check from the published formula: C6 with 1 of 4 strands exposed, fpe = 1100 MPa;
    // c = (3·98.7·1860 + 98.7·1100)/(7187.24 + 0.28·3·98.7·1860/508) = 659 316/7490.8 = 88.02 mm;
    // fps = 1860 (1 − 0.28·88.02/508) = 1769.8 MPa; row mean (3·1769.8 + 1100)/4 = 1602.3 MPa;
    // Mn = (3·98.7·1769.8 + 98.7·1100)(508 − 0.8036·88.02/2) = 299.0 kN·m.
    const result = aashtoApproximateStrength(testSectionModel(c6Section([{ yMm: 102, count: 4, exposedCount: 1 }])));
    expect(result.neutralAxisDepthMm).toBeCloseTo(88.02, 2);
    expect(result.rows[0]!.stressMpa).toBeCloseTo(1602.3, 1);
    expect(result.rows[0]!.effectiveStrands).toBe(4);
    expect(result.nominalMomentKnm).toBeCloseTo(299.0, 1);
  });

  it('rates a section of bars only as reinforced, at fy', () => {
    // Hand check from the published formula: 1000 mm² at d = 550 mm, fy = 420 MPa, C6 concrete;
    // c = 420 000/7187.24 = 58.44 mm, a = 46.96 mm, Mn = 420 000 (550 − 23.48) = 221.1 kN·m;
    // εt = 0.003 (550 − 58.44)/58.44 = 0.0252 → φ = 0.90 (reinforced).
    const result = aashtoApproximateStrength(testSectionModel(c6Section([], [{ yMm: 60, areaMm2: 1000 }])));
    expect(result.neutralAxisDepthMm).toBeCloseTo(58.44, 2);
    expect(result.nominalMomentKnm).toBeCloseTo(221.1, 1);
    expect(result.phi).toBeCloseTo(0.9, 12);
    expect(result.rows).toEqual([]);
  });

  it('ignores bars above mid-depth, with a warning', () => {
    const strandOnly = aashtoApproximateStrength(testSectionModel(c6Section([{ yMm: 102, count: 4 }])));
    const withTopBar = aashtoApproximateStrength(testSectionModel(c6Section([{ yMm: 102, count: 4 }], [{ yMm: 560, areaMm2: 400 }])));
    expect(withTopBar.nominalMomentKnm).toBe(strandOnly.nominalMomentKnm);
    expect(withTopBar.warnings).toContain('bars above mid-depth are ignored: the approximate method here counts no compression steel');
  });

  it('warns when a tension bar would not yield at the neutral axis found', () => {
    // A bar just below mid-depth under a deep block: its strain εcu (d − c)/c is below fy/Es.
    const result = aashtoApproximateStrength(testSectionModel(c6Section([{ yMm: 102, count: 12 }], [{ yMm: 290, areaMm2: 400 }])));
    expect(result.warnings).toContain(
      'girder.bars[0]: the bar does not reach yield at this neutral axis but is counted at fy; use strain compatibility',
    );
  });

  it('gives Mn = 0 with a warning when every strand is lost', () => {
    const result = aashtoApproximateStrength(testSectionModel(c6Section([{ yMm: 102, count: 0 }])));
    expect(result.nominalMomentKnm).toBe(0);
    expect(result.factoredMomentKnm).toBe(0);
    expect(result.warnings).toContain('no tension steel remains at this section: Mn = 0');
  });
});

describe('aashtoApproximateStrength validity', () => {
  it('refuses a section with no recognised compression flange, at options.method', () => {
    const triangle = testSectionModel({
      section: { shape: 'polygon', pointsMm: [[-300, 0], [300, 0], [0, 600]] },
      concrete: testConcrete(34.5),
      strandRows: [{ yMm: 50, count: 4 }],
    });
    expect(() => aashtoApproximateStrength(triangle)).toThrow(EngineInputError);
    expect(() => aashtoApproximateStrength(triangle)).toThrow(/^options\.method: /);
  });

  it('refuses a cube strength at the basis of the flange concrete', () => {
    const model = testSectionModel({ ...c6Section([{ yMm: 102, count: 4 }]), concrete: testConcrete(40, 'cube') });
    expect(() => aashtoApproximateStrength(model)).toThrow(/^girder\.concrete\.basis: /);
  });

  it('refuses bonded rows of different grades, at the second row', () => {
    const model = testSectionModel(c6Section([{ yMm: 102, count: 2 }, { yMm: 152, count: 2, fpuMpa: 1725 }]));
    expect(() => aashtoApproximateStrength(model)).toThrow(/^girder\.strandRows\[1\]\.fpuMpa: /);
  });

  it('warns when fpe < 0.5 fpu, the article’s condition', () => {
    const result = aashtoApproximateStrength(testSectionModel(c6Section([{ yMm: 102, count: 4, fpeMpa: 900 }])));
    expect(result.warnings).toEqual([
      'girder.strandRows[0]: fpe = 900.0 MPa is below 0.5 fpu = 930.0 MPa, outside AASHTO LRFD 5.6.3.1.1; use strain compatibility',
    ]);
  });

  it('lowers φ below 1.0 when the section is not tension-controlled', () => {
    // Heavily prestressed C6 section: εt = εcu (dt − c)/c falls below 0.005 (AASHTO LRFD 5.5.4.2 [R]).
    const result = aashtoApproximateStrength(testSectionModel(c6Section([{ yMm: 102, count: 14 }])));
    expect(result.extremeTensionStrain!).toBeLessThan(0.005);
    expect(result.phi).toBeCloseTo(0.75 + ((result.extremeTensionStrain! - 0.002) / 0.003) * 0.25, 12);
  });
});

/** Bonded rectangles and tees of bridge-girder proportions (ranges: common practice, no source). */
const anyGirder = fc.record({
  webWidthMm: fc.integer({ min: 150, max: 1200 }),
  depthMm: fc.integer({ min: 400, max: 2000 }),
  flange: fc.option(
    fc.record({ widthRatio: fc.double({ min: 1.5, max: 6, noNaN: true }), thicknessMm: fc.integer({ min: 80, max: 250 }) }),
    { nil: null },
  ),
});
type AnyGirder = typeof anyGirder extends fc.Arbitrary<infer G> ? G : never;

function girderStrength(girder: AnyGirder, fcMpa: number, strandCount: number) {
  const section: TestModelSpec['section'] = girder.flange
    ? {
        shape: 'tee',
        flangeWidthMm: girder.webWidthMm * girder.flange.widthRatio,
        flangeThicknessMm: girder.flange.thicknessMm,
        webWidthMm: girder.webWidthMm,
        depthMm: girder.depthMm,
      }
    : { shape: 'rectangle', widthMm: girder.webWidthMm, depthMm: girder.depthMm };
  const model = testSectionModel({ section, concrete: testConcrete(fcMpa), strandRows: [{ yMm: 80, count: strandCount }] });
  const strength = aashtoApproximateStrength(model);
  // Within the method's validity the neutral axis lies above the strand.
  fc.pre(strength.neutralAxisDepthMm < girder.depthMm - 80);
  return strength.nominalMomentKnm;
}

describe('aashtoApproximateStrength properties (nominal Mn never falls as material is added, engineering.md §8)', () => {
  const anyStrength = fc.double({ min: 28, max: 100, noNaN: true });
  const anyCount = fc.integer({ min: 1, max: 60 });

  it('Mn is non-decreasing in f′c', () => {
    fc.assert(
      fc.property(anyGirder, anyCount, anyStrength, anyStrength, (girder, count, a, b) => {
        const [lower, upper] = a <= b ? [a, b] : [b, a];
        expect(girderStrength(girder, upper, count)).toBeGreaterThanOrEqual(girderStrength(girder, lower, count) * (1 - 1e-12));
      }),
    );
  });

  it('Mn is non-decreasing in Aps', () => {
    fc.assert(
      fc.property(anyGirder, anyStrength, anyCount, anyCount, (girder, fcMpa, a, b) => {
        const [fewer, more] = a <= b ? [a, b] : [b, a];
        expect(girderStrength(girder, fcMpa, more)).toBeGreaterThanOrEqual(girderStrength(girder, fcMpa, fewer) * (1 - 1e-12));
      }),
    );
  });
});
