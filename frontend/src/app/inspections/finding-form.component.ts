import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, ElementRef, afterRenderEffect, computed, effect, inject, input, output, signal, untracked, viewChild } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import {
  FINDING_KINDS,
  FINDING_KIND_NAMES,
  FINDING_SEVERITIES,
  FINDING_SEVERITY_NAMES,
  STRAND_FINDING_KINDS,
  WIRES_PER_STRAND,
  findingChange,
  newFinding,
  type FindingDetail,
  type FindingKind,
  type FindingSeverity,
  type GirderDetail,
  type GirderSummary,
  type InspectionDetail,
  type SpanDetail,
} from '@spanledger/shared';
import type { z } from 'zod';
import { Observable, catchError, distinctUntilChanged, map, of, startWith, switchMap } from 'rxjs';

import { GirderSectionDrawingComponent } from '../girders/girder-section-drawing.component';
import { GirdersClient } from '../girders/girders.client';
import { strandStatesOfOpenFindings, type FindingStrandStates, type StrandRef } from '../girders/strand-states';
import { describeServerError, serverErrorReport } from '../server-errors/server-error';
import { FieldProblem, PROBLEM, missingValues, placeProblems, saveFailureOf, schemaProblems } from '../structures/field-problems';
import { InventoryClient } from '../structures/inventory.client';
import { MeasureInputDirective } from '../units/measure-input.directive';
import { UnitsStore } from '../units/units.store';
import { inspectionFieldLabel } from './inspection-text';
import { InspectionsClient } from './inspections.client';

/** How the strands are named: tapped on the cross-section, or a row and a count when they cannot be told apart. */
type StrandEntry = 'tap' | 'count';

type Loaded<T> = { readonly kind: 'none' } | { readonly kind: 'loading' } | { readonly kind: 'loaded'; readonly value: T } | { readonly kind: 'failed'; readonly message: string };

/** The values each kind of finding carries beyond where it is and how severe. */
const KIND_FIELDS: Readonly<Record<FindingKind, readonly string[]>> = {
  'lost-strands': [],
  'strand-section-loss': ['lossFraction'],
  'broken-wires': ['brokenWires'],
  'exposed-strands': [],
  spall: ['spall.depthMm', 'spall.widthMm'],
  'deck-loss': ['deckLossMm'],
  crack: [],
  other: [],
};

/**
 * Records a finding against one girder, or changes one (a carried-forward finding that has grown
 * takes its new extent here). Span → girder → kind, then the kind's own values; strands are tapped
 * on the girder's cross-section (or given as a row and a count). Positions along the span are
 * typed in m or ft, sizes in mm or in; the form is checked with the server's schema before sending.
 */
