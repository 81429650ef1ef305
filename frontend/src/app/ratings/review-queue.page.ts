import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { canInDistrict, type RatingSummary, type SignedInUser } from '@spanledger/shared';
import { catchError, map, of, startWith } from 'rxjs';

import { saveFailureOf } from '../structures/field-problems';
import { SessionStore } from '../session/session.store';
import { belowLegal, momentText, ratingFactorText } from './rating-text';
import { RatingsClient } from './ratings.client';

type QueueState =
  | { readonly kind: 'loading' }
  | { readonly kind: 'loaded'; readonly ratings: readonly RatingSummary[] }
  | { readonly kind: 'failed'; readonly message: string };

/** What the signed-in user may do with a waiting record: review it, leave it to another engineer (they ran it), or leave it to another district. */
type ReviewPart = 'reviewable' | 'own' | 'elsewhere';

const PART_ORDER: readonly ReviewPart[] = ['reviewable', 'own', 'elsewhere'];
const PART_TEXT: Readonly<Record<ReviewPart, string>> = {
  reviewable: 'Yours to review',
  own: 'You ran this: another engineer reviews it',
  elsewhere: 'Outside your districts',
};

/** The same rule the server applies on approve and return: within one's districts, and never one's own rating. */
function reviewPartOf(user: SignedInUser | null | undefined, rating: Pick<RatingSummary, 'district' | 'created'>): ReviewPart {
  if (user && rating.created.byUserId === user.id) return 'own';
  return user && canInDistrict(user, 'approveRatings', rating.district) ? 'reviewable' : 'elsewhere';
}

/**
 * The submitted ratings waiting for a reviewer. Those the user may approve or return come first;
 * within each group the oldest submission stays first, as the server sends them.
 */
@Component({
  selector: 'sl-review-queue-page',
  imports: [MatTableModule, MatIconModule, MatProgressBarModule, RouterLink],
  templateUrl: './review-queue.page.html',
  styleUrls: ['../structures/inventory-table.scss', './review-queue.page.scss'],
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReviewQueuePage {
  private readonly session = inject(SessionStore);

  protected readonly columns = ['structure', 'span', 'district', 'ranBy', 'submitted', 'legal', 'inventory', 'part', 'open'];

  private readonly state = toSignal(
    inject(RatingsClient)
      .fetchWaitingForReview()
      .pipe(
        map((ratings): QueueState => ({ kind: 'loaded', ratings })),
        catchError((error: unknown) => {
          const failure = saveFailureOf(error);
          return of<QueueState>({ kind: 'failed', message: failure.kind === 'other' ? failure.message : 'Reload the page.' });
        }),
        startWith<QueueState>({ kind: 'loading' }),
      ),
    { initialValue: { kind: 'loading' } as QueueState },
  );

  protected readonly loading = computed(() => this.state().kind === 'loading');
  protected readonly failure = computed(() => {
    const state = this.state();
    return state.kind === 'failed' ? state.message : null;
  });

  protected readonly rows = computed(() => {
    const state = this.state();
    if (state.kind !== 'loaded') return [];
    const user = this.session.user();
    const rows = state.ratings.map((rating) => {
      const part = reviewPartOf(user, rating);
      return {
        id: rating.id,
        structureId: rating.structureId,
        structure: `${rating.structureNumber} ${rating.structureName}`,
        span: `Span ${rating.spanIndex}`,
        hypothetical: rating.hypothetical,
        district: rating.district,
        ranBy: rating.created.by ?? 'Data load',
        submitted: rating.submitted ? momentText(rating.submitted.at) : '—',
        legal: ratingFactorText(rating.lowestLegalRf),
        legalBelowOne: belowLegal(rating),
        inventory: ratingFactorText(rating.lowestInventoryRf),
        part,
        partText: PART_TEXT[part],
      };
    });
    // Array.prototype.sort is stable, so the server's oldest-first order holds within each group.
    return rows.sort((a, b) => PART_ORDER.indexOf(a.part) - PART_ORDER.indexOf(b.part));
  });

  protected readonly summary = computed(() => {
    const rows = this.rows();
    const yours = rows.filter((row) => row.part === 'reviewable').length;
    const waiting = rows.length === 1 ? '1 rating is waiting' : `${rows.length} ratings are waiting`;
    return `${waiting}; ${yours === 0 ? 'none' : yours} for you to review.`;
  });
}
