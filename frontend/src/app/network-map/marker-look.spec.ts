import { StructureSummary } from '@spanledger/shared';

import { markerLook, markerLookKey, markerStyle } from './marker-look';
import { MARKER_SHAPE_SCALE, STATUS_MARKER_SHAPES, svgPathOf, traceMarks, traceOutline } from './marker-shapes';
import { NOT_RATED_COLOUR, ratingColour } from './rating-colour-scale';
import { structureFeature } from './structure-features.testing';

function summary(overrides: Partial<StructureSummary> = {}): StructureSummary {
  return structureFeature({ id: 1, structureNumber: 'NP-0001', ...overrides }).properties;
}

describe('markerLook', () => {
  it('shapes a marker by status: open a circle, posted a diamond, closed a crossed square', () => {
    expect(markerLook(summary({ status: 'open' }), 'legal', false).shape).toBe('circle');
    expect(markerLook(summary({ status: 'posted' }), 'legal', false).shape).toBe('diamond');
    expect(markerLook(summary({ status: 'closed' }), 'legal', false).shape).toBe('crossed-square');
  });

  it('colours by the rating factor the map is switched to, grey when that one is not rated', () => {
    const structure = summary({ legalRatingFactor: 1.5, designInventoryRatingFactor: null });
    expect(markerLook(structure, 'legal', false).fillColor).toBe(ratingColour(1.5));
    expect(markerLook(structure, 'design-inventory', false).fillColor).toBe(NOT_RATED_COLOUR);
  });

  it('marks a factor below 1.00 for a heavy outline, and not one of 1.00', () => {
    expect(markerLook(summary({ legalRatingFactor: 0.99 }), 'legal', false).belowOne).toBe(true);
    expect(markerLook(summary({ legalRatingFactor: 1 }), 'legal', false).belowOne).toBe(false);
    expect(markerLook(summary({ legalRatingFactor: null }), 'legal', false).belowOne).toBe(false);
  });
});

describe('markerStyle', () => {
  const plain = markerLook(summary({ legalRatingFactor: 1.2 }), 'legal', false);

  it('draws a factor below 1.00 larger and with a heavier outline than its neighbours', () => {
    const below = markerStyle({ ...plain, belowOne: true });
    expect(below.weight).toBeGreaterThan(markerStyle(plain).weight);
    expect(below.radius).toBeGreaterThan(markerStyle(plain).radius);
  });

  it('draws the picked structure largest, in another outline colour', () => {
    const selected = markerStyle({ ...plain, selected: true });
    expect(selected.radius).toBeGreaterThan(markerStyle({ ...plain, belowOne: true }).radius);
    expect(selected.color).not.toBe(markerStyle(plain).color);
  });

  it('gives the three shapes the area of the plain circle', () => {
    const circleArea = Math.PI * markerStyle(plain).radius ** 2;
    const diamond = markerStyle({ ...plain, shape: 'diamond' }).radius;
    const square = markerStyle({ ...plain, shape: 'crossed-square' }).radius;
    expect(2 * diamond ** 2).toBeCloseTo(circleArea, 6);
    expect(4 * square ** 2).toBeCloseTo(circleArea, 6);
  });
});

describe('markerLookKey', () => {
  it('tells looks apart by every part that changes the drawing', () => {
    const look = markerLook(summary(), 'legal', false);
    const keys = new Set([
      markerLookKey(look),
      markerLookKey({ ...look, shape: 'diamond' }),
      markerLookKey({ ...look, fillColor: '#000000' }),
      markerLookKey({ ...look, belowOne: true }),
      markerLookKey({ ...look, selected: true }),
    ]);
    expect(keys.size).toBe(5);
    expect(markerLookKey({ ...look })).toBe(markerLookKey(look));
  });
});

describe('marker shapes', () => {
  it('gives every status its own shape', () => {
    expect(new Set(Object.values(STATUS_MARKER_SHAPES)).size).toBe(3);
    expect(Object.keys(MARKER_SHAPE_SCALE).sort()).toEqual(['circle', 'crossed-square', 'diamond']);
  });

  it('traces each outline inside the box of its radius', () => {
    expect(svgPathOf((pen) => traceOutline(pen, 'diamond', 0, 0, 5))).toBe('M0 -5L5 0L0 5L-5 0Z');
    expect(svgPathOf((pen) => traceOutline(pen, 'crossed-square', 10, 10, 2))).toBe('M8 8L12 8L12 12L8 12Z');
    expect(svgPathOf((pen) => traceOutline(pen, 'circle', 0, 0, 3))).toBe('M-3 0A3 3 0 1 0 3 0A3 3 0 1 0 -3 0Z');
  });

  it('crosses the square of a closed structure, and marks no other shape', () => {
    expect(svgPathOf((pen) => traceMarks(pen, 'crossed-square', 0, 0, 10))).toBe('M-5.5 -5.5L5.5 5.5M5.5 -5.5L-5.5 5.5');
    expect(svgPathOf((pen) => traceMarks(pen, 'circle', 0, 0, 10))).toBe('');
    expect(svgPathOf((pen) => traceMarks(pen, 'diamond', 0, 0, 10))).toBe('');
  });
});
