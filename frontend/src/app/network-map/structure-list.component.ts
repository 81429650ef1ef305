import { ChangeDetectionStrategy, Component, ElementRef, afterRenderEffect, computed, inject, input, output } from '@angular/core';
import { MatListModule } from '@angular/material/list';
import { StructureSummary } from '@spanledger/shared';

/** One line of the list, ready to show. */
interface StructureRow {
  readonly id: number;
  readonly structureNumber: string;
  readonly name: string;
  readonly crossing: string;
  readonly district: string;
}

/** Orders structure numbers as people read them: "B-9" before "B-10". */
const structureNumberOrder = new Intl.Collator('en', { numeric: true, sensitivity: 'base' });

/** The structures in the map view, in structure-number order, with a count and a note when the server cut the list short. */
@Component({
  selector: 'sl-structure-list',
  imports: [MatListModule],
  templateUrl: './structure-list.component.html',
  styleUrl: './structure-list.component.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StructureListComponent {
  readonly structures = input.required<readonly StructureSummary[]>();
  /** True when the server returned only the first page of what lies in view. */
  readonly truncated = input(false);
  readonly selectedId = input<number | null>(null);
  readonly structureSelected = output<number>();

  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);

  protected readonly rows = computed<readonly StructureRow[]>(() =>
    [...this.structures()]
      .sort((a, b) => structureNumberOrder.compare(a.structureNumber, b.structureNumber))
      .map((structure) => ({
        id: structure.id,
        structureNumber: structure.structureNumber,
        name: structure.name,
        crossing: `${structure.routeCarried} over ${structure.featureCrossed}`,
        district: structure.district,
      })),
  );

  protected readonly countHeading = computed(() => {
    const count = this.rows().length;
    return `${count.toLocaleString('en')} ${count === 1 ? 'structure' : 'structures'} in view`;
  });

  protected readonly truncatedNote = computed(() =>
    this.truncated() ? `Only the first ${this.rows().length.toLocaleString('en')} are shown. Zoom in to see the rest.` : null,
  );

  constructor() {
    // A structure picked on the map may sit far down the list: bring it into sight.
    afterRenderEffect(() => {
      const id = this.selectedId();
      if (id === null) return;
      const item = this.host.nativeElement.querySelector(`[data-structure-id="${id}"]`);
      item?.scrollIntoView({ block: 'nearest' });
    });
  }

  protected select(id: number): void {
    this.structureSelected.emit(id);
  }
}
