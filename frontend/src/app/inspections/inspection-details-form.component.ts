import { ChangeDetectionStrategy, Component, effect, inject, input, output, signal, untracked } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { INSPECTION_KINDS, INSPECTION_KIND_NAMES, inspectionChange, type InspectionChange, type InspectionDetail, type InspectionKind } from '@spanledger/shared';

import { FieldProblem, PROBLEM, placeProblems, saveFailureOf, schemaProblems } from '../structures/field-problems';
import { inspectionFieldLabel } from './inspection-text';
import { InspectionsClient } from './inspections.client';

type DetailFields = Required<Omit<InspectionChange, 'version'>>;
type FieldName = keyof DetailFields;

/** Condition ratings run from 9 (excellent) down to 0 (failed); null is "not rated". */
const CONDITION_CHOICES: readonly (number | null)[] = [null, 0, 1, 2, 3, 4, 5, 6, 7, 8, 9];

function fieldsOf(inspection: InspectionDetail): DetailFields {
  return {
    inspectedOn: inspection.inspectedOn,
    kind: inspection.kind,
    deckCondition: inspection.conditions.deck,
    superstructureCondition: inspection.conditions.superstructure,
    substructureCondition: inspection.conditions.substructure,
    notes: inspection.notes,
  };
}

/**
 * The author's form for an inspection's date, kind, condition ratings and notes. Ratings are
 * picked with one tap each; the form is checked with the server's schema and sent as the
 * version read plus the changed fields.
 */
@Component({
  selector: 'sl-inspection-details-form',
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule, MatButtonToggleModule, MatButtonModule, MatIconModule],
  templateUrl: './inspection-details-form.component.html',
  styleUrls: ['../structures/edit-form.scss', './inspection-forms.scss'],
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class InspectionDetailsFormComponent {
  readonly inspection = input.required<InspectionDetail>();
  readonly saved = output<InspectionDetail>();
  /** The user chose to reload after someone else changed the inspection. */
  readonly reloadRequested = output<void>();

  private readonly client = inject(InspectionsClient);
  private readonly formBuilder = inject(NonNullableFormBuilder);

  protected readonly problem = PROBLEM;
  protected readonly label = inspectionFieldLabel;
  protected readonly kinds = INSPECTION_KINDS;
  protected readonly kindNames = INSPECTION_KIND_NAMES;
  protected readonly conditionChoices = CONDITION_CHOICES;
  protected readonly conditionFields = ['deckCondition', 'superstructureCondition', 'substructureCondition'] as const;

  protected readonly form = this.formBuilder.group({
    /** A native date input: "YYYY-MM-DD". */
    inspectedOn: '',
    kind: this.formBuilder.control<InspectionKind>('routine'),
    deckCondition: this.formBuilder.control<number | null>(null),
    superstructureCondition: this.formBuilder.control<number | null>(null),
    substructureCondition: this.formBuilder.control<number | null>(null),
    notes: '',
  });

  protected readonly saving = signal(false);
  protected readonly conflict = signal(false);
  protected readonly formProblems = signal<readonly FieldProblem[]>([]);
  protected readonly failure = signal<string | null>(null);
  protected readonly nothingChanged = signal(false);

  constructor() {
    effect(() => {
      const inspection = this.inspection();
      untracked(() => this.startFrom(inspection));
    });
  }

  protected conditionText(value: number | null): string {
    return value === null ? '—' : String(value);
  }

  protected save(): void {
    this.clearMessages();
    const inspection = this.inspection();
    const values = this.form.getRawValue();
    const checked = inspectionChange.safeParse({ version: inspection.version, ...values });
    if (!checked.success) return this.formProblems.set(placeProblems(this.form, schemaProblems(checked.error)));

    const original = fieldsOf(inspection);
    const change = Object.fromEntries(Object.entries(checked.data).filter(([field, value]) => field !== 'version' && value !== original[field as FieldName]));
    if (Object.keys(change).length === 0) {
      this.nothingChanged.set(true);
      return;
    }
    this.saving.set(true);
    this.client.changeInspection(inspection.id, { version: inspection.version, ...change }).subscribe({
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

  protected reload(): void {
    this.reloadRequested.emit();
  }

  private startFrom(inspection: InspectionDetail): void {
    this.form.reset(fieldsOf(inspection));
    this.clearMessages();
  }

  private clearMessages(): void {
    this.conflict.set(false);
    this.failure.set(null);
    this.formProblems.set([]);
    this.nothingChanged.set(false);
  }
}
