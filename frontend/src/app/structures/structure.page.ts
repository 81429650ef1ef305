import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTabsModule } from '@angular/material/tabs';
import { ActivatedRoute } from '@angular/router';
import { RESULT_CAUTION, STRUCTURE_STATUS_NAMES, canInDistrict, type RatingOfRecordSummary, type SpanDetail, type StructureDetail } from '@spanledger/shared';
import { Observable, Subject, catchError, map, of, switchMap } from 'rxjs';

import { StructureInspectionsComponent } from '../inspections/structure-inspections.component';
import { dayText, ratingFactorText } from '../ratings/rating-text';
import { StructureRatingsComponent } from '../ratings/structure-ratings.component';
import { describeServerError, serverErrorReport } from '../server-errors/server-error';
import { SessionStore } from '../session/session.store';
import { HistoryPanelComponent } from './history-panel.component';
import { fieldLabel } from './inventory-fields';
import { InventoryClient } from './inventory.client';
import { LocationMapComponent } from './location-map.component';
import { SpansPanelComponent } from './spans-panel.component';
import { StructureFormComponent } from './structure-form.component';

const SAVED_NOTICE_MS = 4000;

type Loaded<T> = { readonly ok: true; readonly value: T } | { readonly ok: false; readonly message: string };

interface Fact {
  readonly key: string;
  readonly label: string;
  readonly value: string;
}

/** Dates without a time (condition ratings) are calendar days: read them in UTC so no time zone moves them. */
const DAY_FORMAT = new Intl.DateTimeFormat('en', { dateStyle: 'medium', timeZone: 'UTC' });
const MOMENT_FORMAT = new Intl.DateTimeFormat('en', { dateStyle: 'medium', timeStyle: 'short' });

/** When the rating of record was approved: the moment Spanledger approved it, or the day of a rating on file from before Spanledger. */
function approvalText({ approvedAt, approvedOn }: RatingOfRecordSummary): string {
  if (approvedOn) return `${dayText(approvedOn)} (on file from before Spanledger)`;
  return approvedAt === null ? '—' : MOMENT_FORMAT.format(new Date(approvedAt));
}
const COUNT_FORMAT = new Intl.NumberFormat('en');

/**
 * One structure: who and where it is, its condition, a small map, and tabs for its spans and
 * girders, inspections, ratings, postings and history; edit forms for those who may change it.
 */
