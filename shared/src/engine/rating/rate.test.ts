import fc from 'fast-check';
import r1 from '../fixtures/rating/r1-interior-girder-midspan.json';
import { parseRateFile, type RateFile } from '../calc-file/rate-file';
import { rateGirderLine, type RateOutput } from './rate';
import { postingLoad } from './lrfr';
import { POLICY_LIBRARY } from '../policy/rating-policy';

function parsed(input: unknown): RateFile {
  const result = parseRateFile(input);
  if (!result.ok) throw new Error(result.issues.map((i) => `${i.path}: ${i.message}`).join('\n'));
  return result.file;
}
const rate = (input: unknown): RateOutput => rateGirderLine(parsed(input));
const closeTo = (actual: number, expected: number, relative: number) => expect(Math.abs(actual - expected)).toBeLessThanOrEqual(relative * Math.abs(expected));
const midspanOf = (output: RateOutput) => output.stations.find((station) => Math.abs(station.xM - 15) < 1e-9)!;

describe(`${r1.id}: ${r1.title}`, () => {
  const output = rate(r1.file);
  const midspan = midspanOf(output);
  const tol = r1.tolerance.relative;

  it(`${r1.tag}: dead-load moments per girder`, () => {
    closeTo(midspan.momentsKnm.dc1, r1.expected.dc1MidspanKnm, tol);
    closeTo(midspan.momentsKnm.dc2, r1.expected.dc2MidspanKnm, tol);
    closeTo(midspan.momentsKnm.dw, r1.expected.dwMidspanKnm, tol);
  });

  it(`${r1.tag}: HL-93 with IM and the user distribution factor`, () => {
    closeTo(midspan.momentsKnm.live['hl93']!, r1.expected.liveWithImpactPerGirderKnm, tol);
    expect(output.summary.distribution.method).toBe('user');
    expect(output.summary.warnings).toContain('distribution factor given by the user: 0.6');
  });

  it(`${r1.tag}: strength I inventory and operating from the formula`, () => {
    const demand = 1.25 * (2160 + 337.5) + 1.5 * 388.125;
    const capacity = 1.0 * 1.0 * midspan.phi * midspan.nominalMomentKnm;
    closeTo(midspan.ratingFactors['hl93']!['strength-inventory']!, (capacity - demand) / (1.75 * 2264.049), tol);
    closeTo(midspan.ratingFactors['hl93']!['strength-operating']!, (capacity - demand) / (1.35 * 2264.049), tol);
  });

  it(`${r1.tag}: Service III at the bottom fibre, stage by stage`, () => {
    closeTo(midspan.bottomStressMpa.prestress, r1.expected.prestressBottomStressMpa, tol);
    const girderZb = (400 * 1000 ** 2) / 6;
    // Composite: deck transformed by n = 24 000 / 30 000 = 0.8 (parallel-axis theorem).
    const deckArea = 0.8 * 2000 * 200;
    const centroid = (400_000 * 500 + deckArea * 1100) / (400_000 + deckArea);
    const inertia = (400 * 1000 ** 3) / 12 + 400_000 * (centroid - 500) ** 2 + (0.8 * 2000 * 200 ** 3) / 12 + deckArea * (1100 - centroid) ** 2;
    const compositeZb = inertia / centroid;
    closeTo(midspan.bottomStressMpa.dc1, (2160e6) / girderZb, tol);
    closeTo(midspan.bottomStressMpa.dc2 + midspan.bottomStressMpa.dw, ((337.5 + 388.125) * 1e6) / compositeZb, tol);
    closeTo(midspan.bottomStressMpa.live['hl93']!, (2264.049e6) / compositeZb, tol);
    const fR = 0.4989 * Math.sqrt(40);
    const fD = midspan.bottomStressMpa.prestress + midspan.bottomStressMpa.dc1 + midspan.bottomStressMpa.dc2 + midspan.bottomStressMpa.dw;
    closeTo(midspan.ratingFactors['hl93']!['service-iii-inventory']!, (fR - fD) / (0.8 * midspan.bottomStressMpa.live['hl93']!), tol);
  });

  it('carries the caution, the versions, the inputs and the shear warning', () => {
    expect(output.caution).toMatch(/licensed engineer/);
    expect(output.engineVersion).toMatch(/^\d+\.\d+\.\d+$/);
    expect(output.policyVersion).toBe('lrfr-default@1');
    expect(output.summary.warnings[0]).toMatch(/^shear not rated/);
    expect(output.inputs.span.lengthM).toBe(30);
  });

  it('rates at the twentieth points and where the strands finish transfer and development at the ends', () => {
    const xs = output.stations.map((station) => station.xM);
    expect(xs).toEqual(expect.arrayContaining(Array.from({ length: 19 }, (_, i) => expect.closeTo(1.5 * (i + 1), 9))));
    // lt = 60 db = 762 mm from each end (AASHTO LRFD 5.9.4.3.1, hand check).
    expect(xs).toEqual(expect.arrayContaining([expect.closeTo(0.762, 9), expect.closeTo(30 - 0.762, 9)]));
    expect([...xs].sort((a, b) => a - b)).toEqual(xs);
  });

  it('adds a station at each edge of a damage entry', () => {
    const damaged = rate({ ...r1.file, damage: [{ kind: 'lost-strands', rowId: 'r1', count: 2, fromM: 13.2, toM: 16.4 }] });
    const xs = damaged.stations.map((station) => station.xM);
    expect(xs).toEqual(expect.arrayContaining([expect.closeTo(13.2, 9), expect.closeTo(16.4, 9)]));
    expect(damaged.stations.find((station) => Math.abs(station.xM - 15) < 1e-9)?.damageApplied).toEqual([0]);
    expect(damaged.stations.find((station) => Math.abs(station.xM - 12) < 1e-9)?.damageApplied).toEqual([]);
  });
});

