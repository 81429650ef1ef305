import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { RESULT_CAUTION, RatingBasis, STRUCTURE_STATUS_NAMES, StructureSummary } from '@spanledger/shared';

import { RATING_BASIS_NAMES, ratingFactorOf } from './rating-colour-scale';

/** One line of the card. */
interface Figure {
  readonly key: string;
  readonly label: string;
  readonly value: string;
}

const NOT_RECORDED = 'Not recorded';

/** The key figures of the structure picked on the map or in the list, with the way to its own page. */
@Component({
  selector: 'sl-structure-card',
  imports: [MatCardModule, MatButtonModule, MatIconModule, RouterLink],
  templateUrl: './structure-card.component.html',
  styleUrl: './structure-card.component.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StructureCardComponent {
  readonly structure = input.required<StructureSummary>();
  /** Which rating factor of record the map colours by, and so the one the card gives. */
  readonly ratingBasis = input.required<RatingBasis>();
  readonly closed = output<void>();

  protected readonly caution = RESULT_CAUTION;
  private readonly ratingFactor = computed(() => ratingFactorOf(this.structure(), this.ratingBasis()));
  protected readonly rated = computed(() => this.ratingFactor() !== null);
  protected readonly structureLink = computed(() => ['/structures', this.structure().id]);

  protected readonly figures = computed<readonly Figure[]>(() => {
    const structure = this.structure();
    const ratingFactor = this.ratingFactor();
    return [
      { key: 'crossing', label: 'Carries', value: `${structure.routeCarried} over ${structure.featureCrossed}` },
      { key: 'district', label: 'District', value: structure.district },
      { key: 'year-built', label: 'Year built', value: structure.yearBuilt === null ? NOT_RECORDED : String(structure.yearBuilt) },
      { key: 'traffic', label: 'ADT / ADTT', value: `${count(structure.adt)} / ${count(structure.adtt)}` },
      { key: 'status', label: 'Status', value: STRUCTURE_STATUS_NAMES[structure.status] },
      { key: 'lowest-condition', label: 'Lowest condition rating', value: structure.lowestCondition === null ? NOT_RECORDED : String(structure.lowestCondition) },
      {
        key: 'rating-factor',
        label: `Rating factor (${RATING_BASIS_NAMES[this.ratingBasis()].toLowerCase()})`,
        value: ratingFactor === null ? 'Not rated' : ratingFactor.toFixed(2),
      },
    ];
  });

  protected close(): void {
    this.closed.emit();
  }
}

/** Traffic counts with thousands separators, a dash when not recorded. */
function count(value: number | null): string {
  return value === null ? '—' : value.toLocaleString('en');
}
