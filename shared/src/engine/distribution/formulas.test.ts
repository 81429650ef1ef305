import c10 from './fixtures/c10-type-k.json';
import { EngineInputError } from '../materials';
import {
  DISTRIBUTION_METHOD_PATH,
  adjacentBeamExteriorFactors,
  adjacentBeamMomentFactors,
  beamSlabExteriorFactor,
  beamSlabMomentFactors,
  beamSlabSkewCorrection,
  boxSkewCorrection,
  spreadBoxExteriorFactor,
  spreadBoxMomentFactors,
} from './formulas';

const MM_PER_FT = 304.8;
const MM_PER_IN = 25.4;

/** The US-customary form of the type k row (S, L in ft, ts in in, Kg in in⁴): a cross-check of the fixture's arithmetic. */
function usCustomaryTypeK({ girderSpacingMm, spanLengthMm, deckThicknessMm, longitudinalStiffnessMm4 }: typeof c10.inputs) {
  const sFt = girderSpacingMm / MM_PER_FT;
  const lFt = spanLengthMm / MM_PER_FT;
  const tsIn = deckThicknessMm / MM_PER_IN;
  const kgIn4 = longitudinalStiffnessMm4 / MM_PER_IN ** 4;
  const stiffnessTerm = (kgIn4 / (12 * lFt * tsIn ** 3)) ** 0.1;
  return {
    oneLane: 0.06 + (sFt / 14) ** 0.4 * (sFt / lFt) ** 0.3 * stiffnessTerm,
    multiLane: 0.075 + (sFt / 9.5) ** 0.6 * (sFt / lFt) ** 0.2 * stiffnessTerm,
  };
}

/** Runs a refusal and returns its error, so the path and message can both be checked. */
function refusalOf(run: () => unknown): EngineInputError {
  try {
    run();
  } catch (error) {
    if (error instanceof EngineInputError) return error;
    throw error;
  }
  throw new Error('expected an EngineInputError');
}

describe(`${c10.id} ${c10.title} (${c10.source})`, () => {
  it('gives the SI-form factors for one lane and for two or more', () => {
    const factors = beamSlabMomentFactors(c10.inputs);
    expect(factors.oneLane).toBeCloseTo(c10.expected.si.oneLane, c10.tolerance.decimals);
    expect(factors.multiLane).toBeCloseTo(c10.expected.si.multiLane, c10.tolerance.decimals);
  });

  it('agrees with the US-customary form to within its printed difference', () => {
    const us = usCustomaryTypeK(c10.inputs);
    expect(us.oneLane).toBeCloseTo(c10.expected.usCustomary.oneLane, c10.tolerance.decimals);
    expect(us.multiLane).toBeCloseTo(c10.expected.usCustomary.multiLane, c10.tolerance.decimals);
  });
});

describe('beamSlabMomentFactors range of applicability (Table 4.6.2.2.2b-1 [R])', () => {
  it.each([
    ['S', { girderSpacingMm: 5000 }, 'S = 5000 mm is outside 1100 ≤ S ≤ 4900 mm'],
    ['ts', { deckThicknessMm: 100 }, 'ts = 100 mm is outside 110 ≤ ts ≤ 300 mm'],
    ['L', { spanLengthMm: 75_000 }, 'L = 75000 mm is outside 6000 ≤ L ≤ 73000 mm'],
    ['Nb', { girderCount: 3 }, 'Nb = 3 is outside Nb ≥ 4'],
    ['Kg', { longitudinalStiffnessMm4: 3.5e12 }, 'Kg = 3.5e+12 mm⁴ is outside 4e+9 ≤ Kg ≤ 3e+12 mm⁴'],
  ])('refuses %s outside its range, naming it and the way forward', (_name, change, text) => {
    const error = refusalOf(() => beamSlabMomentFactors({ ...c10.inputs, ...change }));
    expect(error.path).toBe(DISTRIBUTION_METHOD_PATH);
    expect(error.problem).toContain(text);
    expect(error.problem).toContain('choose "lever" or a user value');
  });

  it('names every parameter that is out of range in one message', () => {
    const error = refusalOf(() => beamSlabMomentFactors({ ...c10.inputs, girderSpacingMm: 1000, girderCount: 3 }));
    expect(error.problem).toContain('S = 1000 mm');
    expect(error.problem).toContain('Nb = 3');
  });

  it('accepts the limits themselves', () => {
    expect(() => beamSlabMomentFactors({ ...c10.inputs, girderSpacingMm: 4900, deckThicknessMm: 110, girderCount: 4 })).not.toThrow();
  });
});

describe('beamSlabSkewCorrection (Table 4.6.2.2.2e-1 [R])', () => {
  it('gives 1 − c1 at 45° on the C10 girder (hand check from the published formula)', () => {
    // Kg/(L ts³) = 1.231e12 / (33 528 × 190.5³) = 5.3109; S/L = 2946/33 528 = 0.087867
    // c1 = 0.25 × 5.3109^0.25 × 0.087867^0.5 = 0.25 × 1.51807 × 0.29642 = 0.112498; tan 45° = 1
    const skew = beamSlabSkewCorrection(c10.inputs, 45);
    expect(skew.c1).toBeCloseTo(0.112498, 6);
    expect(skew.correction).toBeCloseTo(0.887502, 6);
  });

  it('does not reduce below 30° and uses 60° for larger skews (hand check: 1 − 0.112498 × tan 60°^1.5 = 0.743561)', () => {
    expect(beamSlabSkewCorrection(c10.inputs, 29.9).correction).toBe(1);
    expect(beamSlabSkewCorrection(c10.inputs, 60).correction).toBeCloseTo(0.743561, 6);
    expect(beamSlabSkewCorrection(c10.inputs, 75).correction).toBe(beamSlabSkewCorrection(c10.inputs, 60).correction);
  });
});

