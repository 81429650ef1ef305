import fc from 'fast-check';
import { areaIntegrals, clipPolygonToBand, polygonProperties, polygonYRangeMm, type PolygonMm } from '../geometry';
import standardGirders from './fixtures/aashto-standard-girders.json';
import { flatTopWidthMm, sectionDepthMm, shapeToPolygons } from './polygons';
import { sectionProperties } from './properties';
import { sectionShapeSchema, type ProfileSection, type SectionShape } from './shapes';

/** Parallel-axis sum over parts given by area, centroid height and own second moment. */
function compositeOfParts(parts: readonly { area: number; y: number; ownI: number; sign?: number }[]) {
  const area = parts.reduce((sum, p) => sum + (p.sign ?? 1) * p.area, 0);
  const centroid = parts.reduce((sum, p) => sum + (p.sign ?? 1) * p.area * p.y, 0) / area;
  const inertia = parts.reduce((sum, p) => sum + (p.sign ?? 1) * (p.ownI + p.area * (p.y - centroid) ** 2), 0);
  return { area, centroid, inertia };
}

/** Trapezoid of height h, width a at its foot and b at its head: area, centroid above the foot, own I. */
function trapezoid(a: number, b: number, h: number, footY: number) {
  return { area: ((a + b) * h) / 2, y: footY + (h * (a + 2 * b)) / (3 * (a + b)), ownI: (h ** 3 * (a * a + 4 * a * b + b * b)) / (36 * (a + b)) };
}

const rectangle = (b: number, h: number, bottomY: number) => ({ area: b * h, y: bottomY + h / 2, ownI: (b * h ** 3) / 12 });

function expectProperties(shape: SectionShape, expected: { area: number; centroid: number; inertia: number }, digits = 10) {
  const properties = sectionProperties(shapeToPolygons(shape));
  const depth = sectionDepthMm(shape);
  expect(properties.areaMm2 / expected.area).toBeCloseTo(1, digits);
  expect(properties.centroidFromSoffitMm / expected.centroid).toBeCloseTo(1, digits);
  expect(properties.inertiaMm4 / expected.inertia).toBeCloseTo(1, digits);
  expect(properties.topModulusMm3 / (expected.inertia / (depth - expected.centroid))).toBeCloseTo(1, digits);
  expect(properties.bottomModulusMm3 / (expected.inertia / expected.centroid)).toBeCloseTo(1, digits);
}

