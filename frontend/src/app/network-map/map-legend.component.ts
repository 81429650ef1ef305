import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatSlideToggleChange, MatSlideToggleModule } from '@angular/material/slide-toggle';
import { RatingBasis, STRUCTURE_STATUSES, STRUCTURE_STATUS_NAMES } from '@spanledger/shared';

import { MarkerLook } from './marker-look';
import { STATUS_MARKER_SHAPES } from './marker-shapes';
import { MarkerSymbolComponent } from './marker-symbol.component';
import {
  NOT_RATED_COLOUR,
  RATING_BASIS_NAMES,
  RATING_SCALE_RANGE,
  RATING_SCALE_TICKS,
  ratingColour,
  ratingScaleGradient,
  ratingScalePosition,
} from './rating-colour-scale';

/** A tick under the colour bar. */
interface ScaleTick {
  readonly label: string;
  /** From the bar's left end, in percent of its width. */
  readonly leftPercent: number;
}

interface LegendEntry {
  readonly key: string;
  readonly label: string;
  readonly look: MarkerLook;
}

/** Status shapes are shown filled white, so they are not read as "not rated". */
const SHAPE_SAMPLE_FILL = '#ffffff';
const BELOW_ONE_SAMPLE_RATING_FACTOR = 0.8;

const { min: SCALE_MIN, max: SCALE_MAX } = RATING_SCALE_RANGE;

/** The map's key: the rating-factor colour scale and its basis switch, "not rated", and the status shapes. */
@Component({
  selector: 'sl-map-legend',
  imports: [MatSlideToggleModule, MarkerSymbolComponent],
  templateUrl: './map-legend.component.html',
  styleUrl: './map-legend.component.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MapLegendComponent {
  readonly ratingBasis = input.required<RatingBasis>();
  readonly ratingBasisChange = output<RatingBasis>();

  protected readonly gradient = ratingScaleGradient();
  protected readonly scaleDescription =
    `Colour scale from dark purple at ${SCALE_MIN.toFixed(2)} or less, through blue at 1.00 and green, to yellow at ${SCALE_MAX.toFixed(2)} or more`;
  protected readonly ticks: readonly ScaleTick[] = RATING_SCALE_TICKS.map((ratingFactor) => ({
    label: tickLabel(ratingFactor),
    leftPercent: ratingScalePosition(ratingFactor) * 100,
  }));
  protected readonly ratingEntries: readonly LegendEntry[] = [
    {
      key: 'below-1',
      label: 'Below 1.00: heavy outline',
      look: { shape: 'circle', fillColor: ratingColour(BELOW_ONE_SAMPLE_RATING_FACTOR), belowOne: true, selected: false },
    },
    { key: 'not-rated', label: 'Not rated', look: { shape: 'circle', fillColor: NOT_RATED_COLOUR, belowOne: false, selected: false } },
  ];
  protected readonly statusEntries: readonly LegendEntry[] = STRUCTURE_STATUSES.map((status) => ({
    key: status,
    label: STRUCTURE_STATUS_NAMES[status],
    look: { shape: STATUS_MARKER_SHAPES[status], fillColor: SHAPE_SAMPLE_FILL, belowOne: false, selected: false },
  }));

  protected readonly basisName = computed(() => RATING_BASIS_NAMES[this.ratingBasis()]);
  protected readonly byDesignInventory = computed(() => this.ratingBasis() === 'design-inventory');

  protected onBasisToggled(change: MatSlideToggleChange): void {
    this.ratingBasisChange.emit(change.checked ? 'design-inventory' : 'legal');
  }
}

function tickLabel(ratingFactor: number): string {
  const text = ratingFactor.toFixed(2);
  if (ratingFactor <= SCALE_MIN) return `≤ ${text}`;
  return ratingFactor >= SCALE_MAX ? `≥ ${text}` : text;
}
