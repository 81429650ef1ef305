import { RatingBasis, StructureSummary, ratingBandOf } from '@spanledger/shared';

import { MARKER_SHAPE_SCALE, MarkerShape, STATUS_MARKER_SHAPES } from './marker-shapes';
import { ratingColour, ratingFactorOf } from './rating-colour-scale';

/** What a structure's marker shows: status by shape, rating factor by colour, and whether it is picked. */
export interface MarkerLook {
  readonly shape: MarkerShape;
  readonly fillColor: string;
  /** A rating factor below 1.00 gets a heavy outline too, so it stands out from its neighbours on the scale. */
  readonly belowOne: boolean;
  readonly selected: boolean;
}

/** How a look is stroked and filled; the radius is the box the shape fills, in pixels. */
export interface MarkerStyle {
  readonly radius: number;
  readonly color: string;
  readonly weight: number;
  readonly fillColor: string;
  readonly fillOpacity: number;
}

const OUTLINE_COLOUR = '#263238';
const SELECTED_OUTLINE_COLOUR = '#00474a';
const PLAIN = { radius: 6, weight: 1.5 } as const;
const BELOW_ONE = { radius: 7, weight: 3 } as const;
const SELECTED = { radius: 10, weight: 4 } as const;

/** The look of one structure's marker when the map colours by `basis`. */
export function markerLook(structure: StructureSummary, basis: RatingBasis, selected: boolean): MarkerLook {
  const ratingFactor = ratingFactorOf(structure, basis);
  return {
    shape: STATUS_MARKER_SHAPES[structure.status],
    fillColor: ratingColour(ratingFactor),
    belowOne: ratingBandOf(ratingFactor) === 'below-1',
    selected,
  };
}

/** The stroke, fill and size of a look; shapes are scaled to cover the area of the circle. */
export function markerStyle(look: MarkerLook): MarkerStyle {
  const size = look.selected ? SELECTED : look.belowOne ? BELOW_ONE : PLAIN;
  return {
    radius: size.radius * MARKER_SHAPE_SCALE[look.shape],
    color: look.selected ? SELECTED_OUTLINE_COLOUR : OUTLINE_COLOUR,
    weight: size.weight,
    fillColor: look.fillColor,
    fillOpacity: 0.95,
  };
}

/** Two looks draw alike exactly when their keys are equal: lets the map restyle only the markers that changed. */
export function markerLookKey(look: MarkerLook): string {
  return `${look.shape}|${look.fillColor}|${look.belowOne}|${look.selected}`;
}
