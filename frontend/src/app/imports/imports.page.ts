import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, DestroyRef, ElementRef, Injector, afterNextRender, computed, inject, signal, viewChild } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { ActivatedRoute, Router } from '@angular/router';
import { IMPORT_TEMPLATES, templatesUserMayImport, type ImportDetail, type ImportSummary } from '@spanledger/shared';
import { EMPTY, Observable, Subject, Subscription, catchError, map, of, switchMap, timer } from 'rxjs';

import { describeServerError, serverErrorReport } from '../server-errors/server-error';
import { SessionStore } from '../session/session.store';
import { saveFailureOf } from '../structures/field-problems';
import { ImportCheckComponent } from './import-check.component';
import { ImportHistoryComponent } from './import-history.component';
import { ImportTemplatesComponent } from './import-templates.component';
import { ImportUploadComponent } from './import-upload.component';
import { ImportsClient } from './imports.client';
import { stepFailureOf, type ImportStep } from './imports-text';

/** How often a running commit's progress is asked for. */
export const COMMIT_POLL_MS = 1000;

type Loaded<T> = { readonly kind: 'loading' } | { readonly kind: 'loaded'; readonly value: T } | { readonly kind: 'failed'; readonly message: string };

/**
 * Imports of spreadsheets: the templates to fill in, the upload and its check, the step that
 * commits a clean check (followed row by row while a large file is written) or sets it aside,
 * and the history. `/imports/:id` opens one import's check.
 */
