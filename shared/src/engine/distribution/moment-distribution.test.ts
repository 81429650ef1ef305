import c10 from './fixtures/c10-type-k.json';
import { EngineInputError } from '../materials';
import type { SectionShape } from '../section';
import { momentDistributionFactor, type MomentDistributionInput } from './moment-distribution';
import { spanDistributionSchema } from './schema';

/** An AASHTO Type IV girder's outline (section fixtures); Kg is given, so only its type matters here. */
const iGirder: SectionShape = {
  shape: 'i-girder',
  topFlangeWidthMm: 508,
  topFlangeThicknessMm: 203.2,
  topTaperHeightMm: 152.4,
  webWidthMm: 203.2,
  bottomTaperHeightMm: 228.6,
  bottomFlangeWidthMm: 660.4,
  bottomFlangeThicknessMm: 203.2,
  depthMm: 1371.6,
};

/** The C10 girder as an interior girder of a three-lane span. */
const c10Span: MomentDistributionInput = {
  section: iGirder,
  position: 'interior',
  distribution: { method: 'formula' },
  spanLengthMm: c10.inputs.spanLengthMm,
  girderSpacingMm: c10.inputs.girderSpacingMm,
  girderCount: c10.inputs.girderCount,
  roadwayWidthMm: 11_000,
  deck: { thicknessMm: c10.inputs.deckThicknessMm, nBeamToDeck: 1 },
  longitudinalStiffnessMm4: c10.inputs.longitudinalStiffnessMm4,
};

function refusalOf(run: () => unknown): EngineInputError {
  try {
    run();
  } catch (error) {
    if (error instanceof EngineInputError) return error;
    throw error;
  }
  throw new Error('expected an EngineInputError');
}

