import { BreakpointObserver } from '@angular/cdk/layout';
import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { BoundingBox, StructureFeature, StructureFeatureCollection } from '@spanledger/shared';
import { Observable, Subject, catchError, concat, debounceTime, map, of, scan, startWith, switchMap } from 'rxjs';

import { describeServerError, serverErrorReport } from '../server-errors/server-error';
import { StructureListComponent } from './structure-list.component';
import { StructureMapComponent } from './structure-map.component';
import { StructuresClient } from './structures.client';

/** Waits for the map to settle before asking for what is in view. */
export const VIEW_CHANGE_DEBOUNCE_MS = 250;
/** Below this width the panel lies over the map; it must match the media query in the page styles. */
const NARROW_SCREEN = '(max-width: 720px)';

type StructuresEvent =
  | { readonly kind: 'loading' }
  | { readonly kind: 'loaded'; readonly answer: StructureFeatureCollection; readonly wholeNetwork: boolean }
  | { readonly kind: 'failed'; readonly message: string };

interface StructuresInView {
  readonly loading: boolean;
  readonly answer: StructureFeatureCollection | null;
  readonly errorMessage: string | null;
  /** The whole network's structures, once: the map frames itself around them on first load. */
  readonly networkStructures: readonly StructureFeature[] | null;
}

const NOTHING_LOADED: StructuresInView = { loading: true, answer: null, errorMessage: null, networkStructures: null };

/** Home page: the map of the network with the list of the structures in view beside it. */
@Component({
  selector: 'sl-network-map-page',
  imports: [StructureMapComponent, StructureListComponent, MatProgressBarModule, MatButtonModule, MatIconModule],
  templateUrl: './network-map.page.html',
  styleUrl: './network-map.page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NetworkMapPage {
  private readonly structuresClient = inject(StructuresClient);
  private readonly viewChanges = new Subject<BoundingBox>();

  // The whole network first; map moves made before it arrives are dropped, since the map is about to be framed anyway.
  private readonly structuresInView$: Observable<StructuresInView> = concat(
    this.request(this.structuresClient.fetchNetwork(), true),
    this.viewChanges.pipe(
      debounceTime(VIEW_CHANGE_DEBOUNCE_MS),
      switchMap((view) => this.request(this.structuresClient.fetchInBox(view), false)),
    ),
  ).pipe(scan(nextState, NOTHING_LOADED));

  private readonly state = toSignal(this.structuresInView$, { initialValue: NOTHING_LOADED });

  protected readonly loading = computed(() => this.state().loading);
  protected readonly errorMessage = computed(() => this.state().errorMessage);
  protected readonly networkStructures = computed(() => this.state().networkStructures);
  protected readonly structures = computed(() => this.state().answer?.features ?? []);
  protected readonly summaries = computed(() => this.structures().map((structure) => structure.properties));
  protected readonly truncated = computed(() => this.state().answer?.truncated ?? false);
  protected readonly selectedId = signal<number | null>(null);
  /** On narrow screens the list folds away, and starts folded, to leave the map the whole width. */
  protected readonly panelOpen = signal(!inject(BreakpointObserver).isMatched(NARROW_SCREEN));

  protected onViewChanged(view: BoundingBox): void {
    this.viewChanges.next(view);
  }

  protected select(id: number): void {
    this.selectedId.set(id);
  }

  protected togglePanel(): void {
    this.panelOpen.update((open) => !open);
  }

  private request(answer$: Observable<StructureFeatureCollection>, wholeNetwork: boolean): Observable<StructuresEvent> {
    return answer$.pipe(
      map((answer): StructuresEvent => ({ kind: 'loaded', answer, wholeNetwork })),
      catchError((error: unknown) => of<StructuresEvent>({ kind: 'failed', message: failureMessage(error) })),
      startWith<StructuresEvent>({ kind: 'loading' }),
    );
  }
}

function nextState(state: StructuresInView, event: StructuresEvent): StructuresInView {
  switch (event.kind) {
    case 'loading':
      return { ...state, loading: true };
    case 'loaded':
      return {
        loading: false,
        answer: event.answer,
        errorMessage: null,
        networkStructures: event.wholeNetwork ? event.answer.features : state.networkStructures,
      };
    case 'failed':
      return { ...state, loading: false, errorMessage: event.message };
  }
}

function failureMessage(error: unknown): string {
  const reason = error instanceof HttpErrorResponse ? describeServerError(serverErrorReport(error)) : String(error);
  return `The structures could not be loaded. ${reason}`;
}
