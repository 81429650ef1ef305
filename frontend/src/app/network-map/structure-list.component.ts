import { ChangeDetectionStrategy, Component, ElementRef, afterRenderEffect, computed, inject, input, output } from '@angular/core';
import { STRUCTURE_STATUS_NAMES, StructureStatus, StructureSummary } from '@spanledger/shared';

/** One line of the list, ready to show. */
interface StructureRow {
  readonly id: number;
  readonly structureNumber: string;
  readonly name: string;
  readonly crossing: string;
  readonly district: string;
  /** The district, and the status when the structure is not simply open. */
  readonly place: string;
  readonly status: StructureStatus;
}

/** Orders structure numbers as people read them: "B-9" before "B-10". */
const structureNumberOrder = new Intl.Collator('en', { numeric: true, sensitivity: 'base' });

/**
 * The structures in the map view that match the filters, in structure-number order, with how many
 * of the network's they are and a note when the server cut the list short.
 */
@Component({
  selector: 'sl-structure-list',
  templateUrl: './structure-list.component.html',
  styleUrl: './structure-list.component.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StructureListComponent {
  readonly structures = input.required<readonly StructureSummary[]>();
  /** True when the server returned only the first page of what lies in view. */
  readonly truncated = input(false);
  /** How many structures in view match, counting those beyond a cut-short page. */
  readonly total = input.required<number>();
  /** How many structures the network has; null while unknown. */
  readonly networkTotal = input<number | null>(null);
  /** True when filters narrow what is shown. */
  readonly filtered = input(false);
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
        place: structure.status === 'open' ? structure.district : `${structure.district} · ${STRUCTURE_STATUS_NAMES[structure.status]}`,
        status: structure.status,
      })),
  );

  protected readonly countHeading = computed(() => {
    const total = this.total();
    const networkTotal = this.networkTotal();
    if (networkTotal === null) return `${total.toLocaleString('en')} ${total === 1 ? 'structure' : 'structures'} in view`;
    return `${total.toLocaleString('en')} of ${networkTotal.toLocaleString('en')} ${networkTotal === 1 ? 'structure' : 'structures'} in view`;
  });

  protected readonly emptyText = computed(() =>
    this.filtered() ? 'No structures in this part of the map match the filters.' : 'No structures in this part of the map.',
  );

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