describe('momentDistributionFactor, formula method', () => {
  it(`gives ${c10.id}'s two-lane factor for the interior girder, multiple presence included (${c10.source})`, () => {
    const result = momentDistributionFactor(c10Span);
    expect(result.method).toBe('formula');
    expect(result.governing).toBe('multi-lane');
    expect(result.factor).toBeCloseTo(c10.expected.si.multiLane, c10.tolerance.decimals);
    expect(result.oneLane).toBeCloseTo(c10.expected.si.oneLane, c10.tolerance.decimals);
    expect(result.multiplePresenceIncluded).toBe(true);
    expect(result.skewCorrection).toBe(1);
    expect(result.details).toMatchObject({ designLanes: 3, crossSectionType: 'k', longitudinalStiffnessMm4: 1.231e12 });
    expect(result.warnings).toEqual([]);
  });

  it('reduces both lane cases for skew (hand check: C10 at 45° → 0.887502 × 0.808470 = 0.717519)', () => {
    const result = momentDistributionFactor({ ...c10Span, skewDeg: 45 });
    expect(result.skewCorrection).toBeCloseTo(0.887502, 6);
    expect(result.factor).toBeCloseTo(0.717519, 5);
  });

  it('warns when the skew exceeds 60° and uses 60°', () => {
    const result = momentDistributionFactor({ ...c10Span, skewDeg: 70 });
    expect(result.skewCorrection).toBe(momentDistributionFactor({ ...c10Span, skewDeg: 60 }).skewCorrection);
    expect(result.warnings).toContainEqual(expect.stringContaining('exceeds 60°'));
  });

  it('computes Kg = n (I + A eg²) from the section and deck when not given (hand check from the published formula)', () => {
    // rectangle 400 × 1000: I = 400 × 1000³/12 = 3.33333e10 mm⁴, A = 4e5 mm²; eg = 500 + 25 haunch + 200/2 = 625 mm
    // Kg = 1.2 × (3.33333e10 + 4e5 × 625²) = 1.2 × 1.895833e11 = 2.275e11 mm⁴
    const result = momentDistributionFactor({
      ...c10Span,
      section: { shape: 'rectangle', widthMm: 400, depthMm: 1000 },
      deck: { thicknessMm: 200, haunchMm: 25, nBeamToDeck: 1.2 },
      longitudinalStiffnessMm4: undefined,
    });
    expect(result.details.centroidDistanceMm).toBeCloseTo(625, 6);
    expect(result.details.longitudinalStiffnessMm4! / 2.275e11).toBeCloseTo(1, 9);
    expect(result.warnings).toContainEqual(expect.stringContaining('spread rectangular beam'));
  });

  it('gives the exterior girder the larger of the one-lane lever rule and e × interior (hand checks above)', () => {
    // lever, de = 450: 0.772301 (lever-rule.test.ts); e = 0.930714 × 0.808470 = 0.752455
    const result = momentDistributionFactor({ ...c10Span, position: 'exterior', barrierFaceToGirderMm: 450 });
    expect(result.oneLane).toBeCloseTo(0.772301, 6);
    expect(result.multiLane).toBeCloseTo(0.752455, 6);
    expect(result.governing).toBe('one-lane');
    expect(result.details.exteriorE).toEqual({ oneLane: null, multiLane: expect.closeTo(0.930714, 6) });
    expect(result.details.leverRule).toHaveLength(1);
  });

  it('holds an exterior girder with diaphragms to the rigid-body result (hand checks in lever-rule.test.ts)', () => {
    // S = 2400, Nb = 6, de = 450; one lane: lever ½ (2250 + 450)/2400 × 1.2 = 0.675 vs rigid 0.553571.
    // Two lanes: g = 0.075 + 0.827586^0.6 × 0.071582^0.2 × 5.31087^0.1 = 0.075 + 0.892664 × 0.590148 × 1.181725
    // = 0.697537, e × g = 0.930714 × 0.697537 = 0.649208 vs rigid 0.708333, which governs.
    const span = { ...c10Span, girderSpacingMm: 2400, position: 'exterior' as const, barrierFaceToGirderMm: 450 };
    expect(momentDistributionFactor(span).multiLane).toBeCloseTo(0.649208, 6);
    const result = momentDistributionFactor({ ...span, hasDiaphragms: true });
    expect(result.oneLane).toBeCloseTo(0.675, 12);
    expect(result.multiLane).toBeCloseTo(0.708333, 6);
    expect(result.details.rigidBody).toHaveLength(3);
  });

  it('has no multi-lane case on a one-lane roadway', () => {
    const result = momentDistributionFactor({ ...c10Span, roadwayWidthMm: 5000 });
    expect(result.multiLane).toBeNull();
    expect(result.governing).toBe('one-lane');
    expect(result.factor).toBeCloseTo(c10.expected.si.oneLane, c10.tolerance.decimals);
  });

  it('warns that a 6000–7200 mm roadway may count as two lanes', () => {
    expect(momentDistributionFactor({ ...c10Span, roadwayWidthMm: 6500 }).warnings).toContainEqual(expect.stringContaining('6000–7200 mm'));
  });

  it('uses the spread-box row for a box spaced apart, with its from-memory warning', () => {
    // hand check in formulas.test.ts: S = 2400, L = 24 000, d = 1200 → 0.593261 for two or more lanes
    const result = momentDistributionFactor({
      ...c10Span,
      section: { shape: 'box', widthMm: 1200, depthMm: 1200, voidWidthMm: 900, voidDepthMm: 900, voidBottomMm: 150 },
      spanLengthMm: 24_000,
      girderSpacingMm: 2400,
      girderCount: 5,
    });
    expect(result.details.crossSectionType).toBe('b');
    expect(result.factor).toBeCloseTo(0.593261, 6);
    expect(result.warnings).toContainEqual(expect.stringContaining('from memory — verify'));
  });

  it('uses the adjacent-beam row for voided slabs side by side, and a J given by the caller wins', () => {
    const slabs: MomentDistributionInput = {
      ...c10Span,
      section: { shape: 'voided-slab', widthMm: 1200, depthMm: 600, voidDiameterMm: 300, voidCount: 3, voidCentreYMm: 300 },
      deck: undefined,
      longitudinalStiffnessMm4: undefined,
      spanLengthMm: 15_000,
      girderSpacingMm: 1210,
      girderCount: 9,
    };
    const approximated = momentDistributionFactor(slabs);
    expect(approximated.details.crossSectionType).toBe('g');
    expect(approximated.warnings).toContainEqual(expect.stringContaining('torsion constant J is approximated'));
    const given = momentDistributionFactor({ ...slabs, torsionConstantMm4: 1.5e10 });
    expect(given.details.torsionConstantMm4).toBe(1.5e10);
    expect(given.warnings.some((warning) => warning.includes('approximated'))).toBe(false);
  });

  it('refuses out-of-range values, pointing at span.distribution.method', () => {
    const error = refusalOf(() => momentDistributionFactor({ ...c10Span, girderSpacingMm: 5200 }));
    expect(error.path).toBe('span.distribution.method');
    expect(error.message).toContain('S = 5200 mm is outside 1100 ≤ S ≤ 4900 mm');
    expect(error.message).toContain('choose "lever" or a user value');
  });

  it('refuses an exterior de outside the e factor\'s range', () => {
    const error = refusalOf(() => momentDistributionFactor({ ...c10Span, position: 'exterior', barrierFaceToGirderMm: -400 }));
    expect(error.path).toBe('span.distribution.method');
    expect(error.problem).toContain('de = -400 mm is outside -300 ≤ de ≤ 1700 mm');
  });

  it('refuses shapes without a table row, and I-girders without a deck', () => {
    const polygon: SectionShape = { shape: 'polygon', pointsMm: [[0, 0], [400, 0], [400, 900], [0, 900]] };
    expect(refusalOf(() => momentDistributionFactor({ ...c10Span, section: polygon })).path).toBe('span.distribution.method');
    expect(refusalOf(() => momentDistributionFactor({ ...c10Span, deck: undefined })).problem).toContain('without a cast-in-place deck');
  });

  it('needs the barrier distance for an exterior girder, and a barrier face on the deck', () => {
    expect(refusalOf(() => momentDistributionFactor({ ...c10Span, position: 'exterior' })).path).toBe('span.barrierFaceToGirderMm');
    const error = refusalOf(() => momentDistributionFactor({ ...c10Span, position: 'exterior', barrierFaceToGirderMm: 950, overhangMm: 900 }));
    expect(error.path).toBe('span.barrierFaceToGirderMm');
  });

  it.each([
    ['span.lengthM', { spanLengthMm: 0 }],
    ['span.girderSpacingMm', { girderSpacingMm: -1 }],
    ['span.girderCount', { girderCount: 4.5 }],
    ['span.roadwayWidthMm', { roadwayWidthMm: 0 }],
    ['span.skewDeg', { skewDeg: 90 }],
  ])('refuses a bad %s', (path, change) => {
    expect(refusalOf(() => momentDistributionFactor({ ...c10Span, ...change })).path).toBe(path);
  });
});

