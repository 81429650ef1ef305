import { buildCompositeSection } from './composite';
import { flatTopWidthMm, sectionDepthMm, shapeToPolygons } from './polygons';
import type { SectionShape } from './shapes';

const girder: SectionShape = { shape: 'rectangle', widthMm: 400, depthMm: 900 };
const deck = { widthMm: 2400, thicknessMm: 200, haunchMm: 50 };
const n = 0.8;

function composite(haunchInSection: boolean, shape: SectionShape = girder) {
  return buildCompositeSection({
    girderPolygons: shapeToPolygons(shape),
    girderTopYMm: sectionDepthMm(shape),
    topWidthMm: flatTopWidthMm(shape),
    deck,
    nDeckToGirder: n,
    haunchInSection,
  });
}

/** Transformed-section sums by the parallel-axis theorem over (area, centroid, own I) parts. */
function transformed(parts: readonly { area: number; y: number; ownI: number }[]) {
  const area = parts.reduce((sum, p) => sum + p.area, 0);
  const centroid = parts.reduce((sum, p) => sum + p.area * p.y, 0) / area;
  const inertia = parts.reduce((sum, p) => sum + p.ownI + p.area * (p.y - centroid) ** 2, 0);
  return { area, centroid, inertia };
}

// hand check from the published formula: girder 400 × 900; haunch 400 × 50 and deck 2400 × 200, each × n
const girderPart = { area: 400 * 900, y: 450, ownI: (400 * 900 ** 3) / 12 };
const haunchPart = { area: n * 400 * 50, y: 925, ownI: (n * 400 * 50 ** 3) / 12 };
const deckPart = { area: n * 2400 * 200, y: 1050, ownI: (n * 2400 * 200 ** 3) / 12 };

describe('buildCompositeSection', () => {
  it('leaves the haunch out of the properties by default but keeps the deck on it', () => {
    const { properties } = composite(false);
    const expected = transformed([girderPart, deckPart]);
    expect(properties.areaMm2 / expected.area).toBeCloseTo(1, 12);
    expect(properties.centroidFromSoffitMm / expected.centroid).toBeCloseTo(1, 12);
    expect(properties.inertiaMm4 / expected.inertia).toBeCloseTo(1, 12);
    expect(properties.topYMm).toBe(1150);
    expect(properties.topModulusMm3 / (expected.inertia / (1150 - expected.centroid))).toBeCloseTo(1, 12);
    expect(properties.bottomModulusMm3 / (expected.inertia / expected.centroid)).toBeCloseTo(1, 12);
  });

  it('counts the haunch, transformed like the deck, when the policy says so', () => {
    const { properties } = composite(true);
    const expected = transformed([girderPart, haunchPart, deckPart]);
    expect(properties.areaMm2 / expected.area).toBeCloseTo(1, 12);
    expect(properties.centroidFromSoffitMm / expected.centroid).toBeCloseTo(1, 12);
    expect(properties.inertiaMm4 / expected.inertia).toBeCloseTo(1, 12);
  });

  it('returns girder, haunch and deck regions, the haunch on the flat top and the deck centred above it', () => {
    const { regions } = composite(false);
    expect(regions.map((r) => r.region)).toEqual(['girder', 'haunch', 'deck']);
    const [haunch, deckRegion] = [regions[1]!.polygons[0]!, regions[2]!.polygons[0]!];
    expect(haunch.outer).toEqual([[-200, 900], [200, 900], [200, 950], [-200, 950]]);
    expect(deckRegion.outer).toEqual([[-1200, 950], [1200, 950], [1200, 1150], [-1200, 1150]]);
  });

  it('leaves out a haunch of zero height', () => {
    const { regions } = buildCompositeSection({
      girderPolygons: shapeToPolygons(girder),
      girderTopYMm: 900,
      topWidthMm: 400,
      deck: { ...deck, haunchMm: 0 },
      nDeckToGirder: n,
      haunchInSection: true,
    });
    expect(regions.map((r) => r.region)).toEqual(['girder', 'deck']);
  });

  it('refuses a deck on a girder without a flat top, and non-positive sizes', () => {
    const pointed: SectionShape = { shape: 'polygon', pointsMm: [[-300, 0], [300, 0], [0, 900]] };
    expect(() => composite(false, pointed)).toThrow('a deck needs a girder with a flat top');
    const options = { girderPolygons: shapeToPolygons(girder), girderTopYMm: 900, topWidthMm: 400, haunchInSection: false };
    expect(() => buildCompositeSection({ ...options, deck, nDeckToGirder: 0 })).toThrow('nDeckToGirder must be > 0, not 0');
    expect(() => buildCompositeSection({ ...options, deck: { ...deck, thicknessMm: -1 }, nDeckToGirder: n })).toThrow(/deckThicknessMm must be > 0/);
  });
});
