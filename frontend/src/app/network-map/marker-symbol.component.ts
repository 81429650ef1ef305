import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';

import { MarkerLook, markerStyle } from './marker-look';
import { MARK_HALO, MARK_LINE_WEIGHT, svgPathOf, traceMarks, traceOutline } from './marker-shapes';

/** One marker drawn as the map draws it, at the map's scale, for the legend and the status filter. Decorative. */
@Component({
  selector: 'sl-marker-symbol',
  template: `<svg viewBox="-10 -10 20 20" width="20" height="20" aria-hidden="true" focusable="false">
    <path
      [attr.d]="outline()"
      [attr.fill]="style().fillColor"
      [attr.fill-opacity]="style().fillOpacity"
      [attr.stroke]="style().color"
      [attr.stroke-width]="style().weight"
    />
    @if (marks(); as marks) {
      <path [attr.d]="marks" fill="none" stroke-linecap="round" [attr.stroke]="halo.color" [attr.stroke-width]="halo.weight" />
      <path [attr.d]="marks" fill="none" stroke-linecap="round" [attr.stroke]="style().color" [attr.stroke-width]="markWeight" />
    }
  </svg>`,
  styles: `
    :host { display: inline-flex; flex: none; }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MarkerSymbolComponent {
  readonly look = input.required<MarkerLook>();

  protected readonly halo = MARK_HALO;
  protected readonly markWeight = MARK_LINE_WEIGHT;
  protected readonly style = computed(() => markerStyle(this.look()));
  protected readonly outline = computed(() => svgPathOf((pen) => traceOutline(pen, this.look().shape, 0, 0, this.style().radius)));
  /** The cross of a closed structure; null for the shapes without marks. */
  protected readonly marks = computed(() => {
    const path = svgPathOf((pen) => traceMarks(pen, this.look().shape, 0, 0, this.style().radius));
    return path === '' ? null : path;
  });
}