@Component({
  selector: 'sl-finding-form',
  imports: [
    ReactiveFormsModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    MatButtonToggleModule,
    MatButtonModule,
    MatIconModule,
    MatProgressBarModule,
    MeasureInputDirective,
    GirderSectionDrawingComponent,
  ],
  templateUrl: './finding-form.component.html',
  styleUrls: ['../structures/edit-form.scss', './inspection-forms.scss', './finding-form.component.scss'],
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class FindingFormComponent {
  readonly inspection = input.required<InspectionDetail>();
  readonly spans = input.required<readonly SpanDetail[]>();
  /** The finding to change, or null to record a new one. */
  readonly finding = input<FindingDetail | null>(null);
  /** 'grown' when a carried-forward finding is measured again: sent with its new extent as grown. */
  readonly disposition = input<'grown' | null>(null);
  readonly saved = output<FindingDetail>();
  readonly cancelled = output<void>();
  /** The user chose to reload after someone else changed the finding. */
  readonly reloadRequested = output<void>();

  private readonly client = inject(InspectionsClient);
  private readonly inventory = inject(InventoryClient);
  private readonly girdersClient = inject(GirdersClient);
  private readonly formBuilder = inject(NonNullableFormBuilder);
  private readonly units = inject(UnitsStore);

  protected readonly labels = this.units.labels;
  protected readonly problem = PROBLEM;
  protected readonly label = inspectionFieldLabel;
  protected readonly kinds = FINDING_KINDS;
  protected readonly kindNames = FINDING_KIND_NAMES;
  protected readonly severities = FINDING_SEVERITIES;
  protected readonly severityNames = FINDING_SEVERITY_NAMES;
  protected readonly maxBrokenWires = WIRES_PER_STRAND - 1;

  protected readonly form = this.formBuilder.group({
    spanId: this.formBuilder.control<number | null>(null),
    girderId: this.formBuilder.control<number | null>(null),
    kind: this.formBuilder.control<FindingKind | null>(null),
    strands: this.formBuilder.group({ rowId: '', count: this.formBuilder.control<number | null>(null) }),
    lossFraction: this.formBuilder.control<number | null>(null),
    brokenWires: this.formBuilder.control<number | null>(null),
    spall: this.formBuilder.group({ depthMm: this.formBuilder.control<number | null>(null), widthMm: this.formBuilder.control<number | null>(null) }),
    deckLossMm: this.formBuilder.control<number | null>(null),
    crackWidthMm: this.formBuilder.control<number | null>(null),
    fromM: this.formBuilder.control<number | null>(null),
    toM: this.formBuilder.control<number | null>(null),
    severity: this.formBuilder.control<FindingSeverity | null>(null),
    notes: '',
  });

  protected readonly strandEntry = signal<StrandEntry>('tap');
  protected readonly tapped = signal<readonly StrandRef[]>([]);
  /** Set when a tap in another row started the choice again: a finding names strands of one row. */
  protected readonly rowRestarted = signal<string | null>(null);
  protected readonly saving = signal(false);
  protected readonly conflict = signal(false);
  protected readonly formProblems = signal<readonly FieldProblem[]>([]);
  /** Problems with the strands, shown under the drawing (or the row and count). */
  protected readonly strandProblems = signal<readonly string[]>([]);
  protected readonly failure = signal<string | null>(null);
  /** The strands last sent, to name a refused strand by its number rather than its place in the list. */
  private sentStrands: readonly number[] = [];

  private readonly spanId = toSignal(this.valuesOf(this.form.controls.spanId), { initialValue: null });
  protected readonly girderId = toSignal(this.valuesOf(this.form.controls.girderId), { initialValue: null });
  protected readonly kind = toSignal(this.valuesOf(this.form.controls.kind), { initialValue: null });

  protected readonly changing = computed(() => this.finding() !== null);
  protected readonly grown = computed(() => this.disposition() === 'grown');
  protected readonly needsStrands = computed(() => {
    const kind = this.kind();
    return kind !== null && STRAND_FINDING_KINDS.includes(kind);
  });

  protected readonly title = computed(() => {
    const finding = this.finding();
    if (!finding) return 'Add a finding';
    const where = `span ${finding.spanIndex}, girder ${finding.girderNumber}`;
    return this.grown() ? `Record the growth of ${FINDING_KIND_NAMES[finding.kind].toLowerCase()} on ${where}` : `Change the finding on ${where}`;
  });

  protected readonly sortedSpans = computed(() => [...this.spans()].sort((a, b) => a.spanIndex - b.spanIndex));
  protected readonly span = computed(() => this.spans().find((span) => span.id === this.spanId()) ?? null);
  protected readonly spanLengthText = computed(() => {
    const span = this.span();
    return span ? `The span is ${this.units.format('spanLength', span.lengthM, { withUnit: true })} long` : '';
  });

  protected readonly girders = toSignal(
    toObservable(this.spanId).pipe(switchMap((spanId) => (spanId === null ? of<Loaded<GirderSummary[]>>({ kind: 'none' }) : loading(this.inventory.fetchGirders(spanId))))),
    { initialValue: { kind: 'none' } as Loaded<GirderSummary[]> },
  );
  protected readonly girderChoices = computed(() => {
    const girders = this.girders();
    return girders.kind === 'loaded' ? [...girders.value].sort((a, b) => a.girderNumber - b.girderNumber) : [];
  });

  /** The girder's section and strand rows, needed only to name strands. */
  private readonly girderToDraw = computed(() => (this.needsStrands() ? this.girderId() : null));
  protected readonly girder = toSignal(
    toObservable(this.girderToDraw).pipe(
      distinctUntilChanged(),
      switchMap((girderId) => (girderId === null ? of<Loaded<GirderDetail>>({ kind: 'none' }) : loading(this.girdersClient.fetchGirder(girderId)))),
    ),
    { initialValue: { kind: 'none' } as Loaded<GirderDetail> },
  );
  protected readonly girderFailure = computed(() => {
    const girder = this.girder();
    return girder.kind === 'failed' ? girder.message : '';
  });
  protected readonly girderDetail = computed(() => {
    const girder = this.girder();
    return girder.kind === 'loaded' ? girder.value : null;
  });

  /**
   * The girder's strands as they stand with this inspection's other findings (those carried
   * forward from the register and those new in it), as a rating would apply them once submitted.
   */
  protected readonly drawnDamage = computed<FindingStrandStates>(() => {
    const girder = this.girderDetail();
    if (!girder) return { states: {}, unplaced: [] };
    const others = this.inspection().findings.filter((other) => other.girderId === girder.id && other.id !== this.finding()?.id && other.disposition !== 'repaired');
    // Read as open on the register, newest first as the register answers, since that is what they will be.
    const asRegister = others.map((other) => ({ ...other, registerState: 'open' as const })).reverse();
    return strandStatesOfOpenFindings(asRegister, girder.strandRows);
  });

  protected readonly tappedText = computed(() => {
    const taps = this.tapped();
    if (taps.length === 0) return 'Tap the strands this finding affects.';
    const numbers = taps.map((tap) => tap.index).sort((a, b) => a - b);
    return `Row ${taps[0]!.rowId}: strand${numbers.length === 1 ? '' : 's'} ${numbers.join(', ')} (${numbers.length} in all). Tap a strand again to leave it out.`;
  });

  private readonly drawingBox = viewChild<ElementRef<HTMLElement>>('drawingBox');

  constructor() {
    effect(() => {
      const finding = this.finding();
      untracked(() => this.startFrom(finding));
    });
    // Most strands of a pretensioned girder sit in its bottom flange: show that part first.
    afterRenderEffect(() => {
      const box = this.drawingBox()?.nativeElement;
      if (box && this.girderDetail()) untracked(() => (box.scrollTop = box.scrollHeight));
    });
    // A new span has other girders, and another girder other strands.
    this.form.controls.spanId.valueChanges.subscribe(() => {
      if (!this.changing()) this.form.controls.girderId.setValue(null);
    });
    this.form.controls.girderId.valueChanges.subscribe(() => {
      if (!this.changing()) this.clearStrands();
    });
  }

  protected useStrandEntry(entry: StrandEntry): void {
    this.strandEntry.set(entry);
    this.strandProblems.set([]);
  }

  protected toggleStrand(tap: StrandRef): void {
    const taps = this.tapped();
    this.strandProblems.set([]);
    if (taps.length > 0 && taps[0]!.rowId !== tap.rowId) {
      this.tapped.set([tap]);
      this.rowRestarted.set(`A finding names strands of one row, so the choice started again in row ${tap.rowId}. Record another finding for the other row.`);
      return;
    }
    this.rowRestarted.set(null);
    const chosen = taps.some((each) => each.index === tap.index);
    this.tapped.set(chosen ? taps.filter((each) => each.index !== tap.index) : [...taps, tap]);
  }

  protected save(): void {
    this.clearMessages();
    const fields = this.findingFields();
    const required = missingValues(this.form, this.requiredFields());
    const ownRules = [...required, ...this.untappedStrands(), ...this.beyondSpan()];
    const finding = this.finding();
    this.sentStrands = fields.strands?.strands ?? [];
    if (finding) {
      const checked = findingChange.safeParse({ version: finding.version, ...fields, ...(this.grown() ? { disposition: 'grown' } : {}) });
      const problems = withSchemaProblems(ownRules, checked);
      if (problems.length > 0 || !checked.success) return this.showProblems(problems);
      this.send(this.client.changeFinding(finding.id, checked.data));
    } else {
      const checked = newFinding.safeParse({ girderId: this.form.controls.girderId.value, ...fields });
      const problems = withSchemaProblems(ownRules, checked);
      if (problems.length > 0 || !checked.success) return this.showProblems(problems);
      this.send(this.client.addFinding(this.inspection().id, checked.data));
    }
  }

  protected cancel(): void {
    this.cancelled.emit();
  }

  private send(sending: Observable<FindingDetail>): void {
    this.saving.set(true);
    sending.subscribe({
      next: (stored) => {
        this.saving.set(false);
        this.saved.emit(stored);
      },
      error: (error: unknown) => {
        this.saving.set(false);
        const failure = saveFailureOf(error);
        if (failure.kind === 'conflict') this.conflict.set(true);
        else if (failure.kind === 'fields') this.showProblems(failure.problems);
        else this.failure.set(failure.message);
      },
    });
  }

  protected reload(): void {
    this.reloadRequested.emit();
  }

  protected rowText(row: GirderDetail['strandRows'][number]): string {
    return `Row ${row.id}: ${row.count} strand${row.count === 1 ? '' : 's'} at ${this.units.format('sectionSize', row.yMm, { withUnit: true })} up`;
  }

  private valuesOf<T>(control: { value: T; valueChanges: Observable<T> }): Observable<T> {
    return control.valueChanges.pipe(startWith(control.value), distinctUntilChanged());
  }

  private startFrom(finding: FindingDetail | null): void {
    const strands = finding?.strands ?? null;
    this.form.reset({
      spanId: finding?.spanId ?? null,
      girderId: finding?.girderId ?? null,
      kind: finding?.kind ?? null,
      strands: { rowId: strands?.count !== undefined ? strands.rowId : '', count: strands?.count ?? null },
      lossFraction: finding?.lossFraction ?? null,
      brokenWires: finding?.brokenWires ?? null,
      spall: { depthMm: finding?.spall?.depthMm ?? null, widthMm: finding?.spall?.widthMm ?? null },
      deckLossMm: finding?.deckLossMm ?? null,
      crackWidthMm: finding?.crackWidthMm ?? null,
      fromM: finding?.fromM ?? null,
      toM: finding?.toM ?? null,
      severity: finding?.severity ?? null,
      notes: finding?.notes ?? '',
    });
    this.strandEntry.set(strands?.count !== undefined ? 'count' : 'tap');
    this.tapped.set(strands?.strands?.map((index) => ({ rowId: strands.rowId, index })) ?? []);
    this.rowRestarted.set(null);
    // Where a finding sits is part of what it is: a change keeps its girder, and growth keeps its kind.
    const { spanId, girderId, kind } = this.form.controls;
    for (const control of [spanId, girderId]) {
      if (finding) control.disable({ emitEvent: false });
      else control.enable({ emitEvent: false });
    }
    if (finding && this.disposition() === 'grown') kind.disable({ emitEvent: false });
    else kind.enable({ emitEvent: false });
    this.clearMessages();
  }

  private clearStrands(): void {
    this.tapped.set([]);
    this.rowRestarted.set(null);
    this.form.controls.strands.reset({ rowId: '', count: null });
  }

  /** The finding as the API names its fields, with only what its kind uses (the rest null). */
  private findingFields() {
    const values = this.form.getRawValue();
    const kind = values.kind;
    const uses = (field: string) => kind !== null && KIND_FIELDS[kind].some((each) => each === field || each.startsWith(`${field}.`));
    return {
      kind,
      strands: this.needsStrands() ? this.strandsValue() : null,
      lossFraction: uses('lossFraction') ? values.lossFraction : null,
      brokenWires: uses('brokenWires') ? values.brokenWires : null,
      spall: uses('spall') ? values.spall : null,
      deckLossMm: uses('deckLossMm') ? values.deckLossMm : null,
      // A crack's width is for the record; it may be left out.
      crackWidthMm: kind === 'crack' ? values.crackWidthMm : null,
      fromM: values.fromM,
      toM: values.toM,
      severity: values.severity,
      notes: values.notes,
    };
  }

  private strandsValue(): { rowId: string; strands?: number[]; count?: number | null } | null {
    if (this.strandEntry() === 'count') {
      const { rowId, count } = this.form.controls.strands.getRawValue();
      return { rowId, count };
    }
    const taps = this.tapped();
    return taps.length === 0 ? null : { rowId: taps[0]!.rowId, strands: taps.map((tap) => tap.index).sort((a, b) => a - b) };
  }

  private requiredFields(): string[] {
    const kind = this.kind();
    return [
      ...(this.changing() ? [] : ['girderId']),
      'kind',
      ...(kind === null ? [] : KIND_FIELDS[kind]),
      ...(this.needsStrands() && this.strandEntry() === 'count' ? ['strands.count'] : []),
      'fromM',
      'toM',
      'severity',
    ];
  }

  /** The schema asks for strands only once every other field parses; say it at once. */
  private untappedStrands(): FieldProblem[] {
    return this.needsStrands() && this.strandEntry() === 'tap' && this.tapped().length === 0 ? [{ field: 'strands', message: 'tap at least one strand on the drawing' }] : [];
  }

  private beyondSpan(): FieldProblem[] {
    const span = this.span();
    if (!span) return [];
    const length = this.units.format('spanLength', span.lengthM, { withUnit: true });
    return (['fromM', 'toM'] as const)
      .filter((field) => {
        const value = this.form.controls[field].value;
        return value !== null && value > span.lengthM;
      })
      .map((field) => ({ field, message: `lies beyond the span (${length})` }));
  }

  /** Strand problems go under the drawing (or under the row and count they name); the others under their inputs. */
  private showProblems(problems: readonly FieldProblem[]): void {
    const countEntry = this.strandEntry() === 'count';
    const placeable = (problem: FieldProblem) => !aboutStrands(problem) || (countEntry && (problem.field === 'strands.rowId' || problem.field === 'strands.count'));
    const unplaced = placeProblems(this.form, problems.filter(placeable));
    this.strandProblems.set([...problems.filter((problem) => !placeable(problem)), ...unplaced.filter(aboutStrands)].map((problem) => this.strandProblemText(problem)));
    this.formProblems.set(unplaced.filter((problem) => !aboutStrands(problem)));
  }

  private strandProblemText({ field, message }: FieldProblem): string {
    const listed = /^strands\.strands\.(\d+)$/.exec(field);
    if (listed) {
      const index = this.sentStrands[Number(listed[1])];
      const rowId = this.tapped()[0]?.rowId ?? '';
      return index === undefined ? `Strand ${listed[1]} of those tapped: ${message}` : `Row ${rowId}, strand ${index}: ${message}`;
    }
    return `${inspectionFieldLabel(field)}: ${message}`;
  }

  private clearMessages(): void {
    this.conflict.set(false);
    this.failure.set(null);
    this.formProblems.set([]);
    this.strandProblems.set([]);
  }
}

function aboutStrands(problem: FieldProblem): boolean {
  return problem.field === 'strands' || problem.field.startsWith('strands.');
}

/** The form's own rules first; the schema's issues on fields those rules have not already named. */
function withSchemaProblems(ownRules: readonly FieldProblem[], checked: { success: true } | { success: false; error: z.ZodError }): FieldProblem[] {
  const schema = checked.success ? [] : schemaProblems(checked.error).filter((problem) => !ownRules.some((own) => own.field === problem.field));
  return [...ownRules, ...schema];
}

function loading<T>(answer$: Observable<T>): Observable<Loaded<T>> {
  return answer$.pipe(
    map((value): Loaded<T> => ({ kind: 'loaded', value })),
    catchError((error: unknown) => of<Loaded<T>>({ kind: 'failed', message: error instanceof HttpErrorResponse ? describeServerError(serverErrorReport(error)) : String(error) })),
    startWith<Loaded<T>>({ kind: 'loading' }),
  );
}
