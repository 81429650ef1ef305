import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { RESULT_CAUTION, type PriorRatingSummary } from '@spanledger/shared';

import { loadedList } from '../server-errors/loaded-list';
import { dayText, ratingChangeText, ratingFactorText } from './rating-text';
import { PriorRatingsClient } from './structure-ratings-prior.client';

/**
 * The ratings a structure had on file before Spanledger, newest first: the day each was
 * approved, what it rated (the whole structure or a span), its figures with the change from the
 * prior rating before it, and where it comes from.
 */
@Component({
  selector: 'sl-structure-ratings-prior',
  imports: [MatTableModule, MatProgressBarModule],
  templateUrl: './structure-ratings-prior.component.html',
  styleUrls: ['../structures/inventory-table.scss', './structure-ratings-prior.component.scss'],
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StructureRatingsPriorComponent {
  readonly structureId = input.required<number>();

  private readonly client = inject(PriorRatingsClient);

  protected readonly caution = RESULT_CAUTION;
  protected readonly columns = ['approved', 'part', 'legal', 'inventory', 'source'];

  private readonly list = loadedList(this.structureId, (structureId) => this.client.fetchPriorRatings(structureId));
  protected readonly loading = this.list.loading;
  protected readonly failure = this.list.failure;

  protected readonly rows = computed(() => {
    return this.list.items().map((rating) => {
      const before = rating.previous;
      const change = (now: number | null, earlier: number | null) => (before ? ratingChangeText(now, earlier) : 'first on file');
      return {
        id: rating.id,
        approved: dayText(rating.approvedOn),
        part: rating.spanIndex === null ? 'Whole structure' : `Span ${rating.spanIndex}`,
        legal: ratingFactorText(rating.lowestLegalRf),
        legalBelowOne: rating.lowestLegalRf !== null && rating.lowestLegalRf < 1,
        legalChange: change(rating.lowestLegalRf, before?.lowestLegalRf ?? null),
        inventory: ratingFactorText(rating.lowestInventoryRf),
        inventoryChange: change(rating.lowestInventoryRf, before?.lowestInventoryRf ?? null),
        previous: before ? `Change from the rating of ${dayText(before.approvedOn)}` : 'The first rating on file for it',
        source: rating.sourceNote,
      };
    });
  });
}
