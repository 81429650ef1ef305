import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, effect, inject, linkedSignal, signal, untracked } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { ActivatedRoute, RouterLink } from '@angular/router';
import {
  canInDistrict,
  sectionProperties,
  shapeToPolygons,
  type FindingDetail,
  type GirderDetail,
  type GirderTypeSummary,
  type SectionShape,
  type SpanDetail,
  type StrandRow,
} from '@spanledger/shared';
import { Observable, Subject, catchError, forkJoin, map, of, switchMap } from 'rxjs';

import { describeServerError, serverErrorReport } from '../server-errors/server-error';
import { SessionStore } from '../session/session.store';
import { FieldProblem, saveFailureOf } from '../structures/field-problems';
import { MeasureInputDirective } from '../units/measure-input.directive';
import type { MeasureKind } from '../units/measures';
import { UnitsStore } from '../units/units.store';
import { GirderElevationStripComponent } from './girder-elevation-strip.component';
import { SECTION_SHAPE_NAMES, girderFieldLabel, overridableFieldsOf, sectionFieldsOf, type SectionField, type SectionShapeName } from './girder-fields';
import {
  checkGirder,
  debondingGroup,
  fillGirderForm,
  girderForm,
  girderRecordOf,
  nextStrandRow,
  placeGirderProblems,
  problemOf,
  profileGroup,
  resolvedSectionOf,
  setSectionControls,
  strandRowGroup,
  type GirderCheck,
  type SectionValue,
} from './girder-form';
import { GirderSectionDrawingComponent } from './girder-section-drawing.component';
import { GirdersClient } from './girders.client';
import { NumberListInputDirective } from './number-list-input.directive';
import type { DeckOutline } from './section-drawing-layout';
import { formatSectionQuantity } from './section-measures';
import { strandStatesOfOpenFindings } from './strand-states';

const SAVED_NOTICE_MS = 4000;

/** A column of the strand-row table: the row's key, and how its input takes a value. */
interface StrandColumn {
  readonly key: keyof StrandRow;
  readonly header: string;
  readonly input: 'text' | 'number' | 'measure' | 'list' | 'check';
  readonly measure?: MeasureKind;
  /** Shown under the header, e.g. a unit the units switch does not cover. */
  readonly note?: string;
}

const STRAND_COLUMNS: readonly StrandColumn[] = [
  { key: 'id', header: 'Row id', input: 'text' },
  { key: 'yMm', header: 'Height y', input: 'measure', measure: 'sectionSize' },
  { key: 'count', header: 'Strands', input: 'number' },
  { key: 'xMm', header: 'Positions x', input: 'list', measure: 'sectionSize', note: 'optional, comma list' },
  { key: 'strandAreaMm2', header: 'Strand area', input: 'number', note: 'mm²' },
  { key: 'strandDiameterMm', header: 'Diameter', input: 'measure', measure: 'sectionSize' },
  { key: 'fpuMpa', header: 'fpu', input: 'measure', measure: 'strength' },
  { key: 'fpyMpa', header: 'fpy', input: 'measure', measure: 'strength' },
  { key: 'epsMpa', header: 'Eps', input: 'measure', measure: 'strength' },
  { key: 'fpeMpa', header: 'fpe', input: 'measure', measure: 'strength', note: 'optional' },
  { key: 'bonded', header: 'Bonded', input: 'check' },
  { key: 'unbondedLengthMm', header: 'Unbonded length', input: 'measure', measure: 'deckLayout', note: 'unbonded rows' },
];
const MOMENT_FORMAT = new Intl.DateTimeFormat('en', { dateStyle: 'medium', timeStyle: 'short' });

type Loaded<T> = { readonly ok: true; readonly value: T } | { readonly ok: false; readonly message: string };

/** What the drawing and the properties show: the last values of the form that passed the schemas. */
interface Preview {
  readonly section: SectionShape;
  readonly strandRows: readonly StrandRow[];
}

interface Fact {
  readonly key: string;
  readonly label: string;
  readonly value: string;
}

interface LabelledProblem extends FieldProblem {
  readonly label: string;
}

/**
 * One girder: where it sits, its cross-section drawn live with the strand states its open
 * findings leave, its section properties, its span with the findings along it, and the whole
 * girder record as a form for raters and managers of its district (read-only for everyone else).
 * The drawing follows the form while the form's values pass the server's own schemas; a save
 * replaces the record with the version read.
 */