describe('momentDistributionFactor, lever method', () => {
  it('applies the lever rule to an interior girder with multiple presence (hand checks in lever-rule.test.ts)', () => {
    // S = 2400: one lane 0.75, two lanes 0.875, three lanes at m = 0.85 less
    const result = momentDistributionFactor({ ...c10Span, distribution: { method: 'lever' }, girderSpacingMm: 2400 });
    expect(result.method).toBe('lever');
    expect(result.oneLane).toBeCloseTo(0.75, 12);
    expect(result.factor).toBeCloseTo(0.875, 12);
    expect(result.governing).toBe('multi-lane');
    expect(result.details.leverRule!.map((leverCase) => leverCase.loadedLanes)).toEqual([1, 2, 3]);
  });

  it('uses the lever rule outside the formula ranges, without a skew reduction', () => {
    const result = momentDistributionFactor({ ...c10Span, distribution: { method: 'lever' }, girderSpacingMm: 5200, skewDeg: 40 });
    expect(result.skewCorrection).toBe(1);
    expect(result.warnings).toContain('skew reduction not applied to the lever rule (conservative)');
  });

  it('lets the rigid-body check govern an exterior girder with diaphragms (hand check: 0.708333 two lanes)', () => {
    // lever: one lane 0.675, two lanes 0.5625 (lever-rule.test.ts); rigid: 0.553571, 0.708333, 0.629911
    const result = momentDistributionFactor({
      ...c10Span,
      distribution: { method: 'lever' },
      girderSpacingMm: 2400,
      position: 'exterior',
      barrierFaceToGirderMm: 450,
      hasDiaphragms: true,
    });
    expect(result.oneLane).toBeCloseTo(0.675, 12);
    expect(result.multiLane).toBeCloseTo(0.708333, 6);
    expect(result.governing).toBe('multi-lane');
  });
});

describe('momentDistributionFactor, user value', () => {
  it('returns the value given and records it', () => {
    const result = momentDistributionFactor({ ...c10Span, distribution: { method: 'user', moment: 0.62 } });
    expect(result).toMatchObject({ factor: 0.62, method: 'user', governing: 'user', oneLane: null, multiLane: null });
    expect(result.warnings).toEqual(['distribution factor given by the user: 0.62']);
  });

  it.each([0, -0.1, 2.01, Number.NaN])('refuses %p', (moment) => {
    const error = refusalOf(() => momentDistributionFactor({ ...c10Span, distribution: { method: 'user', moment } }));
    expect(error.path).toBe('span.distribution.moment');
  });
});

describe('spanDistributionSchema', () => {
  it.each([{ method: 'formula' }, { method: 'lever' }, { method: 'user', moment: 0.62 }])('accepts %j', (value) => {
    expect(spanDistributionSchema.parse(value)).toEqual(value);
  });

  it.each([
    { method: 'formula', moment: 0.6 },
    { method: 'user' },
    { method: 'user', moment: 2.5 },
    { method: 'user', moment: 0 },
    { method: 'tables' },
  ])('rejects %j', (value) => {
    expect(spanDistributionSchema.safeParse(value).success).toBe(false);
  });
});
