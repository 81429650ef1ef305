import { BreakpointObserver } from '@angular/cdk/layout';
import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { ActivatedRoute, Router } from '@angular/router';
import { BoundingBox, RatingBasis, StructureFeatureCollection, StructureSummary } from '@spanledger/shared';
import {
  EMPTY,
  Observable,
  Subject,
  catchError,
  combineLatest,
  concat,
  debounceTime,
  distinctUntilChanged,
  filter,
  map,
  of,
  scan,
  startWith,
  switchMap,
} from 'rxjs';

import { describeServerError, serverErrorReport } from '../server-errors/server-error';
import { MapFilters, filtersFromQueryParams, filtersQueryParams, hasActiveFilters, sameFilters, sameStructureQuery } from './map-filters';
import { MapFiltersComponent } from './map-filters.component';
import { MapLegendComponent } from './map-legend.component';
import { StructureCardComponent } from './structure-card.component';
import { StructureListComponent } from './structure-list.component';
import { StructureMapComponent } from './structure-map.component';
import { StructuresClient } from './structures.client';

/** Waits for the map to settle before asking for what is in view. */
export const VIEW_CHANGE_DEBOUNCE_MS = 250;
/** Below this width the panel lies over the map; it must match the media query in the page styles. */
const NARROW_SCREEN = '(max-width: 720px)';

type StructuresEvent =
  | { readonly kind: 'loading' }
  | { readonly kind: 'network-loaded'; readonly network: StructureFeatureCollection }
  /** Nothing filters and the view holds the whole network (or the map has not moved yet): the network is the answer. */
  | { readonly kind: 'network-shown' }
  | { readonly kind: 'loaded'; readonly answer: StructureFeatureCollection }
  | { readonly kind: 'failed'; readonly message: string };

interface StructuresInView {
  readonly loading: boolean;
  /** What the map and the list show: the structures in view that match the filters. */
  readonly answer: StructureFeatureCollection | null;
  readonly errorMessage: string | null;
  /** The whole network, unfiltered, once: the map frames itself around it and it counts the network. */
  readonly network: StructureFeatureCollection | null;
}

const NOTHING_LOADED: StructuresInView = { loading: true, answer: null, errorMessage: null, network: null };

interface DistrictChoice {
  readonly names: readonly string[];
  readonly unavailable: boolean;
}

/**
 * Home page: the map of the network with its legend, the filters and the list of the structures
 * in view beside it, and a card for the structure picked. The filters live in the URL.
 */
