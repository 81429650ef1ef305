import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { ActivatedRoute, RouterLink } from '@angular/router';
import {
  FINDING_KIND_NAMES,
  INSPECTION_KIND_NAMES,
  INSPECTION_STATE_NAMES,
  canInDistrict,
  findingChange,
  inspectionReturn,
  type FindingDetail,
  type InspectionDetail,
  type PhotoSummary,
  type SpanDetail,
} from '@spanledger/shared';
import { Observable, Subject, catchError, map, of, switchMap } from 'rxjs';

import { describeServerError, serverErrorReport } from '../server-errors/server-error';
import { SessionStore } from '../session/session.store';
import { FieldProblem, PROBLEM, placeProblems, saveFailureOf, schemaProblems } from '../structures/field-problems';
import { InventoryClient } from '../structures/inventory.client';
import { FindingFormComponent } from './finding-form.component';
import { DispositionChoice, FindingsListComponent } from './findings-list.component';
import { InspectionDetailsFormComponent } from './inspection-details-form.component';
import { inspectionDay, inspectionFieldLabel } from './inspection-text';
import { InspectionsClient } from './inspections.client';
import { PhotosComponent } from './photos.component';
import { PhotosClient } from './photos.client';

const NOTICE_MS = 5000;
const MOMENT_FORMAT = new Intl.DateTimeFormat('en', { dateStyle: 'medium', timeStyle: 'short' });

type Loaded<T> = { readonly ok: true; readonly value: T } | { readonly ok: false; readonly message: string };

/** The finding form while open: a new finding (id null), a change, or the growth of a carried-forward finding. */
interface FindingEditor {
  readonly findingId: number | null;
  readonly disposition: 'grown' | null;
}

interface Fact {
  readonly key: string;
  readonly label: string;
  readonly value: string;
}

/** A finding still to review cannot be submitted: the same words whether the browser or the server says it. */
const TO_REVIEW_MESSAGE = 'still to review: confirm it, record its growth, or mark it repaired';

/**
 * One field inspection, built for a tablet held in one hand: the header, the condition ratings
 * and notes (editable by its author while a draft or returned), the findings by span and girder
 * with the ones carried forward asking to be reviewed, photos, and the step to submit; raters
 * and managers of the district accept a submitted inspection or return it with a comment.
 */
