import { ChangeDetectionStrategy, Component, effect, inject, input, output, signal, untracked } from '@angular/core';
import { FormArray, FormControl, FormGroup, NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { spanChange, type SpanChange, type SpanDetail } from '@spanledger/shared';

import { MeasureInputDirective } from '../units/measure-input.directive';
import { MeasureKind } from '../units/measures';
import { UnitsStore } from '../units/units.store';
import { FieldProblem, PROBLEM, missingValues, placeProblems, saveFailureOf, schemaProblems } from './field-problems';
import { fieldLabel } from './inventory-fields';
import { InventoryClient } from './inventory.client';

type SpanFields = Required<Omit<SpanChange, 'version'>>;
type WearingSurface = NonNullable<SpanFields['wearingSurface']>;
type Measured = FormControl<number | null>;
type BarrierGroup = FormGroup<{ loadKnM: Measured }>;
type DiaphragmGroup = FormGroup<{ xM: Measured; loadKn: Measured }>;

/** The span's single values: field name and the kind of measure its input takes. */
const SIZE_FIELDS = [
  { field: 'lengthM', measure: 'spanLength' },
  { field: 'girderSpacingMm', measure: 'deckLayout' },
  { field: 'overhangMm', measure: 'deckLayout' },
  { field: 'roadwayWidthMm', measure: 'deckLayout' },
  { field: 'barrierFaceToGirderMm', measure: 'deckLayout' },
  { field: 'deckThicknessMm', measure: 'sectionSize' },
  { field: 'haunchMm', measure: 'sectionSize' },
] as const satisfies readonly { field: keyof SpanFields; measure: MeasureKind }[];

/** Every value the calculation needs; only the exterior girder's barrier offset may be left unknown. */
const REQUIRED_SIZES = SIZE_FIELDS.map(({ field }) => field).filter((field) => field !== 'barrierFaceToGirderMm');

/** The span as the change body names its fields, in one key order so that two of them compare as text. */
function fieldsOf(span: Pick<SpanDetail, keyof SpanFields>): SpanFields {
  return {
    lengthM: span.lengthM,
    girderSpacingMm: span.girderSpacingMm,
    overhangMm: span.overhangMm,
    roadwayWidthMm: span.roadwayWidthMm,
    barrierFaceToGirderMm: span.barrierFaceToGirderMm ?? null,
    deckThicknessMm: span.deckThicknessMm,
    haunchMm: span.haunchMm,
    wearingSurface: span.wearingSurface ? surfaceOf(span.wearingSurface) : null,
    barriers: span.barriers.map(({ loadKnM }) => ({ loadKnM })),
    diaphragms: span.diaphragms.map(({ xM, loadKn }) => ({ xM, loadKn })),
  };
}

function surfaceOf({ thicknessMm, unitWeightKnM3, measured, kind }: WearingSurface): WearingSurface {
  return unitWeightKnM3 === undefined ? { thicknessMm, measured, kind } : { thicknessMm, unitWeightKnM3, measured, kind };
}

/**
 * A span's edit form. Every size, load and position is typed in the user's units and held in SI
 * by the inputs; the form is checked with the server's own schema and sent as the version read
 * plus the changed fields.
 */
@Component({
  selector: 'sl-span-form',
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule, MatSelectModule, MatCheckboxModule, MatButtonModule, MatIconModule, MeasureInputDirective],
  templateUrl: './span-form.component.html',
  styleUrl: './edit-form.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SpanFormComponent {
  readonly span = input.required<SpanDetail>();
  readonly saved = output<SpanDetail>();
  readonly cancelled = output<void>();
  /** The user chose to reload after someone else changed the span. */
  readonly reloadRequested = output<void>();

  private readonly client = inject(InventoryClient);
  private readonly formBuilder = inject(NonNullableFormBuilder);

  protected readonly labels = inject(UnitsStore).labels;
  protected readonly problem = PROBLEM;
  protected readonly label = fieldLabel;
  protected readonly sizeFields = SIZE_FIELDS;

  protected readonly form = this.formBuilder.group({
    lengthM: this.measured(),
    girderSpacingMm: this.measured(),
    overhangMm: this.measured(),
    roadwayWidthMm: this.measured(),
    barrierFaceToGirderMm: this.measured(),
    deckThicknessMm: this.measured(),
    haunchMm: this.measured(),
    hasWearingSurface: false,
    wearingSurface: this.formBuilder.group({
      thicknessMm: this.measured(),
      unitWeightKnM3: this.measured(),
      measured: false,
      kind: this.formBuilder.control<WearingSurface['kind']>('overlay'),
    }),
    barriers: this.formBuilder.array<BarrierGroup>([]),
    diaphragms: this.formBuilder.array<DiaphragmGroup>([]),
  });

  protected readonly saving = signal(false);
  protected readonly conflict = signal(false);
  protected readonly formProblems = signal<readonly FieldProblem[]>([]);
  protected readonly failure = signal<string | null>(null);
  protected readonly nothingChanged = signal(false);

  constructor() {
    effect(() => {
      const span = this.span();
      untracked(() => this.startFrom(span));
    });
  }

  protected addBarrier(loadKnM: number | null = null): void {
    this.form.controls.barriers.push(this.formBuilder.group({ loadKnM: this.measured(loadKnM) }));
  }

  protected addDiaphragm(xM: number | null = null, loadKn: number | null = null): void {
    this.form.controls.diaphragms.push(this.formBuilder.group({ xM: this.measured(xM), loadKn: this.measured(loadKn) }));
  }

  protected removeBarrier(index: number): void {
    this.form.controls.barriers.removeAt(index);
  }

  protected removeDiaphragm(index: number): void {
    this.form.controls.diaphragms.removeAt(index);
  }

  protected save(): void {
    this.clearMessages();
    const span = this.span();
    const values = this.formValues();
    const missing = missingValues(this.form, this.requiredFields());
    const checked = spanChange.safeParse({ version: span.version, ...values });
    const problems = [...missing, ...(checked.success ? [] : schemaProblems(checked.error).filter((p) => !missing.some((m) => m.field === p.field)))];
    if (problems.length > 0 || !checked.success) return this.formProblems.set(placeProblems(this.form, problems));

    const change = changedFields(fieldsOf(span), fieldsOf(checked.data as SpanFields));
    if (Object.keys(change).length === 0) {
      this.nothingChanged.set(true);
      return;
    }
    this.saving.set(true);
    this.client.changeSpan(span.id, { version: span.version, ...change }).subscribe({
      next: (updated) => {
        this.saving.set(false);
        this.saved.emit(updated);
      },
      error: (error: unknown) => {
        this.saving.set(false);
        const failure = saveFailureOf(error);
        if (failure.kind === 'conflict') this.conflict.set(true);
        else if (failure.kind === 'fields') this.formProblems.set(placeProblems(this.form, failure.problems));
        else this.failure.set(failure.message);
      },
    });
  }

  protected cancel(): void {
    this.cancelled.emit();
  }

  protected reload(): void {
    this.reloadRequested.emit();
  }

  private measured(value: number | null = null): Measured {
    return this.formBuilder.control<number | null>(value);
  }

  private startFrom(span: SpanDetail): void {
    const { wearingSurface, barriers, diaphragms, ...sizes } = fieldsOf(span);
    this.form.controls.barriers.clear();
    this.form.controls.diaphragms.clear();
    barriers.forEach((barrier) => this.addBarrier(barrier.loadKnM));
    diaphragms.forEach((diaphragm) => this.addDiaphragm(diaphragm.xM, diaphragm.loadKn));
    this.form.reset({
      ...sizes,
      barriers,
      diaphragms,
      hasWearingSurface: wearingSurface !== null,
      wearingSurface: {
        thicknessMm: wearingSurface?.thicknessMm ?? null,
        unitWeightKnM3: wearingSurface?.unitWeightKnM3 ?? null,
        measured: wearingSurface?.measured ?? false,
        kind: wearingSurface?.kind ?? 'overlay',
      },
    });
    this.clearMessages();
  }

  private requiredFields(): string[] {
    const { hasWearingSurface, barriers, diaphragms } = this.form.controls;
    return [
      ...REQUIRED_SIZES,
      ...(hasWearingSurface.value ? ['wearingSurface.thicknessMm'] : []),
      ...barriers.controls.map((_, index) => `barriers.${index}.loadKnM`),
      ...diaphragms.controls.flatMap((_, index) => [`diaphragms.${index}.xM`, `diaphragms.${index}.loadKn`]),
    ];
  }

  /** The form's values as the change body names them, in SI (the inputs hold SI). */
  private formValues(): Record<keyof SpanFields, unknown> {
    const { hasWearingSurface, wearingSurface, ...values } = this.form.getRawValue();
    const { unitWeightKnM3, ...surface } = wearingSurface;
    return {
      ...values,
      wearingSurface: hasWearingSurface ? { ...surface, ...(unitWeightKnM3 === null ? {} : { unitWeightKnM3 }) } : null,
    };
  }

  private clearMessages(): void {
    this.conflict.set(false);
    this.failure.set(null);
    this.formProblems.set([]);
    this.nothingChanged.set(false);
  }
}

/** The fields whose checked value differs from the span as read (lists and the wearing surface compared whole). */
function changedFields(original: SpanFields, checked: SpanFields): Partial<SpanFields> {
  const entries = Object.entries(checked).filter(([field, value]) => JSON.stringify(value) !== JSON.stringify(original[field as keyof SpanFields]));
  return Object.fromEntries(entries) as Partial<SpanFields>;
}
