import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatExpansionModule } from '@angular/material/expansion';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { RATING_STATE_NAMES, canInDistrict, type RatingSummary, type SpanSummary } from '@spanledger/shared';

import { loadedList } from '../server-errors/loaded-list';
import { SessionStore } from '../session/session.store';
import { momentText, ratingFactorText } from './rating-text';
import { RatingsClient } from './ratings.client';
import { StructureRatingsPriorComponent } from './structure-ratings-prior.component';

/**
 * A structure's rating records, newest first, each opening its page; a rating engineer of the
 * district rates a span from here. Below them, on demand, the ratings on file from before
 * Spanledger that its spans are compared with until Spanledger approves ratings of its own.
 */
@Component({
  selector: 'sl-structure-ratings',
  imports: [MatTableModule, MatButtonModule, MatExpansionModule, MatIconModule, MatProgressBarModule, RouterLink, StructureRatingsPriorComponent],
  templateUrl: './structure-ratings.component.html',
  styleUrls: ['../structures/inventory-table.scss', './structure-ratings.component.scss'],
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StructureRatingsComponent {
  readonly structureId = input.required<number>();
  readonly district = input.required<string>();
  readonly spans = input.required<readonly SpanSummary[]>();

  private readonly client = inject(RatingsClient);
  private readonly session = inject(SessionStore);

  protected readonly columns = ['run', 'span', 'state', 'legal', 'inventory', 'ranBy'];

  private readonly list = loadedList(this.structureId, (structureId) => this.client.fetchRatingsOfStructure(structureId));
  protected readonly loading = this.list.loading;
  protected readonly failure = this.list.failure;

  protected readonly rows = computed(() => {
    return this.list.items().map((rating) => ({
      id: rating.id,
      run: momentText(rating.created.at),
      span: `Span ${rating.spanIndex}`,
      state: rating.state,
      stateName: RATING_STATE_NAMES[rating.state],
      hypothetical: rating.hypothetical,
      legal: ratingFactorText(rating.lowestLegalRf),
      legalBelowOne: rating.lowestLegalRf !== null && rating.lowestLegalRf < 1,
      inventory: ratingFactorText(rating.lowestInventoryRf),
      ranBy: rating.created.by ?? 'Data load',
    }));
  });

  protected readonly canRate = computed(() => {
    const user = this.session.user();
    return !!user && canInDistrict(user, 'runRatings', this.district());
  });
}
