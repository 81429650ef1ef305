import { shapeToPolygons, type SectionShape } from '@spanledger/shared';

import { concreteAcrossMm, strandPositionsMm, type DrawnStrandRow } from './strand-positions';

const row = (overrides: Partial<DrawnStrandRow> = {}): DrawnStrandRow => ({ id: 'r1', yMm: 50, count: 4, strandDiameterMm: 10, ...overrides });
const xsOf = (section: SectionShape, strandRow: DrawnStrandRow): number[] => strandPositionsMm(shapeToPolygons(section), strandRow).map(({ xMm }) => Number(xMm.toFixed(6)));

const RECTANGLE: SectionShape = { shape: 'rectangle', widthMm: 600, depthMm: 900 };
// Hand check: webs of 200 mm either side of a 600 mm void from 150 mm to 750 mm above the soffit.
const BOX: SectionShape = { shape: 'box', widthMm: 1000, depthMm: 900, voidWidthMm: 600, voidDepthMm: 600, voidBottomMm: 150 };
const I_GIRDER: SectionShape = {
  shape: 'i-girder',
  topFlangeWidthMm: 500,
  topFlangeThicknessMm: 100,
  topTaperHeightMm: 100,
  webWidthMm: 200,
  bottomTaperHeightMm: 100,
  bottomFlangeWidthMm: 600,
  bottomFlangeThicknessMm: 150,
  depthMm: 1200,
};

describe('strandPositionsMm', () => {
  it("uses the row's own positions when they name every strand, in their order", () => {
    const positions = strandPositionsMm(shapeToPolygons(RECTANGLE), row({ count: 3, xMm: [100, -200, 0] }));

    expect(positions).toEqual([
      { xMm: 100, yMm: 50 },
      { xMm: -200, yMm: 50 },
      { xMm: 0, yMm: 50 },
    ]);
  });

  it('spreads a row evenly across the width, one diameter of clear cover from each side', () => {
    // Centres 1.5 × 10 mm in from ±300 mm: −285 to 285 in three equal steps of 190 mm.
    expect(xsOf(RECTANGLE, row())).toEqual([-285, -95, 95, 285]);
  });

  it('puts a single strand in the middle of the concrete', () => {
    expect(xsOf(RECTANGLE, row({ count: 1 }))).toEqual([0]);
  });

  it('spreads over the width at the row height of a shaped section: flange, taper', () => {
    expect(xsOf(I_GIRDER, row({ count: 2, yMm: 50 }))).toEqual([-285, 285]);
    // Half-way up the bottom taper the width is (600 + 200) / 2 = 400 mm.
    expect(xsOf(I_GIRDER, row({ count: 2, yMm: 200 }))).toEqual([-185, 185]);
  });

  it('shares the strands between the webs of a box at the height of its void', () => {
    expect(xsOf(BOX, row({ count: 4, yMm: 400 }))).toEqual([-485, -315, 315, 485]);
    // Below the void the full width is concrete again.
    expect(xsOf(BOX, row({ count: 2, yMm: 60 }))).toEqual([-485, 485]);
  });

  it('gives the extra strand of an odd count to the leftmost of two equal stems', () => {
    const doubleTee: SectionShape = { shape: 'double-tee', flangeWidthMm: 2400, flangeThicknessMm: 100, stemSpacingMm: 1200, stemTopWidthMm: 200, stemBottomWidthMm: 200, depthMm: 800 };

    expect(xsOf(doubleTee, row({ count: 3, yMm: 100 }))).toEqual([-685, -515, 600]);
  });

  it('stacks the strands in the middle of a stretch too narrow for the cover', () => {
    const narrow: SectionShape = { shape: 'rectangle', widthMm: 20, depthMm: 300 };

    expect(xsOf(narrow, row({ count: 2 }))).toEqual([0, 0]);
  });

  it('spreads a row outside the concrete over the full width, so the drawing shows it misplaced', () => {
    expect(xsOf(RECTANGLE, row({ count: 2, yMm: 950 }))).toEqual([-285, 285]);
  });

  it('spreads evenly when the given positions do not match the count', () => {
    expect(xsOf(RECTANGLE, row({ count: 2, xMm: [0] }))).toEqual([-285, 285]);
  });
});

describe('concreteAcrossMm', () => {
  it('takes the width just above a step, and none at the very top', () => {
    expect(concreteAcrossMm(shapeToPolygons(I_GIRDER), 150)).toEqual([[-300, 300]]);
    expect(concreteAcrossMm(shapeToPolygons(I_GIRDER), 1200)).toEqual([]);
  });
});
