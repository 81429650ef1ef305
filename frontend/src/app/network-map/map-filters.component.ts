import { ChangeDetectionStrategy, Component, computed, effect, input, output, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { AbstractControl, FormControl, FormGroup, ReactiveFormsModule, ValidationErrors } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatChipsModule } from '@angular/material/chips';
import { ErrorStateMatcher } from '@angular/material/core';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import {
  RATING_BANDS,
  RatingBandKey,
  STRUCTURE_STATUSES,
  STRUCTURE_STATUS_NAMES,
  StructureStatus,
  structureListQuery,
} from '@spanledger/shared';
import { debounceTime, merge } from 'rxjs';

import { MapFilters, clearedFilters, hasActiveFilters, sameFilters } from './map-filters';
import { MarkerLook } from './marker-look';
import { STATUS_MARKER_SHAPES } from './marker-shapes';
import { MarkerSymbolComponent } from './marker-symbol.component';
import { RATING_BASIS_NAMES } from './rating-colour-scale';

/** Waits for a pause in typing before searching. */
export const SEARCH_DEBOUNCE_MS = 300;

/** Condition ratings run 0 (failed) to 9 (excellent). */
const CONDITION_RATINGS = [0, 1, 2, 3, 4, 5, 6, 7, 8, 9] as const;
const STATUS_SYMBOL_FILL = '#ffffff';

/** The server's own rule for the search text, so the message here is the one it would give. */
function searchProblem(text: string): string | null {
  const parsed = structureListQuery.shape.search.safeParse(text);
  return parsed.success ? null : (parsed.error.issues[0]?.message ?? 'is not valid');
}

function validSearch(control: AbstractControl<string>): ValidationErrors | null {
  const problem = searchProblem(control.value);
  return problem === null ? null : { search: problem };
}

/** Shows a bad search as it is typed, not only once the field loses focus. */
const WHILE_TYPING: ErrorStateMatcher = { isErrorState: (control) => !!control && control.invalid && control.dirty };

function sameList<T>(a: readonly T[], b: readonly T[]): boolean {
  return a.length === b.length && a.every((item, index) => item === b[index]);
}

/**
 * The filters of the side panel: search, district, rating band, lowest condition and status.
 * Shows the filters it is given and asks for new ones; the page keeps them in the URL.
 */
@Component({
  selector: 'sl-map-filters',
  imports: [
    ReactiveFormsModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    MatCheckboxModule,
    MatChipsModule,
    MatButtonModule,
    MatIconModule,
    MarkerSymbolComponent,
  ],
  templateUrl: './map-filters.component.html',
  styleUrl: './map-filters.component.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MapFiltersComponent {
  readonly filters = input.required<MapFilters>();
  /** The network's districts to choose from. */
  readonly districts = input.required<readonly string[]>();
  /** True when the district list could not be loaded. */
  readonly districtsUnavailable = input(false);
  readonly filtersChange = output<MapFilters>();

  protected readonly form = new FormGroup({
    search: new FormControl('', { nonNullable: true, validators: [validSearch] }),
    districts: new FormControl<string[]>([], { nonNullable: true }),
    ratingBands: new FormControl<RatingBandKey[]>([], { nonNullable: true }),
    conditionAtMost: new FormControl<number | null>(null),
    statuses: new FormControl<StructureStatus[]>([], { nonNullable: true }),
    reratingDue: new FormControl(false, { nonNullable: true }),
  });

  protected readonly whileTyping = WHILE_TYPING;
  protected readonly conditionRatings = CONDITION_RATINGS;
  protected readonly ratingBands = RATING_BANDS;
  protected readonly statuses: readonly { readonly key: StructureStatus; readonly label: string; readonly look: MarkerLook }[] =
    STRUCTURE_STATUSES.map((status) => ({
      key: status,
      label: STRUCTURE_STATUS_NAMES[status],
      look: { shape: STATUS_MARKER_SHAPES[status], fillColor: STATUS_SYMBOL_FILL, belowOne: false, selected: false },
    }));

  private readonly searchText = signal('');
  protected readonly searchError = computed(() => searchProblem(this.searchText()));
  protected readonly ratingBandLabel = computed(() => `Rating band (${RATING_BASIS_NAMES[this.filters().ratingBasis].toLowerCase()})`);
  /** The network's districts, and any district a shared link names that the list lacks, so it can be unticked. */
  protected readonly districtOptions = computed(() => {
    const chosen = this.filters().districts.filter((district) => !this.districts().includes(district));
    return [...this.districts(), ...chosen];
  });
  protected readonly anythingToClear = computed(() => hasActiveFilters(this.filters()) || this.searchText().trim() !== '');

  constructor() {
    effect(() => this.showFilters(this.filters()));
    const controls = this.form.controls;
    controls.search.valueChanges.pipe(takeUntilDestroyed()).subscribe((text) => this.searchText.set(text));
    merge(
      controls.search.valueChanges.pipe(debounceTime(SEARCH_DEBOUNCE_MS)),
      controls.districts.valueChanges,
      controls.ratingBands.valueChanges,
      controls.conditionAtMost.valueChanges,
      controls.statuses.valueChanges,
      controls.reratingDue.valueChanges,
    )
      .pipe(takeUntilDestroyed())
      .subscribe(() => this.askForFormFilters());
  }

  protected clear(): void {
    const cleared = clearedFilters(this.filters());
    this.showFilters(cleared);
    if (!sameFilters(cleared, this.filters())) this.filtersChange.emit(cleared);
  }

  /** Puts filters into the form without echoing them back as a change. */
  private showFilters(filters: MapFilters): void {
    const shown = this.form.getRawValue();
    // Text typed since the last search went out may differ by spaces at its ends only: leave it as typed.
    const search = shown.search.trim() === filters.search ? shown.search : filters.search;
    this.form.setValue(
      {
        search,
        districts: sameList(shown.districts, filters.districts) ? shown.districts : [...filters.districts],
        ratingBands: sameList(shown.ratingBands, filters.ratingBands) ? shown.ratingBands : [...filters.ratingBands],
        conditionAtMost: filters.conditionAtMost,
        statuses: sameList(shown.statuses, filters.statuses) ? shown.statuses : [...filters.statuses],
        reratingDue: filters.reratingDue,
      },
      { emitEvent: false },
    );
    this.searchText.set(search);
  }

  private askForFormFilters(): void {
    if (this.form.invalid) return;
    const { search, districts, ratingBands, conditionAtMost, statuses, reratingDue } = this.form.getRawValue();
    const next: MapFilters = { districts, ratingBands, conditionAtMost, statuses, reratingDue, search: search.trim(), ratingBasis: this.filters().ratingBasis };
    if (!sameFilters(next, this.filters())) this.filtersChange.emit(next);
  }
}
