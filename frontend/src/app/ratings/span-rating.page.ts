import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { ActivatedRoute, Router, RouterLink } from '@angular/router';
import { RATING_STATE_NAMES, RESULT_CAUTION, canInDistrict, type RatingDetail, type RatingRun, type RatingSetup } from '@spanledger/shared';
import { Observable, catchError, map, of } from 'rxjs';

import { SessionStore } from '../session/session.store';
import { saveFailureOf, type FieldProblem } from '../structures/field-problems';
import { choiceProblemText, RatingChoicesComponent } from './rating-choices.component';
import { RatingResultsComponent } from './rating-results.component';
import { momentText } from './rating-text';
import { RatingsClient, type RatingStep } from './ratings.client';

type Loaded<T> = { readonly ok: true; readonly value: T } | { readonly ok: false; readonly message: string };

const STEP_NAMES: Readonly<Record<RatingStep, string>> = { submit: 'submitted for review', approve: 'approved', return: 'returned' };

/**
 * The span rating page. At `/spans/:id/rate` a rating engineer chooses what to rate and runs a
 * new draft; at `/ratings/:id` anyone reads a record's results, its author runs it again or
 * submits it, and a reviewer (never its author) approves it or returns it with comments.
 */
@Component({
  selector: 'sl-span-rating-page',
  imports: [ReactiveFormsModule, RouterLink, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressBarModule, RatingChoicesComponent, RatingResultsComponent],
  templateUrl: './span-rating.page.html',
  styleUrl: './span-rating.page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SpanRatingPage {
  private readonly client = inject(RatingsClient);
  private readonly session = inject(SessionStore);
  private readonly router = inject(Router);
  private readonly formBuilder = inject(NonNullableFormBuilder);

  protected readonly caution = RESULT_CAUTION;
  protected readonly stateNames = RATING_STATE_NAMES;
  protected readonly moment = momentText;

  protected readonly setup = signal<RatingSetup | null>(null);
  protected readonly rating = signal<RatingDetail | null>(null);
  protected readonly loadError = signal<string | null>(null);
  protected readonly running = signal(false);
  protected readonly runProblems = signal<readonly string[]>([]);
  protected readonly stepping = signal<RatingStep | null>(null);
  protected readonly stepFailure = signal<string | null>(null);
  protected readonly conflict = signal(false);
  protected readonly notice = signal<string | null>(null);
  protected readonly stepForm = this.formBuilder.group({ comment: '' });

  protected readonly loading = computed(() => this.loadError() === null && this.setup() === null && this.rating() === null);

  protected readonly title = computed(() => {
    const rating = this.rating();
    if (rating) return { structureId: rating.structureId, structure: `${rating.structureNumber} ${rating.structureName}`, span: rating.spanIndex, district: rating.district };
    const setup = this.setup();
    return setup ? { structureId: setup.structureId, structure: `${setup.structureNumber} ${setup.structureName}`, span: setup.spanIndex, district: setup.district } : null;
  });

  /** A new rating: the user may rate in the span's district. */
  protected readonly canRunNew = computed(() => {
    const user = this.session.user();
    const setup = this.setup();
    return !this.rating() && !!user && !!setup && canInDistrict(user, 'runRatings', setup.district);
  });

  protected readonly recordFacts = computed(() => {
    const rating = this.rating();
    if (!rating) return [];
    const facts = [
      { key: 'run', label: 'Run', value: `${momentText(rating.created.at)} by ${rating.created.by ?? 'a data load'}` },
      { key: 'versions', label: 'Engine · policy', value: `${rating.engineVersion} · ${rating.policy.id} version ${rating.policy.version}` },
      { key: 'girders', label: 'Girders rated', value: String(rating.girderCount) },
    ];
    if (rating.submitted) facts.push({ key: 'submitted', label: 'Submitted', value: `${momentText(rating.submitted.at)} by ${rating.submitted.by ?? '—'}` });
    if (rating.reviewed) facts.push({ key: 'reviewed', label: rating.state === 'returned' ? 'Returned' : 'Reviewed', value: `${momentText(rating.reviewed.at)} by ${rating.reviewed.by ?? '—'}` });
    return facts;
  });

  constructor() {
    const route = inject(ActivatedRoute);
    const opens = route.snapshot.data['opens'] as 'span' | 'rating';
    route.paramMap.pipe(takeUntilDestroyed()).subscribe((params) => {
      const id = Number(params.get('id'));
      if (opens === 'span') this.openSpan(id);
      else this.openRating(id);
    });
  }

  private openSpan(spanId: number): void {
    this.rating.set(null);
    loaded(this.client.fetchSetup(spanId), 'The span could not be loaded.').subscribe((answer) => (answer.ok ? this.setup.set(answer.value) : this.loadError.set(answer.message)));
  }

  private openRating(ratingId: number): void {
    loaded(this.client.fetchRating(ratingId), 'The rating could not be loaded.').subscribe((answer) => {
      if (!answer.ok) return this.loadError.set(answer.message);
      this.showRating(answer.value);
    });
  }

  private showRating(rating: RatingDetail): void {
    this.rating.set(rating);
    this.conflict.set(false);
    // Running again needs the span's current findings and library, read afresh.
    if (rating.allowed.rerun) this.client.fetchSetup(rating.spanId).subscribe({ next: (setup) => this.setup.set(setup), error: () => this.setup.set(null) });
  }

  protected reload(): void {
    const rating = this.rating();
    if (rating) this.openRating(rating.id);
  }

  protected runNew(run: RatingRun): void {
    const setup = this.setup();
    if (!setup) return;
    this.afterRun(this.client.runRating(setup.spanId, run), (rating) => void this.router.navigate(['/ratings', rating.id], { replaceUrl: true }));
  }

  protected runAgain(run: RatingRun): void {
    const rating = this.rating();
    if (!rating) return;
    this.afterRun(this.client.runAgain(rating.id, run, rating.version), (again) => {
      this.showRating(again);
      this.notice.set('Run again with your choices.');
    });
  }

  private afterRun(answer$: Observable<RatingDetail>, done: (rating: RatingDetail) => void): void {
    this.running.set(true);
    this.runProblems.set([]);
    this.notice.set(null);
    answer$.subscribe({
      next: (rating) => {
        this.running.set(false);
        done(rating);
      },
      error: (error: unknown) => {
        this.running.set(false);
        const failure = saveFailureOf(error);
        if (failure.kind === 'conflict') this.conflict.set(true);
        else this.runProblems.set(failure.kind === 'fields' ? failure.problems.map((problem: FieldProblem) => choiceProblemText(problem)) : [failure.message]);
      },
    });
  }

  protected takeStep(step: RatingStep): void {
    const rating = this.rating();
    if (!rating) return;
    this.stepping.set(step);
    this.stepFailure.set(null);
    this.notice.set(null);
    this.client.takeStep(rating.id, step, rating.version, this.stepForm.controls.comment.value).subscribe({
      next: (after) => {
        this.stepping.set(null);
        this.stepForm.reset({ comment: '' });
        this.showRating(after);
        this.notice.set(`The rating was ${STEP_NAMES[step]}.`);
      },
      error: (error: unknown) => {
        this.stepping.set(null);
        const failure = saveFailureOf(error);
        if (failure.kind === 'conflict') this.conflict.set(true);
        else this.stepFailure.set(failure.kind === 'fields' ? failure.problems.map((problem) => (problem.field === 'comment' ? `Comment: ${problem.message}` : problem.message)).join('; ') : failure.message);
      },
    });
  }
}

function loaded<T>(answer$: Observable<T>, failure: string): Observable<Loaded<T>> {
  return answer$.pipe(
    map((value): Loaded<T> => ({ ok: true, value })),
    catchError((error: unknown) => {
      const reason = saveFailureOf(error);
      return of<Loaded<T>>({ ok: false, message: `${failure} ${reason.kind === 'other' ? reason.message : ''}`.trim() });
    }),
  );
}
