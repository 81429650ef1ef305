import { RatingBasis, StructureSummary } from '@spanledger/shared';

/**
 * Viridis (van der Walt and Smith, matplotlib, 2015), sampled at ten even steps as published in
 * viridisLite's `viridis(10)`: perceptually uniform, lightness rising throughout, and readable with
 * the common colour-vision deficiencies.
 */
const VIRIDIS_ANCHORS = ['#440154', '#482878', '#3e4a89', '#31688e', '#26828e', '#1f9e89', '#35b779', '#6dcd59', '#b4de2c', '#fde725'] as const;

/** The rating factors the scale spans; factors beyond it take the colour of its nearer end. */
export const RATING_SCALE_RANGE = { min: 0.5, max: 2 } as const;

/** A structure with no rating of record: a neutral grey that no viridis step comes near. */
export const NOT_RATED_COLOUR = '#9ea7ab';

/** Where the legend labels the scale; the first and last stand for everything beyond them. */
export const RATING_SCALE_TICKS: readonly number[] = [0.5, 1, 1.5, 2];

type Rgb = readonly [number, number, number];

const ANCHOR_RGB: readonly Rgb[] = VIRIDIS_ANCHORS.map(rgbOf);

/** How the colour switch, the card and the rating-band filter name each rating factor of record. */
export const RATING_BASIS_NAMES: Readonly<Record<RatingBasis, string>> = {
  legal: 'Legal loads',
  'design-inventory': 'Design inventory',
};

/** The rating factor of record the map colours by: the lowest legal-load factor, or design inventory. */
export function ratingFactorOf(
  structure: Pick<StructureSummary, 'legalRatingFactor' | 'designInventoryRatingFactor'>,
  basis: RatingBasis,
): number | null {
  return basis === 'legal' ? structure.legalRatingFactor : structure.designInventoryRatingFactor;
}

/** The marker colour for a rating factor (`#rrggbb`): grey when not rated, else its place on the scale. */
export function ratingColour(ratingFactor: number | null): string {
  return ratingFactor === null ? NOT_RATED_COLOUR : scaleColourAt(ratingScalePosition(ratingFactor));
}

/** Where a rating factor sits along the scale, 0 at its low end to 1 at its high end, clamped. */
export function ratingScalePosition(ratingFactor: number): number {
  const { min, max } = RATING_SCALE_RANGE;
  return Math.min(1, Math.max(0, (ratingFactor - min) / (max - min)));
}

/** The scale as a CSS gradient running left to right, for the legend's colour bar. */
export function ratingScaleGradient(): string {
  const stops = VIRIDIS_ANCHORS.map((colour, index) => `${colour} ${round((index / (VIRIDIS_ANCHORS.length - 1)) * 100)}%`);
  return `linear-gradient(to right, ${stops.join(', ')})`;
}

/** Interpolates linearly between the two anchors either side; ten anchors keep the error well below a visible step. */
function scaleColourAt(position: number): string {
  const scaled = position * (ANCHOR_RGB.length - 1);
  const lower = Math.min(Math.floor(scaled), ANCHOR_RGB.length - 2);
  const share = scaled - lower;
  const [r0, g0, b0] = ANCHOR_RGB[lower]!;
  const [r1, g1, b1] = ANCHOR_RGB[lower + 1]!;
  return hexOf([r0 + (r1 - r0) * share, g0 + (g1 - g0) * share, b0 + (b1 - b0) * share]);
}

function rgbOf(hex: string): Rgb {
  const channel = (start: number) => Number.parseInt(hex.slice(start, start + 2), 16);
  return [channel(1), channel(3), channel(5)];
}

function hexOf(rgb: Rgb): string {
  return `#${rgb.map((channel) => Math.round(channel).toString(16).padStart(2, '0')).join('')}`;
}

function round(percent: number): number {
  return Math.round(percent * 100) / 100;
}