describe('shapeToPolygons and sectionProperties', () => {
  it('rectangle: A = bh, ȳ = h/2, I = bh³/12', () => {
    // hand check from the published formula (rectangle)
    expectProperties({ shape: 'rectangle', widthMm: 400, depthMm: 900 }, { area: 400 * 900, centroid: 450, inertia: (400 * 900 ** 3) / 12 });
  });

  it('tee: flange and web by the parallel-axis theorem', () => {
    // hand check from the published formula (composite areas, parallel-axis theorem)
    const expected = compositeOfParts([rectangle(250, 700, 0), rectangle(1200, 200, 700)]);
    expectProperties({ shape: 'tee', flangeWidthMm: 1200, flangeThicknessMm: 200, webWidthMm: 250, depthMm: 900 }, expected);
  });

  it('i-girder: flanges, tapers and web by the parallel-axis theorem', () => {
    // hand check from the published formula (composite areas, parallel-axis theorem; trapezoid tapers)
    const expected = compositeOfParts([
      rectangle(600, 150, 0),
      trapezoid(600, 180, 100, 150),
      rectangle(180, 1000, 250),
      trapezoid(180, 900, 75, 1250),
      rectangle(900, 125, 1325),
    ]);
    const shape: SectionShape = {
      shape: 'i-girder',
      topFlangeWidthMm: 900,
      topFlangeThicknessMm: 125,
      topTaperHeightMm: 75,
      webWidthMm: 180,
      bottomTaperHeightMm: 100,
      bottomFlangeWidthMm: 600,
      bottomFlangeThicknessMm: 150,
      depthMm: 1450,
    };
    expectProperties(shape, expected);
  });

  it.each(standardGirders.cases)('$id matches the published table (PCI Journal 2021, Table A.1)', ({ section, expected }) => {
    const mmPerInch = 25.4; // exact by definition of the international inch
    const polygons = shapeToPolygons(sectionShapeSchema.parse(section));
    const properties = sectionProperties(polygons);
    const halfDigit = (value: number, digitMm: number) => Math.abs(value) <= digitMm / 2;
    expect(halfDigit(properties.areaMm2 / mmPerInch ** 2 - expected.areaIn2, 0.1)).toBe(true);
    expect(halfDigit(properties.centroidFromSoffitMm / mmPerInch - expected.ybIn, 0.01)).toBe(true);
    expect(halfDigit((properties.topYMm - properties.centroidFromSoffitMm) / mmPerInch - expected.ytIn, 0.01)).toBe(true);
    expect(halfDigit(properties.inertiaMm4 / mmPerInch ** 4 - expected.ixIn4, 1)).toBe(true);
    expect(halfDigit(polygonProperties(polygons[0]!).inertiaYMm4 / mmPerInch ** 4 - expected.iyIn4, 1)).toBe(true);
  });

  it('box: the void less its four 45° fillets, by hand sums', () => {
    const f = 75;
    const [vw, vd, vb] = [700, 600, 125];
    const fillet = (y: number) => ({ area: (f * f) / 2, y, ownI: (f * f ** 3) / 36, sign: 1 });
    // hand check from the published formula (composite areas, parallel-axis theorem; right triangles bh³/36)
    const expected = compositeOfParts([
      rectangle(1000, 850, 0),
      { ...rectangle(vw, vd, vb), sign: -1 },
      fillet(vb + f / 3),
      fillet(vb + f / 3),
      fillet(vb + vd - f / 3),
      fillet(vb + vd - f / 3),
    ]);
    const shape: SectionShape = {
      shape: 'box',
      widthMm: 1000,
      depthMm: 850,
      voidWidthMm: vw,
      voidDepthMm: vd,
      voidBottomMm: vb,
      voidFilletMm: f,
    };
    expectProperties(shape, expected);
  });

  it('voided slab: the slab less voids of the circles’ area; I within the 96-gon’s 1e-7 of the circles', () => {
    const [b, h, d, n, yc] = [1200, 450, 250, 4, 220];
    const void_ = { area: (Math.PI * d * d) / 4, y: yc, ownI: (Math.PI * d ** 4) / 64, sign: -1 };
    // hand check from the published formula (circle A = πd²/4, I = πd⁴/64; parallel-axis theorem)
    const expected = compositeOfParts([rectangle(b, h, 0), ...Array.from({ length: n }, () => void_)]);
    const shape: SectionShape = { shape: 'voided-slab', widthMm: b, depthMm: h, voidDiameterMm: d, voidCount: n, voidCentreYMm: yc };
    const properties = sectionProperties(shapeToPolygons(shape));
    expect(properties.areaMm2 / expected.area).toBeCloseTo(1, 12);
    expect(properties.centroidFromSoffitMm / expected.centroid).toBeCloseTo(1, 12);
    expect(properties.inertiaMm4 / expected.inertia).toBeCloseTo(1, 6);
  });

  it('voided slab: void centres at width·(i + ½)/count − width/2', () => {
    const [polygon] = shapeToPolygons({ shape: 'voided-slab', widthMm: 1200, depthMm: 450, voidDiameterMm: 250, voidCount: 4, voidCentreYMm: 220 });
    const centresXMm = polygon!.holes.map((hole) => polygonProperties({ outer: hole, holes: [] }).centroidXMm);
    // hand check: spacing 300 mm, first centre 150 mm in from the left side at −600
    centresXMm.forEach((x, i) => expect(x).toBeCloseTo([-450, -150, 150, 450][i]!, 9));
  });

  it('voided slab: each 96-gon void stays within its circle’s extent', () => {
    const [polygon] = shapeToPolygons({ shape: 'voided-slab', widthMm: 1200, depthMm: 450, voidDiameterMm: 250, voidCount: 4, voidCentreYMm: 220 });
    for (const hole of polygon!.holes) {
      const { yMinMm, yMaxMm } = polygonYRangeMm({ outer: hole, holes: [] });
      // hand check: the circle spans 220 ± 125 mm; the polygon's flat sides sit just inside it
      expect(yMinMm).toBeGreaterThan(95);
      expect(yMaxMm).toBeLessThan(345);
      expect(yMaxMm).toBeGreaterThan(344.9);
    }
  });

  it('double-tee: flange and two tapered stems by hand sums', () => {
    // hand check from the published formula (composite areas, parallel-axis theorem; trapezoid stems)
    const stem = trapezoid(120, 200, 600, 0);
    const expected = compositeOfParts([stem, stem, rectangle(2400, 100, 600)]);
    const shape: SectionShape = {
      shape: 'double-tee',
      flangeWidthMm: 2400,
      flangeThicknessMm: 100,
      stemSpacingMm: 1200,
      stemTopWidthMm: 200,
      stemBottomWidthMm: 120,
      depthMm: 700,
    };
    expectProperties(shape, expected);
  });

  it('profile: the I-girder drawn as widths gives the I-girder’s properties', () => {
    // hand check from the published formula: the same composite parts as the i-girder case
    const expected = compositeOfParts([rectangle(600, 150, 0), trapezoid(600, 180, 100, 150), rectangle(180, 1000, 250), rectangle(900, 200, 1250)]);
    const profile: SectionShape = { shape: 'profile', widthsMm: [[0, 600], [150, 600], [250, 180], [1250, 180], [1250, 900], [1450, 900]] };
    expectProperties(profile, expected);
  });

  it('polygon: keeps its holes', () => {
    const shape: SectionShape = {
      shape: 'polygon',
      pointsMm: [[0, 0], [500, 0], [500, 1000], [0, 1000]],
      holesMm: [[[100, 100], [400, 100], [400, 300], [100, 300]]],
    };
    // hand check from the published formula (composite areas, parallel-axis theorem)
    expectProperties(shape, compositeOfParts([rectangle(500, 1000, 0), { ...rectangle(300, 200, 100), sign: -1 }]));
  });
});

