import { ChangeDetectionStrategy, Component, ElementRef, afterRenderEffect, computed, inject, input, output } from '@angular/core';
import { STRUCTURE_STATUS_NAMES, RatingBasis, StructureStatus, StructureSummary } from '@spanledger/shared';

import { MarkerLook, markerLook } from './marker-look';
import { MarkerSymbolComponent } from './marker-symbol.component';

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
  /** The structure's marker as the map draws it, so a row and its marker are seen to be one. */
  readonly look: MarkerLook;
  readonly reratingDue: boolean;
}

/**
 * Rows the list draws at most. A person reads a list of a few hundred; past that they zoom or
 * filter, and drawing thousands of rows would hold up the map's first paint.
 */
export const MAX_LISTED_STRUCTURES = 300;

/** Orders structure numbers as people read them: "B-9" before "B-10". */
const structureNumberOrder = new Intl.Collator('en', { numeric: true, sensitivity: 'base' });

/**
 * The structures in the map view that match the filters, in structure-number order, with how many
 * of the network's they are and a note when the server cut the list short.
 */
@Component({
  selector: 'sl-structure-list',
  imports: [MarkerSymbolComponent],
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
  /** The rating factor of record the markers are coloured by. */
  readonly ratingBasis = input<RatingBasis>('legal');
  readonly structureSelected = output<number>();

  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);

  private readonly sortedStructures = computed(() => [...this.structures()].sort((a, b) => structureNumberOrder.compare(a.structureNumber, b.structureNumber)));

  protected readonly rows = computed<readonly StructureRow[]>(() =>
    this.sortedStructures()
      .slice(0, MAX_LISTED_STRUCTURES)
      .map((structure) => ({
        id: structure.id,
        structureNumber: structure.structureNumber,
        name: structure.name,
        crossing: `${structure.routeCarried} over ${structure.featureCrossed}`,
        district: structure.district,
        place: structure.status === 'open' ? structure.district : `${structure.district} · ${STRUCTURE_STATUS_NAMES[structure.status]}`,
        status: structure.status,
        look: markerLook(structure, this.ratingBasis(), false),
        reratingDue: structure.reratingDue,
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

  protected readonly truncatedNote = computed(() => {
    const listed = this.rows().length;
    if (this.truncated() || listed < this.sortedStructures().length) {
      return `Only the first ${listed.toLocaleString('en')} are listed. Zoom in or filter to see the rest.`;
    }
    return null;
  });

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