@Component({
  selector: 'sl-structure-page',
  imports: [
    MatTabsModule,
    MatButtonModule,
    MatIconModule,
    MatProgressBarModule,
    LocationMapComponent,
    SpansPanelComponent,
    HistoryPanelComponent,
    StructureFormComponent,
    StructureInspectionsComponent,
    StructureRatingsComponent,
  ],
  templateUrl: './structure.page.html',
  styleUrl: './structure.page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StructurePage {
  private readonly client = inject(InventoryClient);
  private readonly session = inject(SessionStore);
  private readonly snackBar = inject(MatSnackBar);

  protected readonly caution = RESULT_CAUTION;
  protected readonly statusNames = STRUCTURE_STATUS_NAMES;

  protected readonly structureId = signal<number | null>(null);
  protected readonly structure = signal<StructureDetail | null>(null);
  protected readonly structureError = signal<string | null>(null);
  protected readonly spans = signal<readonly SpanDetail[] | null>(null);
  protected readonly spansError = signal<string | null>(null);
  protected readonly editing = signal(false);
  /** Bumped after every save so the History tab shows the new entry. */
  protected readonly historyRefresh = signal(0);

  private readonly structureLoads = new Subject<number>();
  private readonly spanLoads = new Subject<number>();

  protected readonly loading = computed(() => this.structure() === null && this.structureError() === null);

  /** Rater or manager within their districts (the server checks again on every change). */
  protected readonly canEdit = computed(() => {
    const user = this.session.user();
    const structure = this.structure();
    return !!user && !!structure && canInDistrict(user, 'editInventory', structure.district);
  });

  protected readonly facts = computed<readonly Fact[]>(() => {
    const structure = this.structure();
    if (!structure) return [];
    const { conditions } = structure;
    const fact = (key: string, value: string, label = fieldLabel(key)): Fact => ({ key, label, value });
    return [
      fact('routeCarried', structure.routeCarried),
      fact('featureCrossed', structure.featureCrossed),
      fact('district', structure.district),
      fact('yearBuilt', orDash(structure.yearBuilt)),
      fact('yearLastMajorWork', orDash(structure.yearLastMajorWork)),
      fact('adt', structure.adt === null ? '—' : `${COUNT_FORMAT.format(structure.adt)} vehicles a day`),
      fact('adtt', structure.adtt === null ? '—' : `${COUNT_FORMAT.format(structure.adtt)} trucks a day`),
      fact('skewDeg', `${structure.skewDeg}°`),
      fact('location', `${structure.latitude.toFixed(5)}°, ${structure.longitude.toFixed(5)}° (latitude, longitude)`, 'Location'),
      fact('deckCondition', orDash(conditions.deck)),
      fact('superstructureCondition', orDash(conditions.superstructure)),
      fact('substructureCondition', orDash(conditions.substructure)),
      fact('conditionRatedOn', conditions.ratedOn === null ? '—' : DAY_FORMAT.format(new Date(conditions.ratedOn))),
    ];
  });

  protected readonly lastChange = computed(() => {
    const structure = this.structure();
    if (!structure) return '';
    const { at, by } = structure.updated;
    return `Last changed ${MOMENT_FORMAT.format(new Date(at))} by ${by ?? 'a data load'}`;
  });

  /** The rating of record's headline figures, or null while the structure has none. */
  protected readonly ratingFacts = computed<readonly Fact[] | null>(() => {
    const rating = this.structure()?.ratingOfRecord ?? null;
    if (!rating) return null;
    return [
      { key: 'legalRatingFactor', label: 'Lowest legal-load rating factor', value: ratingFactorText(rating.lowestLegalRatingFactor) },
      { key: 'designInventoryRatingFactor', label: 'Design-load inventory rating factor', value: ratingFactorText(rating.designInventoryRatingFactor) },
      { key: 'approvedAt', label: 'Approved', value: approvalText(rating) },
    ];
  });

  constructor() {
    this.structureLoads
      .pipe(
        switchMap((id) => loaded(this.client.fetchStructure(id), 'The structure could not be loaded.')),
        takeUntilDestroyed(),
      )
      .subscribe((answer) => (answer.ok ? this.structure.set(answer.value) : this.structureError.set(answer.message)));
    this.spanLoads
      .pipe(
        switchMap((id) => loaded(this.client.fetchSpans(id), 'The spans could not be loaded.')),
        takeUntilDestroyed(),
      )
      .subscribe((answer) => (answer.ok ? this.spans.set(answer.value) : this.spansError.set(answer.message)));

    inject(ActivatedRoute)
      .paramMap.pipe(
        map((params) => params.get('id') ?? ''),
        takeUntilDestroyed(),
      )
      .subscribe((id) => this.open(id));
  }

  protected edit(): void {
    this.editing.set(true);
  }

  protected stopEditing(): void {
    this.editing.set(false);
  }

  protected onStructureSaved(structure: StructureDetail): void {
    this.structure.set(structure);
    this.editing.set(false);
    this.historyRefresh.update((count) => count + 1);
    this.snackBar.open(`Structure ${structure.structureNumber} saved.`, 'Dismiss', { duration: SAVED_NOTICE_MS });
  }

  protected onSpanSaved(span: SpanDetail): void {
    this.spans.update((spans) => spans?.map((each) => (each.id === span.id ? span : each)) ?? [span]);
    this.historyRefresh.update((count) => count + 1);
    this.snackBar.open(`Span ${span.spanIndex} saved.`, 'Dismiss', { duration: SAVED_NOTICE_MS });
  }

  /** After a conflict: the structure as it is now; the open form starts again from it. */
  protected reloadStructure(): void {
    const id = this.structureId();
    if (id !== null) this.structureLoads.next(id);
  }

  protected reloadSpans(): void {
    const id = this.structureId();
    if (id !== null) this.spanLoads.next(id);
  }

  private open(idText: string): void {
    this.structure.set(null);
    this.spans.set(null);
    this.spansError.set(null);
    this.editing.set(false);
    if (!/^[1-9]\d{0,9}$/.test(idText)) {
      this.structureId.set(null);
      this.structureError.set(`"${idText}" is not a structure id: the address should end in a number, such as /structures/12.`);
      return;
    }
    const id = Number(idText);
    this.structureError.set(null);
    this.structureId.set(id);
    this.structureLoads.next(id);
    this.spanLoads.next(id);
  }
}

function loaded<T>(answer$: Observable<T>, failure: string): Observable<Loaded<T>> {
  return answer$.pipe(
    map((value): Loaded<T> => ({ ok: true, value })),
    catchError((error: unknown) => {
      const reason = error instanceof HttpErrorResponse ? describeServerError(serverErrorReport(error)) : String(error);
      return of<Loaded<T>>({ ok: false, message: `${failure} ${reason}` });
    }),
  );
}

function orDash(value: number | null): string {
  return value === null ? '—' : String(value);
}
