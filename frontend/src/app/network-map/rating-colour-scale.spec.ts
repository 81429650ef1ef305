import { NOT_RATED_COLOUR, RATING_SCALE_RANGE, ratingColour, ratingFactorOf, ratingScaleGradient } from './rating-colour-scale';

/** WCAG 2.x relative luminance of an `#rrggbb` colour. */
function luminance(hex: string): number {
  const linear = [1, 3, 5].map((start) => {
    const value = Number.parseInt(hex.slice(start, start + 2), 16) / 255;
    return value <= 0.04045 ? value / 12.92 : ((value + 0.055) / 1.055) ** 2.4;
  });
  return 0.2126 * linear[0]! + 0.7152 * linear[1]! + 0.0722 * linear[2]!;
}

function steps(from: number, to: number, count: number): number[] {
  return Array.from({ length: count + 1 }, (_, index) => from + ((to - from) * index) / count);
}

describe('ratingColour', () => {
  it('is grey for a structure not rated', () => {
    expect(ratingColour(null)).toBe(NOT_RATED_COLOUR);
  });

  it("gives viridis' ends at the ends of the range, and holds them beyond", () => {
    expect(ratingColour(RATING_SCALE_RANGE.min)).toBe('#440154');
    expect(ratingColour(RATING_SCALE_RANGE.max)).toBe('#fde725');
    expect(ratingColour(0)).toBe('#440154');
    expect(ratingColour(0.2)).toBe('#440154');
    expect(ratingColour(3.5)).toBe('#fde725');
  });

  it('meets the published anchors where the range puts them (1.00 at one third, 1.50 at two thirds)', () => {
    expect(ratingColour(1)).toBe('#31688e');
    expect(ratingColour(1.5)).toBe('#35b779');
  });

  it('gets lighter all the way up the range, so a higher factor never looks like a lower one', () => {
    const luminances = steps(RATING_SCALE_RANGE.min, RATING_SCALE_RANGE.max, 150).map((rf) => luminance(ratingColour(rf)));
    luminances.slice(1).forEach((value, index) => expect(value).toBeGreaterThan(luminances[index]!));
  });

  it('sets every factor below 1.00 apart in lightness from every factor of 1.00 and above', () => {
    const darkestAtOrAboveOne = luminance(ratingColour(1));
    for (const rf of steps(RATING_SCALE_RANGE.min, 0.99, 49)) expect(luminance(ratingColour(rf))).toBeLessThan(darkestAtOrAboveOne);
  });

  it('never gives the not-rated grey to a rated structure', () => {
    for (const rf of steps(0, 3, 300)) expect(ratingColour(rf)).not.toBe(NOT_RATED_COLOUR);
  });

  it('answers six-digit hex colours throughout', () => {
    for (const rf of steps(0.4, 2.1, 85)) expect(ratingColour(rf)).toMatch(/^#[0-9a-f]{6}$/);
  });
});

describe('ratingFactorOf', () => {
  const structure = { legalRatingFactor: 0.92, designInventoryRatingFactor: 0.71 };

  it('takes the legal-load factor or the design inventory factor, as the map is switched', () => {
    expect(ratingFactorOf(structure, 'legal')).toBe(0.92);
    expect(ratingFactorOf(structure, 'design-inventory')).toBe(0.71);
    expect(ratingFactorOf({ legalRatingFactor: null, designInventoryRatingFactor: null }, 'legal')).toBeNull();
  });
});

describe('ratingScaleGradient', () => {
  it('runs from the low end to the high end of the scale', () => {
    const gradient = ratingScaleGradient();
    expect(gradient).toMatch(/^linear-gradient\(to right, #440154 0%, /);
    expect(gradient).toMatch(/#fde725 100%\)$/);
  });
});
