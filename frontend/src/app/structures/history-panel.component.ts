import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, input, linkedSignal, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatPaginatorModule, PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { HistoryEvent, Page } from '@spanledger/shared';
import { catchError, map, of, startWith, switchMap } from 'rxjs';

import { describeServerError, serverErrorReport } from '../server-errors/server-error';
import { UnitsStore } from '../units/units.store';
import { HistoryClient } from './history.client';
import { describeFieldValue, fieldLabel } from './inventory-fields';

export const HISTORY_PAGE_SIZE = 20;

type HistoryState =
  | { readonly kind: 'loading' }
  | { readonly kind: 'loaded'; readonly page: Page<HistoryEvent> }
  | { readonly kind: 'failed'; readonly message: string };

/** The last word of an action such as `span.changed`, as people say it. */
const ACTION_VERBS: Readonly<Record<string, string>> = { changed: 'changed', created: 'added', deleted: 'removed' };

const WHEN_FORMAT = new Intl.DateTimeFormat('en', { dateStyle: 'medium', timeStyle: 'short' });

/**
 * What the history shows of an event of something recorded of the structure rather than part of
 * its inventory — an inspection, a finding, a rating, a rating on file — by its label; the rest
 * of such an event (ids, a rating's whole run) is for the record, not for reading here. A
 * position along the span reads as a span length does.
 */
const RECORDED_FIELDS: Readonly<Record<string, Readonly<Record<string, { readonly label: string; readonly readAs?: string }>>>> = {
  inspection: { inspectedOn: { label: 'Inspected on' }, kind: { label: 'Kind' }, state: { label: 'State' } },
  finding: {
    kind: { label: 'Kind' },
    severity: { label: 'Severity' },
    fromM: { label: 'From', readAs: 'lengthM' },
    toM: { label: 'To', readAs: 'lengthM' },
    note: { label: 'Note' },
  },
  rating: { state: { label: 'State' }, lowestLegalRf: { label: 'Lowest legal-load rating factor' }, lowestInventoryRf: { label: 'Lowest design-load inventory rating factor' }, comment: { label: 'Comment' } },
  'prior-rating': {
    approvedOn: { label: 'Approved on' },
    lowestLegalRf: { label: 'Lowest legal-load rating factor' },
    designInventoryRf: { label: 'Design-load inventory rating factor' },
    sourceNote: { label: 'Source' },
  },
};

/** A structure's history, newest first and paged: who changed what, each field from before to after. */
@Component({
  selector: 'sl-history-panel',
  imports: [MatPaginatorModule, MatProgressBarModule],
  templateUrl: './history-panel.component.html',
  styleUrl: './history-panel.component.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class HistoryPanelComponent {
  readonly structureId = input.required<number>();
  /** Bumped by the page after a save, so the new entry shows at once. */
  readonly refresh = input(0);

  private readonly client = inject(HistoryClient);
  private readonly units = inject(UnitsStore);
  protected readonly pageSize = signal(HISTORY_PAGE_SIZE);
  protected readonly pageIndex = signal(0);

  private readonly request = computed(() => ({
    structureId: this.structureId(),
    refresh: this.refresh(),
    limit: this.pageSize(),
    offset: this.pageIndex() * this.pageSize(),
  }));

  private readonly state = toSignal(
    toObservable(this.request).pipe(
      switchMap(({ structureId, limit, offset }) =>
        this.client.fetchStructureHistory(structureId, { limit, offset }).pipe(
          map((page): HistoryState => ({ kind: 'loaded', page })),
          catchError((error: unknown) => of<HistoryState>({ kind: 'failed', message: failureText(error) })),
          startWith<HistoryState>({ kind: 'loading' }),
        ),
      ),
    ),
    { initialValue: { kind: 'loading' } as HistoryState },
  );

  protected readonly loading = computed(() => this.state().kind === 'loading');
  protected readonly failure = computed(() => {
    const state = this.state();
    return state.kind === 'failed' ? state.message : null;
  });
  /** Kept while the next page loads, so the paginator does not jump. */
  private readonly lastPage = linkedSignal<HistoryState, Page<HistoryEvent> | null>({
    source: this.state,
    computation: (state, previous) => (state.kind === 'loaded' ? state.page : (previous?.value ?? null)),
  });
  protected readonly total = computed(() => this.lastPage()?.total ?? 0);

  protected readonly rows = computed(() => {
    const system = this.units.system();
    return (this.lastPage()?.items ?? []).map((event) => ({
      id: event.id,
      when: WHEN_FORMAT.format(new Date(event.occurredAt)),
      who: event.userName ?? 'Data load',
      what: `${event.subject} ${verbOf(event.action)}`,
      changes: readableChanges(event).map(({ change, label, readAs }) => ({
        field: change.field,
        label,
        before: describeFieldValue(readAs, change.before, system),
        after: describeFieldValue(readAs, change.after, system),
      })),
    }));
  });

  protected turnPage(page: PageEvent): void {
    this.pageSize.set(page.pageSize);
    this.pageIndex.set(page.pageIndex);
  }
}

/** The changes of an event as the history shows them: every inventory field, or the fields worth reading of something recorded. */
function readableChanges(event: HistoryEvent) {
  const recorded = RECORDED_FIELDS[event.entityType];
  if (!recorded) return event.changes.map((change) => ({ change, label: fieldLabel(change.field), readAs: change.field }));
  return event.changes.flatMap((change) => {
    const shown = recorded[change.field];
    return shown ? [{ change, label: shown.label, readAs: shown.readAs ?? change.field }] : [];
  });
}

function verbOf(action: string): string {
  const last = action.split('.').at(-1) ?? action;
  return ACTION_VERBS[last] ?? last.replaceAll('-', ' ');
}

function failureText(error: unknown): string {
  return error instanceof HttpErrorResponse ? describeServerError(serverErrorReport(error)) : String(error);
}
