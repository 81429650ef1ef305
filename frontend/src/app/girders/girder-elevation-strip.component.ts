import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { FINDING_KIND_NAMES, type FindingDetail } from '@spanledger/shared';

import { UnitsStore } from '../units/units.store';

/** A finding's stretch of the span, with its label placed in a lane clear of the others. */
interface ElevationBand {
  readonly id: number;
  readonly kind: FindingDetail['kind'];
  readonly label: string;
  readonly description: string;
  readonly x: number;
  readonly width: number;
  readonly labelX: number;
  readonly labelAnchor: 'start' | 'end';
  readonly labelY: number;
  readonly bracketY: number;
}

/** The strip is drawn this many units long whatever the span, about its width in px beside the form, so text reads at its size. */
const STRIP_LENGTH = 720;
const LANE_HEIGHT = 26;
const BAR_HEIGHT = 22;
const AXIS_HEIGHT = 22;
/** Labels are kept apart by an estimate of their width: characters × this. */
const CHARACTER_WIDTH = 7.2;
const LABEL_GAP = 12;
/** A finding at a single point is still drawn wide enough to see. */
const MIN_BAND_WIDTH = 4;

/**
 * The girder along its span, support to support, with each finding's from–to stretch drawn as a
 * band across the girder and labelled by its kind above it; labels that would overlap go up a lane.
 */
