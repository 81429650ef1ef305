import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatExpansionModule } from '@angular/material/expansion';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { RATING_STATE_NAMES, canInDistrict, type RatingSummary, type SpanSummary } from '@spanledger/shared';
import { catchError, map, of, startWith, switchMap } from 'rxjs';

import { saveFailureOf } from '../structures/field-problems';
import { SessionStore } from '../session/session.store';
import { momentText, ratingFactorText } from './rating-text';
import { RatingsClient } from './ratings.client';
import { StructureRatingsPriorComponent } from './structure-ratings-prior.component';

type ListState =
  | { readonly kind: 'loading' }
  | { readonly kind: 'loaded'; readonly ratings: readonly RatingSummary[] }
  | { readonly kind: 'failed'; readonly message: string };

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

  private readonly state = toSignal(
    toObservable(this.structureId).pipe(
      switchMap((structureId) =>
        this.client.fetchRatingsOfStructure(structureId).pipe(
          map((ratings): ListState => ({ kind: 'loaded', ratings })),
          catchError((error: unknown) => {
            const failure = saveFailureOf(error);
            return of<ListState>({ kind: 'failed', message: failure.kind === 'other' ? failure.message : 'Reload the page.' });
          }),
          startWith<ListState>({ kind: 'loading' }),
        ),
      ),
    ),
    { initialValue: { kind: 'loading' } as ListState },
  );

  protected readonly loading = computed(() => this.state().kind === 'loading');
  protected readonly failure = computed(() => {
    const state = this.state();
    return state.kind === 'failed' ? state.message : null;
  });

  protected readonly rows = computed(() => {
    const state = this.state();
    if (state.kind !== 'loaded') return [];
    return state.ratings.map((rating) => ({
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