describe('C11: posting load (AASHTO MBE 6A.8.3 [R])', () => {
  it('[H] RF = 0.60, W = 25 t gives 10.71 t', () => {
    const policy = POLICY_LIBRARY['lrfr-default']!;
    const result = postingLoad(0.6, 25 * 9.80665, policy);
    expect(result.postingLoad).toBeCloseTo(10.71, 2);
    expect(result.unit).toBe('t');
  });

  it('[H] below RF 0.3 the vehicle is not allowed', () => {
    expect(postingLoad(0.2, 200, POLICY_LIBRARY['lrfr-default']!)).toMatchObject({ postingLoad: 0, note: expect.stringMatching(/not be allowed/) });
  });
});

describe('properties of the rating', () => {
  const withGammaLL = (gammaLLInventory: number) => {
    const policy = structuredClone(POLICY_LIBRARY['lrfr-default']!);
    policy.liveLoad.gammaLLInventory = gammaLLInventory;
    return { ...r1.file, policy };
  };

  it('scales the strength rating factor as 1/γLL', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.5, max: 3, noNaN: true }), (gammaLL) => {
        const base = midspanOf(rate(withGammaLL(1.75))).ratingFactors['hl93']!['strength-inventory']!;
        const scaled = midspanOf(rate(withGammaLL(gammaLL))).ratingFactors['hl93']!['strength-inventory']!;
        closeTo(scaled, (base * 1.75) / gammaLL, 1e-12);
      }),
      { numRuns: 10 },
    );
  });

  it('never raises a rating factor, with φ held fixed, when strands are lost', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 9 }), fc.integer({ min: 0, max: 20 }), (lost, fromM) => {
        const sound = rate(r1.file);
        const damaged = rate({ ...r1.file, damage: [{ kind: 'lost-strands', rowId: 'r1', count: lost, fromM, toM: fromM + 9 }] });
        for (const station of damaged.stations) {
          const same = sound.stations.find((candidate) => Math.abs(candidate.xM - station.xM) < 1e-9);
          if (!same) continue;
          // RF with φ = 1 at both: (Mn − DL)/LL only falls with Mn.
          expect(station.nominalMomentKnm).toBeLessThanOrEqual(same.nominalMomentKnm * (1 + 1e-9));
        }
      }),
      { numRuns: 8 },
    );
  });
});

describe('bad rate files', () => {
  const edited = (edit: (file: any) => void) => {
    const file = structuredClone(r1.file) as any;
    edit(file);
    const result = parseRateFile(file);
    return result.ok ? [] : result.issues.map((issue) => `${issue.path}: ${issue.message}`);
  };

  it.each([
    ['a negative span length', (f: any) => (f.span.lengthM = -30), 'span.lengthM: must be > 0'],
    ['damage beyond the span', (f: any) => (f.damage = [{ kind: 'lost-strands', rowId: 'r1', count: 1, fromM: 28, toM: 31 }]), 'damage[0].toM: lies beyond the span (30 m)'],
    ['damage with no location', (f: any) => (f.damage = [{ kind: 'lost-strands', rowId: 'r1', count: 1 }]), 'damage[0].fromM: required in a rating'],
    ['an unknown vehicle', (f: any) => (f.vehicles = ['hl93', 'hs99']), 'vehicles[1]:'],
    ['an unknown policy', (f: any) => (f.policy = 'strictest'), 'policy: no rating policy has id "strictest"'],
    ['an edge girder rated as interior', (f: any) => (f.span.girder = 1), 'span.position: girder 1 is an edge girder'],
    ['an exterior girder without its barrier distance', (f: any) => { f.span.girder = 5; f.span.position = 'exterior'; }, 'span.barrierFaceToGirderMm: required for an exterior girder'],
    ['a condition rating out of range', (f: any) => (f.condition.superstructure = 12), 'condition.superstructure: must be 0–9'],
  ])('refuses %s, naming its path', (_what, edit, expected) => {
    expect(edited(edit).some((issue) => issue.startsWith(expected))).toBe(true);
  });
});