const arbitraryProfile: fc.Arbitrary<ProfileSection> = fc
  .array(fc.tuple(fc.double({ min: 1, max: 400, noNaN: true }), fc.double({ min: 0, max: 2000, noNaN: true })), { minLength: 1, maxLength: 12 })
  .chain((steps) =>
    fc.double({ min: 1, max: 2000, noNaN: true }).map((soffitWidthMm): ProfileSection => {
      let yMm = 0;
      const widthsMm: [number, number][] = [[0, soffitWidthMm]];
      for (const [riseMm, widthMm] of steps) widthsMm.push([(yMm += riseMm), widthMm]);
      return { shape: 'profile', widthsMm };
    }),
  );

describe('properties of any profile', () => {
  it('puts a symmetric shape’s centroid on x = 0', () => {
    fc.assert(
      fc.property(arbitraryProfile, (profile) => {
        const polygon = shapeToPolygons(profile)[0]!;
        const { centroidXMm, inertiaYMm4, areaMm2 } = polygonProperties(polygon);
        const halfWidest = Math.max(...profile.widthsMm.map(([, w]) => w)) / 2;
        expect(Math.abs(centroidXMm) / halfWidest).toBeLessThan(1e-9);
        expect(inertiaYMm4 / areaMm2).toBeLessThanOrEqual(halfWidest ** 2 * (1 + 1e-9));
      }),
    );
  });

  it('splits the area exactly when clipped at a height: area(below) + area(above) = area', () => {
    const areaOf = (polygon: PolygonMm | null) => (polygon === null ? 0 : areaIntegrals(polygon).areaMm2);
    fc.assert(
      fc.property(arbitraryProfile, fc.double({ min: 0, max: 1, noNaN: true }), (profile, fraction) => {
        const polygon = shapeToPolygons(profile)[0]!;
        const depthMm = sectionDepthMm(profile);
        const cutMm = fraction * depthMm;
        const area = sectionProperties([polygon]).areaMm2;
        const split = areaOf(clipPolygonToBand(polygon, 0, cutMm)) + areaOf(clipPolygonToBand(polygon, cutMm, depthMm));
        expect(split / area).toBeCloseTo(1, 10);
      }),
    );
  });
});

describe('flatTopWidthMm and sectionDepthMm', () => {
  it.each<[SectionShape, number | null, number]>([
    [{ shape: 'rectangle', widthMm: 400, depthMm: 900 }, 400, 900],
    [{ shape: 'tee', flangeWidthMm: 1200, flangeThicknessMm: 200, webWidthMm: 250, depthMm: 900 }, 1200, 900],
    [{ shape: 'profile', widthsMm: [[0, 600], [1000, 150], [1200, 1100]] }, 1100, 1200],
    [{ shape: 'profile', widthsMm: [[0, 600], [800, 0]] }, null, 800],
    [{ shape: 'double-tee', flangeWidthMm: 2400, flangeThicknessMm: 100, stemSpacingMm: 1200, stemTopWidthMm: 200, stemBottomWidthMm: 120, depthMm: 700 }, 2400, 700],
    [{ shape: 'polygon', pointsMm: [[0, 0], [600, 0], [300, 900]] }, null, 900],
    [{ shape: 'polygon', pointsMm: [[0, 0], [600, 0], [500, 900], [200, 900]] }, 300, 900],
  ])('%j has a flat top of %p and a depth of %p', (shape, topWidthMm, depthMm) => {
    expect(flatTopWidthMm(shape)).toBe(topWidthMm);
    expect(sectionDepthMm(shape)).toBe(depthMm);
  });
});