@Component({
  selector: 'sl-girder-editor-page',
  imports: [
    RouterLink,
    ReactiveFormsModule,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    MeasureInputDirective,
    NumberListInputDirective,
    GirderSectionDrawingComponent,
    GirderElevationStripComponent,
  ],
  templateUrl: './girder-editor.page.html',
  styleUrl: './girder-editor.page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class GirderEditorPage {
  private readonly client = inject(GirdersClient);
  private readonly session = inject(SessionStore);
  private readonly snackBar = inject(MatSnackBar);
  private readonly formBuilder = inject(NonNullableFormBuilder);
  private readonly units = inject(UnitsStore);

  protected readonly labels = this.units.labels;
  protected readonly shapeNames = SECTION_SHAPE_NAMES;
  protected readonly shapes = Object.keys(SECTION_SHAPE_NAMES) as SectionShapeName[];
  protected readonly strandColumns = STRAND_COLUMNS;
  protected readonly concreteParts = [
    { group: 'concrete', legend: 'Girder concrete' },
    { group: 'deckConcrete', legend: 'Deck concrete' },
  ] as const;
  protected readonly form = girderForm(this.formBuilder);

  protected readonly girder = signal<GirderDetail | null>(null);
  protected readonly catalogue = signal<readonly GirderTypeSummary[]>([]);
  protected readonly loadError = signal<string | null>(null);
  protected readonly span = signal<SpanDetail | null>(null);
  protected readonly spanError = signal<string | null>(null);
  protected readonly findings = signal<readonly FindingDetail[] | null>(null);
  protected readonly findingsError = signal<string | null>(null);

  protected readonly saving = signal(false);
  protected readonly conflict = signal(false);
  protected readonly failure = signal<string | null>(null);
  /** Problems of the last save that no single input shows. */
  protected readonly formProblems = signal<readonly LabelledProblem[]>([]);

  /** Bumped on every change of the form, so the computed views below follow it. */
  private readonly formRevision = signal(0);
  /** The form's values as a signal, for the template's choices (a harped profile shows its hold-down points). */
  protected readonly formValue = computed(() => {
    this.formRevision();
    return this.form.getRawValue();
  });
  /** The catalogue type the section inputs were last built for (null: custom). */
  private sectionTypeId: number | null = null;

  private readonly girderLoads = new Subject<number>();
  private readonly spanLoads = new Subject<number>();
  private readonly findingLoads = new Subject<number>();

  protected readonly loading = computed(() => this.girder() === null && this.loadError() === null);

  /** Rater or manager within their districts (the server checks again on save). */
  protected readonly canEdit = computed(() => {
    const user = this.session.user();
    const girder = this.girder();
    return !!user && !!girder && canInDistrict(user, 'editInventory', girder.district) && !this.typeMissing();
  });

  /** A girder of a type the catalogue no longer lists cannot be shown faithfully in the form. */
  protected readonly typeMissing = computed(() => {
    const girder = this.girder();
    return !!girder && girder.girderTypeId !== null && !this.catalogue().some((type) => type.id === girder.girderTypeId);
  });

  protected readonly types = computed(() => [...this.catalogue()].sort((a, b) => a.name.localeCompare(b.name)));

  private readonly selectedType = computed(() => {
    this.formRevision();
    const typeId = this.form.controls.girderTypeId.value;
    return this.catalogue().find((type) => type.id === typeId) ?? null;
  });

  protected readonly isCustom = computed(() => this.selectedType() === null);

  /** The inputs of the section: a type's dimensions to override, or every dimension of the custom shape. */
  protected readonly sectionFields = computed<readonly SectionField[]>(() => {
    this.formRevision();
    const type = this.selectedType();
    return type ? overridableFieldsOf(type.section) : sectionFieldsOf(this.form.controls.customShape.value);
  });

  protected readonly check = computed<GirderCheck | null>(() => {
    this.formRevision();
    const girder = this.girder();
    if (!girder) return null;
    const type = this.selectedType();
    return checkGirder(girderRecordOf(this.form, type, girder.bars), girder.version, resolvedSectionOf(this.form, type), type);
  });

  protected readonly preview = linkedSignal<GirderCheck | null, Preview | null>({
    source: this.check,
    computation: (check, previous) => (check?.ok ? { section: check.section, strandRows: check.change.strandRows } : (previous?.value ?? null)),
  });

  /** Why the drawing is not following the form just now. */
  protected readonly previewProblems = computed<readonly LabelledProblem[]>(() => {
    const check = this.check();
    return check && !check.ok ? check.problems.map((problem) => ({ ...problem, label: girderFieldLabel(problem.field) })) : [];
  });

  protected readonly openFindings = computed(() => (this.findings() ?? []).filter((finding) => finding.registerState === 'open'));

  protected readonly findingStates = computed(() => {
    const preview = this.preview();
    return preview ? strandStatesOfOpenFindings(this.openFindings(), preview.strandRows) : { states: {}, unplaced: [] };
  });

  /** The deck over this girder: the span's slab over the girder spacing, on its haunch. */
  protected readonly deck = computed<DeckOutline | null>(() => {
    const span = this.span();
    return span ? { widthMm: span.girderSpacingMm, thicknessMm: span.deckThicknessMm, haunchMm: span.haunchMm } : null;
  });

  protected readonly properties = computed<readonly Fact[]>(() => {
    const preview = this.preview();
    if (!preview) return [];
    const system = this.units.system();
    const section = sectionProperties(shapeToPolygons(preview.section));
    const strandCount = preview.strandRows.reduce((sum, row) => sum + row.count, 0);
    const strandAreaMm2 = preview.strandRows.reduce((sum, row) => sum + row.count * row.strandAreaMm2, 0);
    const length = (valueMm: number) => this.units.format('sectionSize', valueMm, { withUnit: true });
    return [
      { key: 'areaMm2', label: 'Area', value: formatSectionQuantity('area', section.areaMm2, system) },
      { key: 'centroidFromSoffitMm', label: 'Centroid above the soffit', value: length(section.centroidFromSoffitMm) },
      { key: 'inertiaMm4', label: 'Moment of inertia', value: formatSectionQuantity('inertia', section.inertiaMm4, system) },
      { key: 'topModulusMm3', label: 'Section modulus, top fibre', value: formatSectionQuantity('modulus', section.topModulusMm3, system) },
      { key: 'bottomModulusMm3', label: 'Section modulus, bottom fibre', value: formatSectionQuantity('modulus', section.bottomModulusMm3, system) },
      { key: 'depthMm', label: 'Depth', value: length(section.topYMm - section.bottomYMm) },
      { key: 'strands', label: 'Prestressing steel', value: `${strandCount} strands, ${formatSectionQuantity('area', strandAreaMm2, system)}` },
    ];
  });

  /** The strand row ids typed so far, for the profile and debonding pickers. */
  protected readonly rowIds = computed(() => {
    this.formRevision();
    return [...new Set(this.form.controls.strandRows.getRawValue().map((row) => row.id.trim()).filter((id) => id !== ''))];
  });

  protected readonly where = computed(() => {
    const girder = this.girder();
    return girder ? `Span ${girder.spanIndex} · girder ${girder.girderNumber}` : '';
  });

  protected readonly lastChange = computed(() => {
    const girder = this.girder();
    if (!girder) return '';
    return `Last changed ${MOMENT_FORMAT.format(new Date(girder.updated.at))} by ${girder.updated.by ?? 'a data load'}`;
  });

  constructor() {
    this.form.valueChanges.pipe(takeUntilDestroyed()).subscribe(() => this.formRevision.update((revision) => revision + 1));
    this.girderLoads
      .pipe(
        switchMap((id) => loaded(forkJoin({ girder: this.client.fetchGirder(id), types: this.client.fetchGirderTypes() }), 'The girder could not be loaded.')),
        takeUntilDestroyed(),
      )
      .subscribe((answer) => (answer.ok ? this.show(answer.value.girder, answer.value.types) : this.loadError.set(answer.message)));
    this.spanLoads
      .pipe(
        switchMap((id) => loaded(this.client.fetchSpan(id), 'The span could not be loaded.')),
        takeUntilDestroyed(),
      )
      .subscribe((answer) => (answer.ok ? this.span.set(answer.value) : this.spanError.set(answer.message)));
    this.findingLoads
      .pipe(
        switchMap((id) => loaded(this.client.fetchFindings(id), 'The findings could not be loaded, so every strand is drawn intact.')),
        takeUntilDestroyed(),
      )
      .subscribe((answer) => (answer.ok ? this.findings.set(answer.value) : this.findingsError.set(answer.message)));

    effect(() => {
      const editable = this.canEdit();
      untracked(() => (editable ? this.form.enable() : this.form.disable()));
    });

    inject(ActivatedRoute)
      .paramMap.pipe(
        map((params) => params.get('id') ?? ''),
        takeUntilDestroyed(),
      )
      .subscribe((id) => this.open(id));
  }

  protected readonly sectionGroup = computed(() => (this.isCustom() ? 'customSection' : 'sectionOverrides'));

  protected sectionControl(key: string): FormControl<SectionValue> {
    return this.form.controls[this.sectionGroup()].controls[key]!;
  }

  protected problem(path: string): string | null {
    return problemOf(this.form, path);
  }

  /** The strand rows a profile or debonding entry may name, with its own even when no row has it any more. */
  protected rowIdChoices(current: string): readonly string[] {
    const ids = this.rowIds();
    return current === '' || ids.includes(current) ? ids : [...ids, current];
  }

  /** A new catalogue type takes its own dimensions; a custom section starts from the section as it was. */
  protected onSectionSourceChange(typeId: number | null): void {
    const previousType = this.typeById(this.sectionTypeId);
    const resolved = resolvedSectionOf(this.form, previousType);
    const type = this.typeById(typeId);
    if (type) {
      setSectionControls(this.form.controls.sectionOverrides, overridableFieldsOf(type.section), type.section);
    } else {
      const shape = (resolved['shape'] ?? 'rectangle') as SectionShapeName;
      this.form.controls.customShape.setValue(shape);
      setSectionControls(this.form.controls.customSection, sectionFieldsOf(shape), resolved);
    }
    this.sectionTypeId = type?.id ?? null;
  }

  /** A new custom shape keeps the dimensions it shares with the old one. */
  protected onCustomShapeChange(shape: SectionShapeName): void {
    setSectionControls(this.form.controls.customSection, sectionFieldsOf(shape), this.form.controls.customSection.getRawValue());
  }

  protected addStrandRow(): void {
    const rows = this.form.controls.strandRows;
    rows.push(strandRowGroup(this.formBuilder, nextStrandRow(rows.getRawValue())));
  }

  protected removeStrandRow(index: number): void {
    this.form.controls.strandRows.removeAt(index);
  }

  protected addProfile(): void {
    this.form.controls.profiles.push(profileGroup(this.formBuilder, { rowId: this.rowIds()[0] ?? '', shape: 'harped' }));
  }

  protected removeProfile(index: number): void {
    this.form.controls.profiles.removeAt(index);
  }

  protected addDebonding(): void {
    this.form.controls.debonding.push(debondingGroup(this.formBuilder, { rowId: this.rowIds()[0] ?? '' }));
  }

  protected removeDebonding(index: number): void {
    this.form.controls.debonding.removeAt(index);
  }

  protected save(): void {
    this.clearMessages();
    const girder = this.girder();
    const check = this.check();
    if (!girder || !check || !this.canEdit()) return;
    if (!check.ok) {
      this.showProblems(check.problems);
      return;
    }
    this.saving.set(true);
    this.client.changeGirder(girder.id, check.change).subscribe({
      next: (updated) => {
        this.saving.set(false);
        this.show(updated, this.catalogue());
        this.snackBar.open(`Girder ${updated.girderNumber} of span ${updated.spanIndex} saved.`, 'Dismiss', { duration: SAVED_NOTICE_MS });
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

  /** Back to the girder as it was read. */
  protected undo(): void {
    const girder = this.girder();
    if (girder) this.show(girder, this.catalogue());
  }

  /** After a conflict: the girder as it is now; the form starts again from it. */
  protected reload(): void {
    const girder = this.girder();
    if (girder) this.girderLoads.next(girder.id);
  }

  private open(idText: string): void {
    this.girder.set(null);
    this.span.set(null);
    this.findings.set(null);
    this.spanError.set(null);
    this.findingsError.set(null);
    if (!/^[1-9]\d{0,9}$/.test(idText)) {
      this.loadError.set(`"${idText}" is not a girder id: the address should end in a number, such as /girders/12.`);
      return;
    }
    const id = Number(idText);
    this.loadError.set(null);
    this.girderLoads.next(id);
    this.findingLoads.next(id);
  }

  private show(girder: GirderDetail, types: readonly GirderTypeSummary[]): void {
    const spanChanged = this.girder()?.spanId !== girder.spanId || this.span() === null;
    this.catalogue.set(types);
    this.girder.set(girder);
    const type = types.find((candidate) => candidate.id === girder.girderTypeId) ?? null;
    fillGirderForm(this.form, this.formBuilder, girder, type);
    this.sectionTypeId = type?.id ?? null;
    // New inputs arrive enabled; a read-only form stays read-only.
    if (!this.canEdit()) this.form.disable();
    this.clearMessages();
    if (spanChanged) this.spanLoads.next(girder.spanId);
  }

  private showProblems(problems: readonly FieldProblem[]): void {
    this.formProblems.set(placeGirderProblems(this.form, problems).map((problem) => ({ ...problem, label: girderFieldLabel(problem.field) })));
  }

  private typeById(typeId: number | null): GirderTypeSummary | null {
    return this.catalogue().find((type) => type.id === typeId) ?? null;
  }

  private clearMessages(): void {
    this.conflict.set(false);
    this.failure.set(null);
    this.formProblems.set([]);
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
