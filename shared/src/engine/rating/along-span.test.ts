import fc from 'fast-check';
import r1 from '../fixtures/rating/r1-interior-girder-midspan.json';
import { parseRateFile } from '../calc-file/rate-file';
import { developmentLengthMm, transferLengthMm } from '../capacity/development';
import { POLICY_LIBRARY } from '../policy/rating-policy';
import { rateGirderLine, type RateOutput, type RatingStation } from './rate';

/** The R1 girder (invented test data) with changes; every check below is a hand check from the published formulas of AASHTO LRFD 5.9.4.3 [R]. */
function ratedWith(change: (file: any) => void, options: Parameters<typeof rateGirderLine>[1] = { withoutMargin: true }): RateOutput {
  const file = structuredClone(r1.file) as any;
  change(file);
  const parsed = parseRateFile(file);
  if (!parsed.ok) throw new Error(parsed.issues.map((i) => `${i.path}: ${i.message}`).join('\n'));
  return rateGirderLine(parsed.file, options);
}
const at = (output: RateOutput, xM: number): RatingStation => {
  const station = output.stations.find((candidate) => Math.abs(candidate.xM - xM) < 1e-9);
  if (!station) throw new Error(`no station at ${xM} m: ${output.stations.map((s) => s.xM.toFixed(3)).join(', ')}`);
  return station;
};
const sound = ratedWith(() => undefined);
const lt = transferLengthMm(12.7) / 1000; // 0.762 m
// κ = 1.6 for a member deeper than 610 mm; fps of the fully developed row at midspan.
const fps = at(sound, 15).rows[0]!.stressMpa;
const ld = developmentLengthMm(1.6, fps, 1100, 12.7) / 1000;

describe('a single break at midspan of a straight-strand girder', () => {
  const broken = ratedWith((file) => (file.damage = [{ kind: 'lost-strands', rowId: 'r1', strands: [0], fromM: 15, toM: 15 }]));

  it('takes the broken strand out at the break', () => {
    expect(at(broken, 15).rows[0]!.effectiveStrands).toBe(9);
    expect(at(broken, 15).nominalMomentKnm).toBeLessThan(at(sound, 15).nominalMomentKnm);
  });

  it('puts stations at lt and ld on both sides of the break', () => {
    for (const x of [15 - ld, 15 - lt, 15 + lt, 15 + ld]) expect(() => at(broken, x)).not.toThrow();
  });

  it('has the strand back at fpe one transfer length away, and full capacity from ld on', () => {
    const atTransfer = at(broken, 15 + lt);
    // Ten strands, the re-anchored one at fpe and nine at the row's developed stress f: 10·σ = 9 f + fpe.
    const nineAtF = 10 * atTransfer.rows[0]!.stressMpa - 1100;
    expect(nineAtF / 9).toBeGreaterThan(1100);
    expect(at(broken, 15 + ld).nominalMomentKnm).toBeCloseTo(at(sound, 15).nominalMomentKnm, 6);
    expect(at(broken, 15 - ld).nominalMomentKnm).toBeCloseTo(at(sound, 15).nominalMomentKnm, 6);
    expect(at(broken, 9).nominalMomentKnm).toBeCloseTo(at(sound, 9).nominalMomentKnm, 9);
  });
});

describe('debonded strands', () => {
  const debonded = ratedWith((file) => (file.debonding = [{ rowId: 'r1', strands: [0, 1], lengthM: 3 }]));
  // κ = 2.0 for debonded strands (AASHTO LRFD 5.9.4.3.3).
  const ldDebonded = developmentLengthMm(2.0, fps, 1100, 12.7) / 1000;

  it('contribute nothing inside the debonded length', () => {
    expect(at(debonded, 1.5).rows[0]!.effectiveStrands).toBe(8);
  });

  it('ramp up beyond it and are fully developed ld (κ = 2.0) past its end', () => {
    const ramping = at(debonded, 3 + lt);
    expect(ramping.rows[0]!.effectiveStrands).toBe(10);
    // Straight strands beyond ld from the ends develop the same Mn everywhere: the sound girder's midspan value.
    const fullMn = at(sound, 15).nominalMomentKnm;
    expect(ramping.nominalMomentKnm).toBeLessThan(fullMn);
    expect(at(debonded, 3 + ldDebonded).nominalMomentKnm).toBeCloseTo(fullMn, 6);
  });
});

