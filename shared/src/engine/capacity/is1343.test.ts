import c9 from '../fixtures/capacity/c9-is1343-table.json';
import { EngineInputError } from '../materials';
import type { RectangleSection } from '../section';
import { IS1343_CAPACITY_CHECK_NOTE, IS1343_FLANGE_DIVISOR_NOTE, IS1343_TABLE_11, is1343Strength, is1343TableEntry } from './is1343';
import { testConcrete, testSectionModel, type TestModelSpec } from './test-models';

/** Expects `actual` within ± `tolerance` of `expected`. */
function expectWithin(actual: number, expected: number, tolerance: number): void {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(tolerance);
}

/** The C9 section (b = 300 mm, d = 600 mm, fck = 40 MPa cube, engineering.md §8 row C9) with other rows or tensioning. */
function c9Section(strandRows: TestModelSpec['strandRows'], tensioning: 'pre' | 'post' = 'pre'): TestModelSpec {
  return { section: { shape: 'rectangle', widthMm: 300, depthMm: 650 }, concrete: testConcrete(40, 'cube'), strandRows, tensioning };
}

describe(`${c9.id} ${c9.title} (${c9.source})`, () => {
  const { inputs, expected, tolerance } = c9;
  const result = is1343Strength(
    testSectionModel({
      section: inputs.section as RectangleSection,
      concrete: testConcrete(inputs.concrete.strengthMpa, 'cube'),
      strandRows: inputs.strandRows,
      tensioning: 'pre',
    }),
  );

  it('interpolates Table 11 at the fixture’s index to its xu/d', () => {
    expectWithin(is1343TableEntry(expected.reinforcementIndex, 'pre').depthRatio, expected.depthRatio, tolerance.depthRatio);
  });

  it('gives xu/d, fpb and Mu of the fixture', () => {
    expectWithin(result.neutralAxisDepthMm / 600, expected.depthRatio, tolerance.depthRatio);
    expectWithin(result.rows[0]!.stressMpa, expected.fpbMpa, tolerance.fpbMpa);
    expectWithin(result.nominalMomentKnm, expected.ultimateMomentKnm, tolerance.ultimateMomentKnm);
  });

  it('is a capacity check only: φ = 1.0, φMn = Mu, no strain or block, and says so', () => {
    expect(result.method).toBe('is1343');
    expect(result.phi).toBe(1);
    expect(result.factoredMomentKnm).toBe(result.nominalMomentKnm);
    expect(result.extremeTensionStrain).toBeNull();
    expect(result.blockDepthMm).toBeNull();
    expect(result.warnings).toEqual([
      'IS 1343 Mu already includes the material partial factors; phi is 1.0 and this result is not used for LRFR ratings',
    ]);
  });
});

describe('is1343TableEntry (IS 1343:1980 Table 11 p. 59 [S], engineering.md §4.3)', () => {
  it.each(IS1343_TABLE_11.map((row) => [row.reinforcementIndex, row] as const))('returns the table’s own row at %p', (index, row) => {
    for (const tensioning of ['pre', 'post'] as const) {
      const entry = is1343TableEntry(index, tensioning);
      expect(entry.stressRatio).toBeCloseTo(row[tensioning].stressRatio, 12);
      expect(entry.depthRatio).toBeCloseTo(row[tensioning].depthRatio, 12);
    }
  });

  it('continues below the first row towards xu = 0 at zero steel, steel at 0.87 fp (modelling choice, no source)', () => {
    expect(is1343TableEntry(0.0125, 'pre')).toEqual({ stressRatio: 1, depthRatio: expect.closeTo(0.027, 12) });
  });

  it('refuses an index beyond the last row, at options.method', () => {
    expect(() => is1343TableEntry(0.41, 'pre')).toThrow(/^options\.method: Ap fp\/\(b d fck\) = 0\.4100 is beyond IS 1343 Table 11/);
  });
});