@Component({
  selector: 'sl-network-map-page',
  imports: [
    StructureMapComponent,
    StructureListComponent,
    MapFiltersComponent,
    MapLegendComponent,
    StructureCardComponent,
    MatProgressBarModule,
    MatButtonModule,
    MatIconModule,
  ],
  templateUrl: './network-map.page.html',
  styleUrl: './network-map.page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NetworkMapPage {
  private readonly structuresClient = inject(StructuresClient);
  private readonly router = inject(Router);
  private readonly route = inject(ActivatedRoute);
  private readonly viewChanges = new Subject<BoundingBox>();

  private readonly filters$: Observable<MapFilters> = this.route.queryParamMap.pipe(
    map(filtersFromQueryParams),
    distinctUntilChanged(sameFilters),
  );
  protected readonly filters = toSignal(this.filters$, { requireSync: true });

  /** The whole network as first loaded, once it has arrived. */
  private network: StructureFeatureCollection | null = null;

  // The whole network first; map moves made before it arrives are dropped, since the map is about to be framed anyway.
  private readonly structuresInView$: Observable<StructuresInView> = concat(
    this.request(this.structuresClient.fetchNetwork(), (network) => {
      this.network = network;
      return { kind: 'network-loaded', network };
    }),
    combineLatest([
      this.filters$.pipe(distinctUntilChanged(sameStructureQuery)),
      this.viewChanges.pipe(debounceTime(VIEW_CHANGE_DEBOUNCE_MS), startWith(null)),
    ]).pipe(switchMap(([filters, view]) => this.structuresMatching(filters, view))),
  ).pipe(scan(nextState, NOTHING_LOADED));

  private readonly state = toSignal(this.structuresInView$, { initialValue: NOTHING_LOADED });

  private readonly districtChoice = toSignal(
    this.structuresClient.fetchDistricts().pipe(
      map((names): DistrictChoice => ({ names, unavailable: false })),
      catchError(() => of<DistrictChoice>({ names: [], unavailable: true })),
    ),
    { initialValue: { names: [], unavailable: false } },
  );

  protected readonly loading = computed(() => this.state().loading);
  protected readonly errorMessage = computed(() => this.state().errorMessage);
  private readonly networkStructures = computed(() => this.state().network?.features ?? null);

  /**
   * The structures of the whole network that a new search finds: what is searched for may lie
   * outside the view, so the map frames itself around them, and the list then shows them in view.
   * A search that finds nothing, or clearing it, leaves the view where it is.
   */
  private readonly searchFound = toSignal(
    this.filters$.pipe(
      distinctUntilChanged((a, b) => a.search.trim() === b.search.trim()),
      filter((filters) => filters.search.trim() !== ''),
      switchMap((filters) =>
        this.structuresClient.fetchMatching(filters, null).pipe(
          map((answer) => answer.features),
          // The list says why nothing came: its own question is the same one, within the view.
          catchError(() => EMPTY),
        ),
      ),
      filter((found) => found.length > 0),
    ),
    { initialValue: null },
  );
  /** What the map frames itself around: the network once it arrives, then each search's finds. */
  protected readonly framedStructures = computed(() => this.searchFound() ?? this.networkStructures());
  protected readonly networkTotal = computed(() => this.state().network?.total ?? null);
  protected readonly structures = computed(() => this.state().answer?.features ?? []);
  protected readonly summaries = computed(() => this.structures().map((structure) => structure.properties));
  protected readonly truncated = computed(() => this.state().answer?.truncated ?? false);
  protected readonly matchingTotal = computed(() => this.state().answer?.total ?? 0);
  protected readonly filtered = computed(() => hasActiveFilters(this.filters()));
  protected readonly districts = computed(() => this.districtChoice().names);
  protected readonly districtsUnavailable = computed(() => this.districtChoice().unavailable);
  /** The structure on the card; kept when it leaves the view, since the user picked it. */
  protected readonly selected = signal<StructureSummary | null>(null);
  protected readonly selectedId = computed(() => this.selected()?.id ?? null);
  /** On narrow screens the list folds away, and starts folded, to leave the map the whole width. */
  protected readonly panelOpen = signal(!inject(BreakpointObserver).isMatched(NARROW_SCREEN));

  protected onViewChanged(view: BoundingBox): void {
    this.viewChanges.next(view);
  }

  protected select(id: number): void {
    this.selected.set(this.summaries().find((structure) => structure.id === id) ?? null);
  }

  protected closeCard(): void {
    this.selected.set(null);
  }

  protected togglePanel(): void {
    this.panelOpen.update((open) => !open);
  }

  /** Puts the filters into the URL (replacing the entry, so Back leaves the map); the URL drives the rest. */
  protected applyFilters(filters: MapFilters): void {
    void this.router.navigate([], {
      relativeTo: this.route,
      queryParams: filtersQueryParams(filters),
      queryParamsHandling: 'merge',
      replaceUrl: true,
    });
  }

  protected colourBy(ratingBasis: RatingBasis): void {
    this.applyFilters({ ...this.filters(), ratingBasis });
  }

  private structuresMatching(filters: MapFilters, view: BoundingBox | null): Observable<StructuresEvent> {
    // Framing the map around the network moves it to a view holding all of it: asking again would fetch the same answer.
    const wholeNetworkInView = view === null || (this.network !== null && holdsWholeNetwork(view, this.network));
    if (wholeNetworkInView && !hasActiveFilters(filters)) return of<StructuresEvent>({ kind: 'network-shown' });
    return this.request(this.structuresClient.fetchMatching(filters, view), (answer) => ({ kind: 'loaded', answer }));
  }

  private request(
    answer$: Observable<StructureFeatureCollection>,
    loaded: (answer: StructureFeatureCollection) => StructuresEvent,
  ): Observable<StructuresEvent> {
    return answer$.pipe(
      map(loaded),
      catchError((error: unknown) => of<StructuresEvent>({ kind: 'failed', message: failureMessage(error) })),
      startWith<StructuresEvent>({ kind: 'loading' }),
    );
  }
}

function nextState(state: StructuresInView, event: StructuresEvent): StructuresInView {
  switch (event.kind) {
    case 'loading':
      return { ...state, loading: true };
    case 'network-loaded':
      return { ...state, loading: false, errorMessage: null, network: event.network };
    case 'network-shown':
      return state.network === null ? state : { ...state, loading: false, answer: state.network };
    case 'loaded':
      return { ...state, loading: false, answer: event.answer, errorMessage: null };
    case 'failed':
      return { ...state, loading: false, errorMessage: event.message };
  }
}

/** Whether every structure of a complete network lies in the view (edges included, as the server's bounding box test). */
function holdsWholeNetwork(view: BoundingBox, network: StructureFeatureCollection): boolean {
  if (network.truncated) return false;
  return network.features.every(({ geometry: { coordinates: [lon, lat] } }) => {
    return lon !== undefined && lat !== undefined && lon >= view.minLon && lon <= view.maxLon && lat >= view.minLat && lat <= view.maxLat;
  });
}

function failureMessage(error: unknown): string {
  const reason = error instanceof HttpErrorResponse ? describeServerError(serverErrorReport(error)) : String(error);
  return `The structures could not be loaded. ${reason}`;
}
