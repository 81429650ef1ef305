import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatTableModule } from '@angular/material/table';
import type { SpanDetail } from '@spanledger/shared';

import { UnitsStore } from '../units/units.store';
import { GirdersTableComponent } from './girders-table.component';
import { describeWearingSurface } from './inventory-fields';
import { SpanFormComponent } from './span-form.component';

/** The spans of a structure; the chosen one shows its girders below, and its edit form for those allowed. */
@Component({
  selector: 'sl-spans-panel',
  imports: [MatTableModule, MatButtonModule, MatIconModule, GirdersTableComponent, SpanFormComponent],
  templateUrl: './spans-panel.component.html',
  styleUrl: './inventory-table.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SpansPanelComponent {
  readonly spans = input.required<readonly SpanDetail[]>();
  readonly canEdit = input(false);
  readonly spanSaved = output<SpanDetail>();
  /** The user chose to reload the spans after someone else changed one. */
  readonly reloadRequested = output<void>();

  private readonly units = inject(UnitsStore);
  protected readonly columns = ['index', 'length', 'girders', 'spacing', 'overhang', 'roadway', 'deck', 'haunch', 'wearingSurface'];
  protected readonly labels = this.units.labels;

  private readonly chosenId = signal<number | null>(null);
  protected readonly editing = signal(false);

  /** The chosen span, or the first one until the user chooses. */
  protected readonly selected = computed<SpanDetail | null>(() => {
    const spans = this.spans();
    return spans.find((span) => span.id === this.chosenId()) ?? spans[0] ?? null;
  });

  protected readonly rows = computed(() => {
    const system = this.units.system();
    return [...this.spans()]
      .sort((a, b) => a.spanIndex - b.spanIndex)
      .map((span) => ({
        id: span.id,
        spanIndex: span.spanIndex,
        length: this.units.format('spanLength', span.lengthM),
        girderCount: span.girderCount,
        spacing: this.units.format('deckLayout', span.girderSpacingMm),
        overhang: this.units.format('deckLayout', span.overhangMm),
        roadway: this.units.format('deckLayout', span.roadwayWidthMm),
        deck: this.units.format('sectionSize', span.deckThicknessMm),
        haunch: this.units.format('sectionSize', span.haunchMm),
        wearingSurface: describeWearingSurface(span.wearingSurface, system),
      }));
  });

  protected choose(spanId: number): void {
    if (spanId !== this.selected()?.id) this.editing.set(false);
    this.chosenId.set(spanId);
  }

  protected edit(): void {
    this.editing.set(true);
  }

  protected stopEditing(): void {
    this.editing.set(false);
  }

  protected onSaved(span: SpanDetail): void {
    this.editing.set(false);
    this.spanSaved.emit(span);
  }

  protected reload(): void {
    this.reloadRequested.emit();
  }
}