describe('is1343Strength, pretensioned and post-tensioned columns', () => {
  // Hand arithmetic from Table 11 [S]: C9 section with 9 strands, index = 9·98.7·1860/(300·600·40) = 0.22948,
  // t = (0.22948 − 0.20)/0.05 = 0.5896 between the 0.20 and 0.25 rows.
  // Pretensioned: fpb/0.87fp = 1.0, xu/d = 0.435 + 0.5896·0.107 = 0.49808 → xu = 298.85 mm,
  //   Mu = 1618.2·888.3·(600 − 0.42·298.85) = 682.0 kN·m.
  // Post-tensioned: fpb/0.87fp = 0.95 − 0.5896·0.05 = 0.92052 → fpb = 1489.6 MPa,
  //   xu/d = 0.414 + 0.5896·0.074 = 0.45763 → xu = 274.58 mm, Mu = 1489.6·888.3·(600 − 0.42·274.58) = 641.3 kN·m.
  it('reads the pretensioned column for a pretensioned girder', () => {
    const result = is1343Strength(testSectionModel(c9Section([{ yMm: 50, count: 9 }], 'pre')));
    expect(result.rows[0]!.stressMpa).toBeCloseTo(1618.2, 1);
    expect(result.neutralAxisDepthMm).toBeCloseTo(298.85, 2);
    expect(result.nominalMomentKnm).toBeCloseTo(682.0, 1);
  });

  it('reads the post-tensioned column for a post-tensioned girder', () => {
    const result = is1343Strength(testSectionModel(c9Section([{ yMm: 50, count: 9 }], 'post')));
    expect(result.rows[0]!.stressMpa).toBeCloseTo(1489.6, 1);
    expect(result.neutralAxisDepthMm).toBeCloseTo(274.58, 2);
    expect(result.nominalMomentKnm).toBeCloseTo(641.3, 1);
  });
});