describe('a harped row', () => {
  const harped = ratedWith((file) => {
    file.girder.strandRows.push({ id: 'h1', yMm: 120, count: 4, strandAreaMm2: 98.7, strandDiameterMm: 12.7, fpuMpa: 1860, fpyMpa: 1674, epsMpa: 196500, fpeMpa: 1100 });
    file.profiles = [{ rowId: 'h1', shape: 'harped', endYMm: 800, holdDownM: [12, 18] }];
  });

  it('lies at its height between the hold-down points and rises linearly to its end height', () => {
    expect(at(harped, 15).rows[1]!.yMm).toBe(120);
    expect(at(harped, 12).rows[1]!.yMm).toBe(120);
    expect(at(harped, lt).rows[1]!.yMm).toBeCloseTo(800 + ((120 - 800) * lt) / 12, 9);
    expect(at(harped, 30 - lt).rows[1]!.yMm).toBeCloseTo(800 + ((120 - 800) * lt) / 12, 9);
  });
});

describe('properties along the span', () => {
  it('a break never raises the nominal capacity anywhere', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 28 }), fc.integer({ min: 1, max: 5 }), (xM, count) => {
        const broken = ratedWith((file) => (file.damage = [{ kind: 'lost-strands', rowId: 'r1', count, fromM: xM, toM: xM + 0.5 }]));
        for (const station of broken.stations) {
          const same = sound.stations.find((s) => Math.abs(s.xM - station.xM) < 1e-9);
          if (same) expect(station.nominalMomentKnm).toBeLessThanOrEqual(same.nominalMomentKnm * (1 + 1e-9));
        }
      }),
      { numRuns: 12 },
    );
  });

  it('moving a break along the span moves the dip with it', () => {
    for (const xM of [8, 15, 21]) {
      const broken = ratedWith((file) => (file.damage = [{ kind: 'lost-strands', rowId: 'r1', count: 3, fromM: xM, toM: xM }]));
      const dip = broken.stations.reduce((low, station) => (station.nominalMomentKnm / at(sound, 15).nominalMomentKnm < low.nominalMomentKnm / at(sound, 15).nominalMomentKnm ? station : low));
      // Away from the ends (where transfer lowers every strand), the weakest station is the break.
      const interior = broken.stations.filter((s) => s.xM > ld && s.xM < 30 - ld);
      const weakest = interior.reduce((low, station) => (station.nominalMomentKnm < low.nominalMomentKnm ? station : low));
      expect(weakest.xM).toBeCloseTo(xM, 9);
      expect(dip.nominalMomentKnm).toBeLessThanOrEqual(weakest.nominalMomentKnm);
    }
  });
});