describe('boxSkewCorrection (Table 4.6.2.2.2e-1, from memory — verify)', () => {
  it('gives 1.05 − 0.25 tan θ, at most 1 (hand check: 45° → 0.80; 10° → 1.0059 capped to 1)', () => {
    expect(boxSkewCorrection(45).correction).toBeCloseTo(0.8, 12);
    expect(boxSkewCorrection(10).correction).toBe(1);
    expect(boxSkewCorrection(80).correction).toBeCloseTo(1.05 - 0.25 * Math.sqrt(3), 12);
  });
});

describe('exterior e factors (Table 4.6.2.2.2d-1 [R])', () => {
  it('gives e = 0.77 + de/2800 for the beam-slab row (hand check: de = 450 mm → 0.930714)', () => {
    expect(beamSlabExteriorFactor(450)).toBeCloseTo(0.930714, 6);
    expect(beamSlabExteriorFactor(-300)).toBeCloseTo(0.662857, 6);
  });

  it('refuses de outside −300 … 1700 mm', () => {
    const error = refusalOf(() => beamSlabExteriorFactor(1800));
    expect(error.path).toBe(DISTRIBUTION_METHOD_PATH);
    expect(error.problem).toContain('de = 1800 mm is outside -300 ≤ de ≤ 1700 mm');
  });

  it('gives e = 0.97 + de/8700 for spread boxes, 0 ≤ de ≤ 1400 (from memory — verify; hand check: de = 870 → 1.07)', () => {
    expect(spreadBoxExteriorFactor(870)).toBeCloseTo(1.07, 12);
    expect(() => spreadBoxExteriorFactor(-10)).toThrow(EngineInputError);
  });

  it('gives e ≥ 1.0 for adjacent beams, de ≤ 600 (from memory — verify; hand check: de = 455 → 1.175, 1.099868)', () => {
    const e = adjacentBeamExteriorFactors(455);
    expect(e.oneLane).toBeCloseTo(1.175, 12);
    expect(e.multiLane).toBeCloseTo(1.099868, 6);
    expect(adjacentBeamExteriorFactors(-2000)).toEqual({ oneLane: 1, multiLane: 1 });
    expect(() => adjacentBeamExteriorFactors(650)).toThrow(EngineInputError);
  });
});

describe('spreadBoxMomentFactors (types b, c; from memory — verify)', () => {
  it('gives (S/910)^0.35 (Sd/L²)^0.25 and (S/1900)^0.6 (Sd/L²)^0.125 (hand check from the recalled formula)', () => {
    // S = 2400, d = 1200, L = 24 000: Sd/L² = 0.005; (2400/910)^0.35 = 1.404137; 0.005^0.25 = 0.265915 → 0.373381
    // (2400/1900)^0.6 = 1.150468; 0.005^0.125 = 0.515669 → 0.593261
    const factors = spreadBoxMomentFactors({ girderSpacingMm: 2400, spanLengthMm: 24_000, beamDepthMm: 1200, girderCount: 5 });
    expect(factors.oneLane).toBeCloseTo(0.373381, 6);
    expect(factors.multiLane).toBeCloseTo(0.593261, 6);
  });

  it('refuses a box deeper than 1700 mm', () => {
    const error = refusalOf(() => spreadBoxMomentFactors({ girderSpacingMm: 2400, spanLengthMm: 24_000, beamDepthMm: 1800, girderCount: 5 }));
    expect(error.problem).toContain('d = 1800 mm is outside 450 ≤ d ≤ 1700 mm');
  });
});

describe('adjacentBeamMomentFactors (types f, g; from memory — verify)', () => {
  const beams = { beamWidthMm: 1200, spanLengthMm: 18_000, inertiaMm4: 5e10, torsionConstantMm4: 8e10, girderCount: 8 };

  it('gives k (b/2.8L)^0.5 (I/J)^0.25 and k (b/7600)^0.6 (b/L)^0.2 (I/J)^0.06 (hand check from the recalled formula)', () => {
    // k = 2.5 × 8^−0.2 = 1.649385; one lane 1.649385 × (1200/50 400)^0.5 × 0.625^0.25 = 0.226291
    // two or more 1.649385 × (1200/7600)^0.6 × (1200/18 000)^0.2 × 0.625^0.06 = 0.308232
    const factors = adjacentBeamMomentFactors(beams);
    expect(factors.k).toBeCloseTo(1.649385, 6);
    expect(factors.oneLane).toBeCloseTo(0.226291, 6);
    expect(factors.multiLane).toBeCloseTo(0.308232, 6);
  });

  it('keeps k at 1.5 or more (hand check: 2.5 × 20^−0.2 = 1.3732 → 1.5)', () => {
    expect(adjacentBeamMomentFactors({ ...beams, girderCount: 20 }).k).toBe(1.5);
  });

  it('refuses fewer than 5 beams', () => {
    expect(refusalOf(() => adjacentBeamMomentFactors({ ...beams, girderCount: 4 })).problem).toContain('Nb = 4 is outside 5 ≤ Nb ≤ 20');
  });
});