describe('is1343Strength, flanged section (IS 1343:1980 Appendix B [R: confirm the divisor])', () => {
  // Hand arithmetic from Table 11 [S] and the Appendix B split. Tee: b = 1000, Df = 100, bw = 200, depth 800 mm,
  // fck = 40 MPa cube; 2 rows of 7 strands at y = 60 and 100 → Ap = 1381.8 mm² at d = 720 mm.
  // With b: index = 1381.8·1860/(1000·720·40) = 0.08924 → xu/d = 0.109 + 0.7848·0.108 = 0.19376, xu = 139.5 > Df.
  // Overhang 0.45·40·800·100 = 1 440 000 N → Apf = 1 440 000/(0.87·1860) = 889.88 mm², Apw = 491.92 mm².
  // Web index = 491.92·1860/(200·720·40) = 0.15885 → fpb = 1618.2 MPa, xu/d = 0.326 + 0.1770·0.109 = 0.34529,
  // xu = 248.61 mm; Mu = 1618.2·491.92·(720 − 0.42·248.61) + 1 440 000·(720 − 50) = 490.02 + 964.80 = 1454.8 kN·m.
  const result = is1343Strength(
    testSectionModel({
      section: { shape: 'tee', flangeWidthMm: 1000, flangeThicknessMm: 100, webWidthMm: 200, depthMm: 800 },
      concrete: testConcrete(40, 'cube'),
      strandRows: [
        { yMm: 60, count: 7 },
        { yMm: 100, count: 7 },
      ],
    }),
  );

  it('splits Ap between the overhang and the web and gives Mu of the hand check', () => {
    expect(result.neutralAxisDepthMm).toBeCloseTo(248.61, 2);
    expect(result.nominalMomentKnm).toBeCloseTo(1454.8, 1);
    // Every tendon at 0.87 fp here: Apf by definition, Apw because the web index is below 0.30.
    expect(result.rows.map((row) => row.stressMpa)).toEqual([expect.closeTo(1618.2, 6), expect.closeTo(1618.2, 6)]);
  });

  it('names the uncertain divisor in the warnings', () => {
    expect(result.warnings).toEqual([IS1343_CAPACITY_CHECK_NOTE, IS1343_FLANGE_DIVISOR_NOTE]);
    expect(IS1343_FLANGE_DIVISOR_NOTE).toContain('IS 1343:1980 Appendix B [R: confirm the divisor against the adopted edition]');
  });

  it('keeps the rectangular result while the zone stays within the flange', () => {
    const shallow = is1343Strength(
      testSectionModel({
        section: { shape: 'tee', flangeWidthMm: 1000, flangeThicknessMm: 200, webWidthMm: 200, depthMm: 800 },
        concrete: testConcrete(40, 'cube'),
        strandRows: [{ yMm: 80, count: 14 }],
      }),
    );
    const rectangle = is1343Strength(
      testSectionModel({
        section: { shape: 'rectangle', widthMm: 1000, depthMm: 800 },
        concrete: testConcrete(40, 'cube'),
        strandRows: [{ yMm: 80, count: 14 }],
      }),
    );
    expect(shallow.neutralAxisDepthMm).toBeLessThan(200);
    expect(shallow.nominalMomentKnm).toBe(rectangle.nominalMomentKnm);
    expect(shallow.warnings).toEqual([IS1343_CAPACITY_CHECK_NOTE]);
  });

  it('keeps the rectangular result when the overhang alone would take every tendon', () => {
    // Hand arithmetic: b = 3000, bw = 200, Df = 100, d = 720 mm, fck = 40, 31 strands → Ap = 3059.7 mm²;
    // index 3059.7·1860/(3000·720·40) = 0.0659 → xu/d = 0.1433, xu = 103.2 mm > Df, yet
    // Apf = 0.45·40·2800·100/(0.87·1860) = 3114.6 mm² > Ap: no tendon is left for the web.
    const strandRows = [{ yMm: 80, count: 31 }];
    const wideFlange = is1343Strength(
      testSectionModel({
        section: { shape: 'tee', flangeWidthMm: 3000, flangeThicknessMm: 100, webWidthMm: 200, depthMm: 800 },
        concrete: testConcrete(40, 'cube'),
        strandRows,
      }),
    );
    const rectangle = is1343Strength(
      testSectionModel({ section: { shape: 'rectangle', widthMm: 3000, depthMm: 800 }, concrete: testConcrete(40, 'cube'), strandRows }),
    );
    expect(wideFlange.neutralAxisDepthMm).toBeCloseTo(103.2, 1);
    expect(wideFlange.nominalMomentKnm).toBe(rectangle.nominalMomentKnm);
    expect(wideFlange.warnings).toEqual([IS1343_CAPACITY_CHECK_NOTE]);
  });
});

describe('is1343Strength with a deck', () => {
  it('takes fck, b and Df from the deck and warns when the zone passes below it', () => {
    const result = is1343Strength(
      testSectionModel({
        section: { shape: 'rectangle', widthMm: 400, depthMm: 900 },
        concrete: testConcrete(50, 'cube'),
        deck: { widthMm: 1200, thicknessMm: 150, concrete: testConcrete(30, 'cube') },
        strandRows: [{ yMm: 80, count: 30 }],
      }),
    );
    expect(result.neutralAxisDepthMm).toBeGreaterThan(150);
    expect(result.warnings).toContain(
      'the compression zone reaches below the deck: the girder concrete is treated as deck concrete; use strain compatibility',
    );
  });

  it('refuses a cylinder-strength deck at girder.deck.basis', () => {
    const model = testSectionModel({
      section: { shape: 'rectangle', widthMm: 400, depthMm: 900 },
      concrete: testConcrete(50, 'cube'),
      deck: { widthMm: 1200, thicknessMm: 150, concrete: testConcrete(30, 'cylinder') },
      strandRows: [{ yMm: 80, count: 10 }],
    });
    expect(() => is1343Strength(model)).toThrow(/^girder\.deck\.basis: /);
  });
});