describe('the strand-loss margin', () => {
  const strand = { strandAreaMm2: 98.7, strandDiameterMm: 12.7, fpuMpa: 1860, fpyMpa: 1674, epsMpa: 196500, fpeMpa: 1100 };
  const smallCase = (file: any) => {
    file.span.lengthM = 16;
    file.girder.strandRows = [{ id: 'r1', yMm: 60, count: 8, ...strand }, { id: 'r2', yMm: 160, count: 4, ...strand }];
    file.vehicles = ['type-3-3'];
  };
  const lowestLegal = (output: RateOutput) => Math.min(...output.summary.controlling.filter((c) => c.level === 'legal').map((c) => c.ratingFactor));

  it('equals an exhaustive search over which strands break at the station with the least reserve', () => {
    const rated = ratedWith(smallCase, {});
    const margin = rated.summary.strandLossMargin!;
    expect(margin.count).toBeGreaterThan(1);
    const strands = [...Array.from({ length: 8 }, (_, index) => ({ rowId: 'r1', index })), ...Array.from({ length: 4 }, (_, index) => ({ rowId: 'r2', index }))];
    const breaking = (subset: typeof strands) =>
      lowestLegal(
        ratedWith((file) => {
          smallCase(file);
          file.damage = subset.map((s) => ({ kind: 'lost-strands', rowId: s.rowId, strands: [s.index], fromM: margin.atXM, toM: margin.atXM }));
        }),
      );
    const subsetsOf = (size: number, from = 0): (typeof strands)[] =>
      size === 0 ? [[]] : strands.slice(from).flatMap((s, i) => subsetsOf(size - 1, from + i + 1).map((rest) => [s, ...rest]));
    let fewest = 0;
    for (let size = 1; size <= strands.length && fewest === 0; size++) {
      if (subsetsOf(size).some((subset) => breaking(subset) < 1)) fewest = size;
    }
    expect(margin.count).toBe(fewest);
    expect(breaking(margin.strands.map((s) => ({ ...s })))).toBeLessThan(1);
  });

  it('is not changed by damage far from the station, nor by its own trial breaks switching φc', () => {
    const base = ratedWith(smallCase, {}).summary.strandLossMargin!;
    const farBreak = ratedWith((file) => {
      smallCase(file);
      file.damage = [{ kind: 'lost-strands', rowId: 'r1', strands: [0], fromM: 1.0, toM: 1.2 }];
    }, {}).summary.strandLossMargin!;
    // The far break changes nothing at the station with the least reserve, so the margin counts the strands actually broken there.
    expect(farBreak.strands.some((s) => s.rowId === 'r1' && s.index === 0)).toBe(false);
    const policy = structuredClone(POLICY_LIBRARY['lrfr-default']!);
    policy.resistance.conditionFactorWhenDamageModelled = 1.0;
    const withSwitch = ratedWith((file) => {
      smallCase(file);
      file.condition.superstructure = 4;
      file.policy = policy;
    }, {}).summary.strandLossMargin!;
    const withoutSwitch = ratedWith((file) => {
      smallCase(file);
      file.condition.superstructure = 4;
    }, {}).summary.strandLossMargin!;
    expect(withSwitch.count).toBe(withoutSwitch.count);
    expect(base.count).toBeGreaterThan(0);
  });

  it('says "already below 1.0" with a count of 0 when it is', () => {
    const weak = ratedWith((file) => {
      smallCase(file);
      file.girder.strandRows[0].count = 4;
    }, {});
    expect(weak.summary.strandLossMargin).toMatchObject({ count: 0, note: 'already below 1.0' });
  });
});

describe('computed effective prestress', () => {
  it('rates with the losses of the AASHTO approximate method, reported per row', () => {
    const rated = ratedWith((file) => {
      // A shorter span, so that the girder's weight does not crack the concrete at transfer.
      file.span.lengthM = 16;
      delete file.girder.strandRows[0].fpeMpa;
      file.losses = { method: 'aashto-approximate', jackingStressMpa: 1395, fciMpa: 35, relativeHumidityPct: 70 };
    });
    const [row] = rated.summary.effectivePrestress!.rows;
    expect(row!.fpeMpa).toBeLessThan(1395);
    expect(row!.fpeMpa).toBeCloseTo(1395 - row!.elasticShorteningMpa - row!.longTermMpa, 9);
    expect(rated.inputs.girder.strandRows[0]!.fpeMpa).toBe(row!.fpeMpa);
  });

  it('refuses a given fpe alongside computed losses', () => {
    const file = structuredClone(r1.file) as any;
    file.losses = { method: 'aashto-approximate', jackingStressMpa: 1395, fciMpa: 35, relativeHumidityPct: 70 };
    const parsed = parseRateFile(file);
    expect(parsed.ok ? [] : parsed.issues.map((i) => i.path)).toContain('girder.strandRows[0].fpeMpa');
  });
});
