import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { RESULT_CAUTION, type PriorRatingSummary } from '@spanledger/shared';
import { catchError, map, of, startWith, switchMap } from 'rxjs';

import { saveFailureOf } from '../structures/field-problems';
import { ratingChangeText, ratingFactorText } from './rating-text';
import { PriorRatingsClient } from './structure-ratings-prior.client';

type ListState =
  | { readonly kind: 'loading' }
  | { readonly kind: 'loaded'; readonly ratings: readonly PriorRatingSummary[] }
  | { readonly kind: 'failed'; readonly message: string };

/** A prior rating's day of approval is a date, not a moment: read in UTC so no time zone moves it. */
const DAY_FORMAT = new Intl.DateTimeFormat('en', { dateStyle: 'medium', timeZone: 'UTC' });
const dayText = (isoDate: string) => DAY_FORMAT.format(new Date(`${isoDate}T00:00:00Z`));

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

  private readonly state = toSignal(
    toObservable(this.structureId).pipe(
      switchMap((structureId) =>
        this.client.fetchPriorRatings(structureId).pipe(
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
    return state.ratings.map((rating) => {
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