describe('is1343Strength refusals (the conditions of IS 1343 Appendix B, engineering.md §4.3)', () => {
  it('refuses effective prestress below 0.45 fp, at the row’s fpeMpa', () => {
    const model = testSectionModel(c9Section([{ yMm: 50, count: 6, fpeMpa: 800 }]));
    expect(() => is1343Strength(model)).toThrow(EngineInputError);
    expect(() => is1343Strength(model)).toThrow(
      /^girder\.strandRows\[0\]\.fpeMpa: effective prestress 800\.0 MPa is below 0\.45 fp = 837\.0 MPa/,
    );
  });

  it('refuses a cylinder strength, at girder.concrete.basis', () => {
    const model = testSectionModel({ ...c9Section([{ yMm: 50, count: 6 }]), concrete: testConcrete(40, 'cylinder') });
    expect(() => is1343Strength(model)).toThrow(/^girder\.concrete\.basis: this method needs a cube strength/);
  });

  it('refuses a section whose compression zone it cannot recognise, at options.method', () => {
    const triangle = testSectionModel({
      section: { shape: 'polygon', pointsMm: [[-300, 0], [300, 0], [0, 600]] },
      concrete: testConcrete(40, 'cube'),
      strandRows: [{ yMm: 50, count: 4 }],
    });
    expect(() => is1343Strength(triangle)).toThrow(/^options\.method: IS 1343 Appendix B needs a rectangular or flanged compression zone/);
  });

  it('refuses an index beyond the table: 16 strands in the C9 section give 0.408 > 0.40', () => {
    const model = testSectionModel(c9Section([{ yMm: 50, count: 16 }]));
    expect(() => is1343Strength(model)).toThrow(/^options\.method: Ap fp\/\(b d fck\) = 0\.4080/);
  });

  it('refuses an unbonded row, which Table 11 does not cover', () => {
    const model = testSectionModel(c9Section([{ yMm: 50, count: 6, bonded: false, unbondedLengthMm: 20_000 }], 'post'));
    expect(() => is1343Strength(model)).toThrow(/^girder\.strandRows\[0\]\.bonded: /);
  });

  it('refuses rows of different fp, at the second row', () => {
    const model = testSectionModel(c9Section([{ yMm: 50, count: 3 }, { yMm: 100, count: 3, fpuMpa: 1725 }]));
    expect(() => is1343Strength(model)).toThrow(/^girder\.strandRows\[1\]\.fpuMpa: /);
  });
});

describe('is1343Strength, strands and bars it leaves out', () => {
  it('counts exposed strands as nothing, with a warning', () => {
    const fiveBonded = is1343Strength(testSectionModel(c9Section([{ yMm: 50, count: 5 }])));
    const oneOfSixExposed = is1343Strength(testSectionModel(c9Section([{ yMm: 50, count: 6, exposedCount: 1 }])));
    expect(oneOfSixExposed.nominalMomentKnm).toBeCloseTo(fiveBonded.nominalMomentKnm, 9);
    expect(oneOfSixExposed.rows[0]!.stressMpa).toBeCloseTo((fiveBonded.rows[0]!.stressMpa * 5) / 6, 9);
    expect(oneOfSixExposed.warnings).toContain('exposed strands are left out: IS 1343 Table 11 assumes bonded tendons');
  });

  it('gives Mu = 0 when every strand is lost', () => {
    const result = is1343Strength(testSectionModel(c9Section([{ yMm: 50, count: 0 }])));
    expect(result.nominalMomentKnm).toBe(0);
    expect(result.neutralAxisDepthMm).toBe(0);
  });

  it('does not count mild bars, and says so', () => {
    const result = is1343Strength(testSectionModel({ ...c9Section([{ yMm: 50, count: 6 }]), bars: [{ yMm: 40, areaMm2: 600 }] }));
    expect(result.nominalMomentKnm).toBe(is1343Strength(testSectionModel(c9Section([{ yMm: 50, count: 6 }]))).nominalMomentKnm);
    expect(result.warnings).toContain('mild bars are not counted by the IS 1343 Appendix B table method');
  });
});