@Component({
  selector: 'sl-imports-page',
  imports: [MatProgressBarModule, ImportTemplatesComponent, ImportUploadComponent, ImportCheckComponent, ImportHistoryComponent],
  templateUrl: './imports.page.html',
  styleUrls: ['../structures/inventory-table.scss', './imports.page.scss'],
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ImportsPage {
  private readonly client = inject(ImportsClient);
  private readonly router = inject(Router);
  private readonly session = inject(SessionStore);
  private readonly injector = inject(Injector);
  private readonly destroyRef = inject(DestroyRef);
  private readonly openedSection = viewChild<ElementRef<HTMLElement>>('openedSection');

  protected readonly importable = computed(() => templatesUserMayImport(this.session.user()));
  protected readonly mayImport = computed(() => this.importable().length > 0);
  protected readonly importableText = computed(() => {
    const titles = this.importable().map((template) => IMPORT_TEMPLATES[template].title.toLowerCase());
    return titles.length === 0 ? 'Your role imports no rows; the history is here to read.' : `Your role may import ${titles.join(', ')}.`;
  });

  private readonly history = signal<Loaded<readonly ImportSummary[]>>({ kind: 'loading' });
  /** The import the address names, null on `/imports`. */
  protected readonly openedId = signal<number | null>(null);
  protected readonly opened = signal<Loaded<ImportDetail> | null>(null);
  protected readonly busyStep = signal<ImportStep | null>(null);
  protected readonly stepFailure = signal<string | null>(null);
  protected readonly progressTrouble = signal<string | null>(null);

  private readonly historyLoads = new Subject<void>();
  private readonly importLoads = new Subject<number | null>();
  private polling: Subscription | null = null;
  private scrolledToId: number | null = null;

  protected readonly openedDetail = computed(() => {
    const opened = this.opened();
    return opened?.kind === 'loaded' ? opened.value : null;
  });
  protected readonly historyLoading = computed(() => this.history().kind === 'loading');
  protected readonly historyFailure = computed(() => {
    const history = this.history();
    return history.kind === 'failed' ? history.message : null;
  });
  /** The history, with the opened import as it was last read: a running commit's row follows it. */
  protected readonly historyRows = computed(() => {
    const history = this.history();
    if (history.kind !== 'loaded') return [];
    const detail = this.openedDetail();
    return detail ? history.value.map((each) => (each.id === detail.id ? detail : each)) : history.value;
  });

  constructor() {
    this.historyLoads
      .pipe(
        switchMap(() => loaded(this.client.fetchHistory(), 'The import history could not be loaded.')),
        takeUntilDestroyed(),
      )
      .subscribe((answer) => this.history.set(answer));
    this.importLoads
      .pipe(
        switchMap((id) => (id === null ? EMPTY : loaded(this.client.fetchImport(id), `Import ${id} could not be loaded.`))),
        takeUntilDestroyed(),
      )
      .subscribe((answer) => (answer.kind === 'loaded' ? this.show(answer.value) : this.opened.set(answer)));
    inject(ActivatedRoute)
      .paramMap.pipe(
        map((params) => params.get('id')),
        takeUntilDestroyed(),
      )
      .subscribe((id) => this.open(id));
    this.destroyRef.onDestroy(() => this.stopPolling());
    this.historyLoads.next();
  }

  protected reloadHistory(): void {
    this.historyLoads.next();
  }

  /** A fresh check: shown at once, kept in the history, and named by the address. */
  protected onChecked(detail: ImportDetail): void {
    this.stopPolling();
    this.clearStepMessages();
    // A load of another import still on its way would otherwise replace this one when it lands.
    this.importLoads.next(null);
    this.openedId.set(detail.id);
    this.show(detail);
    this.historyLoads.next();
    void this.router.navigate(['/imports', detail.id]);
  }

  protected commit(): void {
    const detail = this.openedDetail();
    if (detail) this.step('commit', this.client.commitImport(detail.id, detail.version));
  }

  protected discard(): void {
    const detail = this.openedDetail();
    if (detail) this.step('discard', this.client.discardImport(detail.id, detail.version));
  }

  private step(step: ImportStep, request: Observable<ImportDetail>): void {
    const importId = this.openedId();
    this.clearStepMessages();
    this.busyStep.set(step);
    request.pipe(takeUntilDestroyed(this.destroyRef)).subscribe({
      next: (detail) => {
        this.busyStep.set(null);
        // The user may have opened another import while the step was on its way.
        if (detail.id === this.openedId()) this.show(detail);
        this.historyLoads.next();
      },
      error: (error: unknown) => {
        this.busyStep.set(null);
        if (importId !== this.openedId()) return;
        const failure = stepFailureOf(error, step);
        this.stepFailure.set(failure.message);
        if (failure.current) this.show(failure.current);
      },
    });
  }

  private open(idText: string | null): void {
    this.stopPolling();
    this.clearStepMessages();
    if (idText === null) {
      this.openedId.set(null);
      this.opened.set(null);
      this.importLoads.next(null);
      return;
    }
    if (!/^[1-9]\d{0,9}$/.test(idText)) {
      this.openedId.set(null);
      this.importLoads.next(null);
      this.opened.set({ kind: 'failed', message: `"${idText}" is not an import id: the address should end in a number, such as /imports/12.` });
      return;
    }
    const id = Number(idText);
    this.openedId.set(id);
    const held = this.openedDetail();
    // Just checked and shown: the upload's answer is the import as it stands.
    if (held?.id === id) {
      this.show(held);
      return;
    }
    this.opened.set({ kind: 'loading' });
    this.importLoads.next(id);
  }

  private show(detail: ImportDetail): void {
    const wasCommitting = this.openedDetail()?.id === detail.id && this.openedDetail()?.state === 'committing';
    this.opened.set({ kind: 'loaded', value: detail });
    this.scrollToOpened(detail.id);
    if (detail.state === 'committing') {
      if (this.polling === null) this.followCommit(detail.id);
    } else if (wasCommitting) {
      this.historyLoads.next();
    }
  }

  /**
   * Asks for a running commit's progress a second after the last answer, never two at once, until
   * it is no longer committing. A failed ask is tried again while the server may recover (it could
   * not be reached, or failed itself); a refusal (the session ended, the import is gone) stops it.
   */
  private followCommit(importId: number): void {
    this.polling = timer(COMMIT_POLL_MS)
      .pipe(switchMap(() => this.client.fetchImport(importId, { quiet: true })))
      .subscribe({
        next: (detail) => {
          this.polling = null;
          this.progressTrouble.set(null);
          this.show(detail);
        },
        error: (error: unknown) => {
          this.polling = null;
          const refused = error instanceof HttpErrorResponse && error.status >= 400 && error.status < 500;
          const reason = error instanceof HttpErrorResponse ? describeServerError(serverErrorReport(error)) : String(error);
          if (refused) {
            this.progressTrouble.set(`The progress could not be read: ${reason} Reload the page to see where the import is.`);
            return;
          }
          this.progressTrouble.set(`The progress could not be read just now (${reason}); asking again. The import goes on meanwhile.`);
          this.followCommit(importId);
        },
      });
  }

  private stopPolling(): void {
    this.polling?.unsubscribe();
    this.polling = null;
    this.progressTrouble.set(null);
  }

  private clearStepMessages(): void {
    this.stepFailure.set(null);
  }

  /** An import opened from the history, or just checked, is brought into sight once. */
  private scrollToOpened(importId: number): void {
    if (this.scrolledToId === importId) return;
    this.scrolledToId = importId;
    afterNextRender(() => this.openedSection()?.nativeElement.scrollIntoView({ block: 'start', behavior: 'smooth' }), { injector: this.injector });
  }
}

function loaded<T>(answer$: Observable<T>, failure: string): Observable<Loaded<T>> {
  return answer$.pipe(
    map((value): Loaded<T> => ({ kind: 'loaded', value })),
    catchError((error: unknown) => {
      const saveFailure = saveFailureOf(error);
      return of<Loaded<T>>({ kind: 'failed', message: `${failure} ${saveFailure.kind === 'other' ? saveFailure.message : 'Reload the page.'}` });
    }),
  );
}