@Component({
  selector: 'sl-girder-elevation-strip',
  template: `
    <svg
      class="strip"
      data-testid="elevation-strip"
      role="img"
      [attr.viewBox]="'0 0 ' + stripLength + ' ' + height()"
      [attr.aria-label]="description()"
    >
      <rect class="girder" x="0" [attr.y]="barY()" [attr.width]="stripLength" [attr.height]="barHeight" />
      @for (band of bands(); track band.id) {
        <g data-testid="elevation-band" [attr.data-kind]="band.kind" [attr.data-finding-id]="band.id">
          <title>{{ band.description }}</title>
          <rect class="band" [attr.x]="band.x" [attr.y]="barY()" [attr.width]="band.width" [attr.height]="barHeight" />
          <path class="bracket" [attr.d]="'M' + band.x + ',' + (barY() - 2) + 'V' + band.bracketY + 'H' + (band.x + band.width) + 'V' + (barY() - 2)" />
        </g>
      }
      <!-- Labels over every bracket, each on a halo, so a higher lane's bracket never runs through a lower lane's words. -->
      @for (band of bands(); track band.id) {
        <text class="band-label" data-testid="elevation-label" [attr.data-finding-id]="band.id" [attr.x]="band.labelX" [attr.y]="band.labelY" [attr.text-anchor]="band.labelAnchor">{{ band.label }}</text>
      }
      <text class="axis" x="0" [attr.y]="axisY()">0</text>
      <text class="axis" [attr.x]="stripLength / 2" [attr.y]="axisY()" text-anchor="middle">{{ midspan() }}</text>
      <text class="axis" [attr.x]="stripLength" [attr.y]="axisY()" text-anchor="end" data-testid="elevation-span-length">{{ spanLength() }}</text>
    </svg>
    @if (bands().length === 0) {
      <p class="none" data-testid="elevation-none">No open findings along this girder.</p>
    }
  `,
  styles: `
    :host { display: block; }
    .strip { display: block; width: 100%; height: auto; overflow: visible; }
    .girder { fill: var(--mat-sys-surface-container-highest); stroke: var(--mat-sys-on-surface-variant); stroke-width: 1px; vector-effect: non-scaling-stroke; }
    .band { fill: var(--mat-sys-error); fill-opacity: 0.35; stroke: var(--mat-sys-error); stroke-width: 1.5px; vector-effect: non-scaling-stroke; }
    .bracket { fill: none; stroke: var(--mat-sys-on-surface-variant); stroke-width: 1px; vector-effect: non-scaling-stroke; }
    .band-label, .axis { font-size: 13px; fill: var(--mat-sys-on-surface); }
    .band-label { paint-order: stroke; stroke: var(--mat-sys-surface); stroke-width: 4px; stroke-linejoin: round; }
    .axis { fill: var(--mat-sys-on-surface-variant); }
    .none { margin: 4px 0 0; font: var(--mat-sys-body-small); color: var(--mat-sys-on-surface-variant); }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class GirderElevationStripComponent {
  readonly spanLengthM = input.required<number>();
  /** The findings to show; the strip draws what it is given (the editor gives the open ones). */
  readonly findings = input.required<readonly FindingDetail[]>();

  private readonly units = inject(UnitsStore);
  protected readonly stripLength = STRIP_LENGTH;
  protected readonly barHeight = BAR_HEIGHT;

  private readonly placed = computed(() => {
    const unit = this.units.labels().spanLength;
    const rangeText = (fromM: number, toM: number) => `${this.units.format('spanLength', fromM)}–${this.units.format('spanLength', toM)} ${unit}`;
    return placeBands(this.findings(), this.spanLengthM(), rangeText);
  });
  private readonly laneCount = computed(() => this.placed().laneCount);

  protected readonly barY = computed(() => this.laneCount() * LANE_HEIGHT + 6);
  protected readonly axisY = computed(() => this.barY() + BAR_HEIGHT + AXIS_HEIGHT - 6);
  protected readonly height = computed(() => this.barY() + BAR_HEIGHT + AXIS_HEIGHT);
  protected readonly bands = computed<readonly ElevationBand[]>(() =>
    // Lane 0 sits right above the girder, later lanes further up.
    this.placed().bands.map((band) => {
      const top = (this.laneCount() - 1 - band.lane) * LANE_HEIGHT;
      return { ...band, labelY: top + LANE_HEIGHT - 10, bracketY: top + LANE_HEIGHT - 4 };
    }),
  );
  protected readonly spanLength = computed(() => this.units.format('spanLength', this.spanLengthM(), { withUnit: true }));
  protected readonly midspan = computed(() => this.units.format('spanLength', this.spanLengthM() / 2, { withUnit: true }));
  protected readonly description = computed(() => {
    const bands = this.bands();
    const along = `Girder along its ${this.spanLength()} span`;
    return bands.length === 0 ? `${along}, no open findings` : `${along}: ${bands.map((band) => band.description).join('; ')}`;
  });
}

type PlacedBand = Omit<ElevationBand, 'labelY' | 'bracketY'> & { readonly lane: number };

/** Lanes filled from the left: a band goes in the lowest lane whose last label ends before its own begins. */
function placeBands(findings: readonly FindingDetail[], spanLengthM: number, rangeText: (fromM: number, toM: number) => string): { bands: PlacedBand[]; laneCount: number } {
  const scale = STRIP_LENGTH / spanLengthM;
  const laneEnds: number[] = [];
  const bands = [...findings]
    .sort((a, b) => a.fromM - b.fromM || a.toM - b.toM || a.id - b.id)
    .map((finding): PlacedBand => {
      const fromX = clamp(finding.fromM * scale);
      const width = Math.max(clamp(finding.toM * scale) - fromX, MIN_BAND_WIDTH);
      const label = FINDING_KIND_NAMES[finding.kind];
      const labelWidth = label.length * CHARACTER_WIDTH;
      // A label that would run off the right end is set to end at the band's end instead.
      const fitsRight = fromX + labelWidth <= STRIP_LENGTH;
      const [occupiedFrom, occupiedTo] = fitsRight ? [fromX, Math.max(fromX + labelWidth, fromX + width)] : [Math.min(fromX, fromX + width - labelWidth), fromX + width];
      let lane = laneEnds.findIndex((end) => end + LABEL_GAP <= occupiedFrom);
      if (lane < 0) lane = laneEnds.push(occupiedTo) - 1;
      else laneEnds[lane] = occupiedTo;
      return {
        id: finding.id,
        kind: finding.kind,
        label,
        description: `${label}, ${rangeText(finding.fromM, finding.toM)}`,
        x: fromX,
        width,
        labelX: fitsRight ? fromX : fromX + width,
        labelAnchor: fitsRight ? 'start' : 'end',
        lane,
      };
    });
  return { bands, laneCount: Math.max(laneEnds.length, 1) };
}

function clamp(x: number): number {
  return Math.min(Math.max(x, 0), STRIP_LENGTH);
}