@Component({
  selector: 'sl-inspection-page',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatIconModule,
    MatFormFieldModule,
    MatInputModule,
    MatProgressBarModule,
    InspectionDetailsFormComponent,
    FindingsListComponent,
    FindingFormComponent,
    PhotosComponent,
  ],
  templateUrl: './inspection.page.html',
  styleUrls: ['./inspection-forms.scss', './inspection.page.scss'],
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class InspectionPage {
  private readonly client = inject(InspectionsClient);
  private readonly photosClient = inject(PhotosClient);
  private readonly inventory = inject(InventoryClient);
  private readonly session = inject(SessionStore);
  private readonly snackBar = inject(MatSnackBar);
  private readonly formBuilder = inject(NonNullableFormBuilder);

  protected readonly kindNames = INSPECTION_KIND_NAMES;
  protected readonly stateNames = INSPECTION_STATE_NAMES;
  protected readonly problem = PROBLEM;
  protected readonly day = inspectionDay;

  protected readonly inspectionId = signal<number | null>(null);
  protected readonly inspection = signal<InspectionDetail | null>(null);
  protected readonly loadError = signal<string | null>(null);
  protected readonly spans = signal<readonly SpanDetail[] | null>(null);
  protected readonly spansError = signal<string | null>(null);
  protected readonly photos = signal<readonly PhotoSummary[]>([]);
  protected readonly editor = signal<FindingEditor | null>(null);
  protected readonly busyFindingId = signal<number | null>(null);
  protected readonly stepping = signal(false);
  protected readonly returning = signal(false);
  protected readonly conflict = signal(false);
  protected readonly actionFailure = signal<string | null>(null);
  protected readonly submitProblems = signal<readonly FieldProblem[]>([]);
  protected readonly returnForm = this.formBuilder.group({ comment: '' });

  private readonly inspectionLoads = new Subject<number>();
  private readonly photoLoads = new Subject<number>();
  private loadedStructureId: number | null = null;

  protected readonly loading = computed(() => this.inspection() === null && this.loadError() === null);

  private readonly isAuthor = computed(() => {
    const user = this.session.user();
    const inspection = this.inspection();
    return !!user && !!inspection && user.id === inspection.inspectorId && canInDistrict(user, 'editOwnInspections', inspection.district);
  });
  /** Only its inspector changes an inspection, and only until it is submitted (or after it comes back). */
  protected readonly editable = computed(() => {
    const state = this.inspection()?.state;
    return this.isAuthor() && (state === 'draft' || state === 'returned');
  });
  protected readonly canReview = computed(() => {
    const user = this.session.user();
    const inspection = this.inspection();
    return !!user && inspection?.state === 'submitted' && canInDistrict(user, 'reviewInspections', inspection.district);
  });

  protected readonly findings = computed(() => this.inspection()?.findings ?? []);
  protected readonly toReviewCount = computed(() => this.findings().filter((finding) => finding.disposition === 'to-review').length);
  protected readonly inspectionPhotos = computed(() => this.photos().filter((photo) => photo.findingId === null));

  /** The finding the form is open for, read afresh from the inspection after every reload. */
  protected readonly editorFinding = computed(() => {
    const editor = this.editor();
    return editor?.findingId == null ? null : (this.findings().find((finding) => finding.id === editor.findingId) ?? null);
  });

  /** Problems that name a finding (`findings.<index>.disposition`), by finding id, for its row. */
  protected readonly findingProblems = computed<ReadonlyMap<number, string>>(() => {
    const byId = new Map<number, string>();
    for (const { finding, message } of this.namedFindingProblems()) byId.set(finding.id, byId.has(finding.id) ? `${byId.get(finding.id)}; ${message}` : message);
    return byId;
  });
  protected readonly submitProblemTexts = computed(() => {
    const named = this.namedFindingProblems();
    const others = this.submitProblems().filter((problem) => !named.some((each) => each.problem === problem));
    return [
      ...named.map(({ finding, message }) => `Span ${finding.spanIndex} · Girder ${finding.girderNumber}, ${FINDING_KIND_NAMES[finding.kind].toLowerCase()}: ${message}`),
      ...others.map((problem) => `${inspectionFieldLabel(problem.field)}: ${problem.message}`),
    ];
  });

  protected readonly facts = computed<readonly Fact[]>(() => {
    const inspection = this.inspection();
    if (!inspection) return [];
    const rating = (value: number | null) => (value === null ? 'Not rated' : String(value));
    const facts: Fact[] = [
      { key: 'deckCondition', label: 'Deck condition', value: rating(inspection.conditions.deck) },
      { key: 'superstructureCondition', label: 'Superstructure condition', value: rating(inspection.conditions.superstructure) },
      { key: 'substructureCondition', label: 'Substructure condition', value: rating(inspection.conditions.substructure) },
    ];
    if (inspection.submittedAt) facts.push({ key: 'submittedAt', label: 'Submitted', value: MOMENT_FORMAT.format(new Date(inspection.submittedAt)) });
    if (inspection.reviewed) facts.push({ key: 'reviewed', label: inspection.state === 'accepted' ? 'Accepted' : 'Reviewed', value: `${MOMENT_FORMAT.format(new Date(inspection.reviewed.at))} by ${inspection.reviewed.by ?? 'the system'}` });
    return facts;
  });

  constructor() {
    this.inspectionLoads
      .pipe(
        switchMap((id) => loaded(this.client.fetchInspection(id), 'The inspection could not be loaded.')),
        takeUntilDestroyed(),
      )
      .subscribe((answer) => (answer.ok ? this.show(answer.value) : this.loadError.set(answer.message)));
    this.photoLoads
      .pipe(
        switchMap((id) => this.photosClient.fetchPhotos(id).pipe(catchError(() => of(null)))),
        takeUntilDestroyed(),
      )
      .subscribe((photos) => {
        if (photos) this.photos.set(photos);
      });

    inject(ActivatedRoute)
      .paramMap.pipe(
        map((params) => params.get('id') ?? ''),
        takeUntilDestroyed(),
      )
      .subscribe((id) => this.open(id));
  }

  protected reload(): void {
    const id = this.inspectionId();
    if (id !== null) this.inspectionLoads.next(id);
  }

  protected reloadPhotos(): void {
    const id = this.inspectionId();
    if (id !== null) this.photoLoads.next(id);
  }

  protected onDetailsSaved(inspection: InspectionDetail): void {
    this.inspection.set(inspection);
    this.snackBar.open('Inspection details saved.', 'Dismiss', { duration: NOTICE_MS });
  }

  protected addFinding(): void {
    this.clearMessages();
    this.editor.set({ findingId: null, disposition: null });
  }

  protected changeFinding(finding: FindingDetail): void {
    this.clearMessages();
    this.editor.set({ findingId: finding.id, disposition: null });
  }

  protected recordGrowth(finding: FindingDetail): void {
    this.clearMessages();
    this.editor.set({ findingId: finding.id, disposition: 'grown' });
  }

  protected closeEditor(): void {
    this.editor.set(null);
  }

  protected onFindingSaved(): void {
    this.editor.set(null);
    this.snackBar.open('Finding saved.', 'Dismiss', { duration: NOTICE_MS });
    this.reload();
  }

  /** Confirmed as before, or repaired: the finding is sent whole, as it stands, with its new disposition. */
  protected chooseDisposition({ finding, disposition }: DispositionChoice): void {
    this.clearMessages();
    const checked = findingChange.safeParse({ ...changeFieldsOf(finding), disposition });
    if (!checked.success) {
      this.actionFailure.set(schemaProblems(checked.error).map((problem) => `${inspectionFieldLabel(problem.field)}: ${problem.message}`).join('; '));
      return;
    }
    this.busyFindingId.set(finding.id);
    this.client.changeFinding(finding.id, checked.data).subscribe({
      next: () => this.afterFindingChange(),
      error: (error: unknown) => this.afterFailure(error),
    });
  }

  protected deleteFinding(finding: FindingDetail): void {
    this.clearMessages();
    this.busyFindingId.set(finding.id);
    this.client.deleteFinding(finding.id).subscribe({
      next: () => {
        this.afterFindingChange();
        this.reloadPhotos();
      },
      error: (error: unknown) => this.afterFailure(error),
    });
  }

  protected submit(): void {
    const inspection = this.inspection();
    if (!inspection) return;
    this.clearMessages();
    const toReview = inspection.findings.flatMap((finding, index) => (finding.disposition === 'to-review' ? [{ field: `findings.${index}.disposition`, message: TO_REVIEW_MESSAGE }] : []));
    if (toReview.length > 0) {
      this.submitProblems.set(toReview);
      return;
    }
    this.step(this.client.submitInspection(inspection.id, inspection.version), (submitted) => `Inspection submitted: the raters of ${submitted.district} can review it now.`);
  }

  protected accept(): void {
    const inspection = this.inspection();
    if (!inspection) return;
    this.clearMessages();
    this.step(this.client.acceptInspection(inspection.id, inspection.version), () => 'Inspection accepted.');
  }

  protected startReturn(): void {
    this.clearMessages();
    this.returnForm.reset({ comment: '' });
    this.returning.set(true);
  }

  protected cancelReturn(): void {
    this.returning.set(false);
  }

  protected confirmReturn(): void {
    const inspection = this.inspection();
    if (!inspection) return;
    this.clearMessages();
    const checked = inspectionReturn.safeParse({ version: inspection.version, comment: this.returnForm.controls.comment.value });
    if (!checked.success) {
      this.showStepProblems(placeProblems(this.returnForm, schemaProblems(checked.error)));
      return;
    }
    this.step(this.client.returnInspection(inspection.id, checked.data.version, checked.data.comment), (returned) => `Inspection returned to ${returned.inspectorName} with your comment.`);
  }

  private step(request: Observable<InspectionDetail>, notice: (inspection: InspectionDetail) => string): void {
    this.stepping.set(true);
    request.subscribe({
      next: (inspection) => {
        this.stepping.set(false);
        this.returning.set(false);
        this.inspection.set(inspection);
        this.snackBar.open(notice(inspection), 'Dismiss', { duration: NOTICE_MS });
      },
      error: (error: unknown) => {
        this.stepping.set(false);
        const failure = saveFailureOf(error);
        if (failure.kind === 'conflict') this.conflict.set(true);
        else if (failure.kind === 'fields') this.showStepProblems(this.returning() ? placeProblems(this.returnForm, failure.problems) : failure.problems);
        else this.actionFailure.set(failure.message);
      },
    });
  }

  private afterFindingChange(): void {
    this.busyFindingId.set(null);
    this.reload();
  }

  private afterFailure(error: unknown): void {
    this.busyFindingId.set(null);
    const failure = saveFailureOf(error);
    if (failure.kind === 'conflict') this.conflict.set(true);
    else if (failure.kind === 'fields') this.showStepProblems(failure.problems);
    else this.actionFailure.set(failure.message);
  }

  /** Problems of a step (submit, return, a disposition) no input shows: listed above the steps, and on the findings they name. */
  private showStepProblems(problems: readonly FieldProblem[]): void {
    this.submitProblems.set(problems);
  }

  /** Each problem naming `findings.<index>…` with the finding at that index of the inspection. */
  private namedFindingProblems(): { problem: FieldProblem; finding: FindingDetail; message: string }[] {
    const findings = this.findings();
    return this.submitProblems().flatMap((problem) => {
      const index = /^findings\.(\d+)(?:\.|$)/.exec(problem.field)?.[1];
      const finding = index === undefined ? undefined : findings[Number(index)];
      return finding ? [{ problem, finding, message: problem.message }] : [];
    });
  }

  private show(inspection: InspectionDetail): void {
    this.inspection.set(inspection);
    this.loadError.set(null);
    if (inspection.structureId !== this.loadedStructureId) {
      this.loadedStructureId = inspection.structureId;
      this.loadSpans(inspection.structureId);
    }
  }

  private loadSpans(structureId: number): void {
    this.spans.set(null);
    this.spansError.set(null);
    this.inventory.fetchSpans(structureId).subscribe({
      next: (spans) => this.spans.set(spans),
      error: (error: unknown) => this.spansError.set(`The spans could not be loaded, so findings cannot be added. ${failureText(error)}`),
    });
  }

  private clearMessages(): void {
    this.conflict.set(false);
    this.actionFailure.set(null);
    this.submitProblems.set([]);
  }

  private open(idText: string): void {
    this.inspection.set(null);
    this.editor.set(null);
    this.photos.set([]);
    this.clearMessages();
    this.loadedStructureId = null;
    if (!/^[1-9]\d{0,9}$/.test(idText)) {
      this.inspectionId.set(null);
      this.loadError.set(`"${idText}" is not an inspection id: the address should end in a number, such as /inspections/12.`);
      return;
    }
    const id = Number(idText);
    this.loadError.set(null);
    this.inspectionId.set(id);
    this.inspectionLoads.next(id);
    this.photoLoads.next(id);
  }
}

/** A finding as the change body names its fields, with the version read. */
function changeFieldsOf(finding: FindingDetail) {
  const { version, kind, strands, lossFraction, brokenWires, spall, deckLossMm, crackWidthMm, fromM, toM, severity, notes } = finding;
  return { version, kind, strands, lossFraction, brokenWires, spall, deckLossMm, crackWidthMm, fromM, toM, severity, notes };
}

function loaded<T>(answer$: Observable<T>, failure: string): Observable<Loaded<T>> {
  return answer$.pipe(
    map((value): Loaded<T> => ({ ok: true, value })),
    catchError((error: unknown) => of<Loaded<T>>({ ok: false, message: `${failure} ${failureText(error)}` })),
  );
}

function failureText(error: unknown): string {
  return error instanceof HttpErrorResponse ? describeServerError(serverErrorReport(error)) : String(error);
}
