import { ChangeDetectionStrategy, Component, computed, effect, inject, input, output, signal, untracked } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import {
  STRUCTURE_STATUSES,
  STRUCTURE_STATUS_NAMES,
  canInDistrict,
  structureChange,
  type StructureChange,
  type StructureDetail,
  type StructureStatus,
} from '@spanledger/shared';
import { catchError, of } from 'rxjs';

import { SessionStore } from '../session/session.store';
import { FieldProblem, PROBLEM, missingValues, placeProblems, saveFailureOf, schemaProblems } from './field-problems';
import { fieldLabel } from './inventory-fields';
import { InventoryClient } from './inventory.client';

type StructureFields = Omit<StructureChange, 'version'>;
type FieldName = keyof StructureFields;

/** Numbers a structure always has; the others may be left empty (not recorded). */
const REQUIRED_NUMBERS: readonly FieldName[] = ['longitude', 'latitude', 'skewDeg'];

/** The structure as the change body names its fields. */
function fieldsOf(structure: StructureDetail): Required<StructureFields> {
  return {
    structureNumber: structure.structureNumber,
    name: structure.name,
    routeCarried: structure.routeCarried,
    featureCrossed: structure.featureCrossed,
    district: structure.district,
    longitude: structure.longitude,
    latitude: structure.latitude,
    yearBuilt: structure.yearBuilt,
    yearLastMajorWork: structure.yearLastMajorWork,
    adt: structure.adt,
    adtt: structure.adtt,
    skewDeg: structure.skewDeg,
    deckCondition: structure.conditions.deck,
    superstructureCondition: structure.conditions.superstructure,
    substructureCondition: structure.conditions.substructure,
    conditionRatedOn: structure.conditions.ratedOn,
    status: structure.status,
    notes: structure.notes,
  };
}

/**
 * The structure's edit form: checked with the server's own schema before sending, then sent as
 * the version read plus the changed fields. A stale version offers a reload; bad fields are
 * shown under their inputs with the server's words.
 */
@Component({
  selector: 'sl-structure-form',
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule, MatSelectModule, MatButtonModule, MatIconModule],
  templateUrl: './structure-form.component.html',
  styleUrl: './edit-form.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StructureFormComponent {
  readonly structure = input.required<StructureDetail>();
  readonly saved = output<StructureDetail>();
  readonly cancelled = output<void>();
  /** The user chose to reload after someone else changed the structure. */
  readonly reloadRequested = output<void>();

  private readonly client = inject(InventoryClient);
  private readonly session = inject(SessionStore);
  private readonly formBuilder = inject(NonNullableFormBuilder);

  protected readonly problem = PROBLEM;
  protected readonly label = fieldLabel;
  protected readonly statuses = STRUCTURE_STATUSES;
  protected readonly statusNames = STRUCTURE_STATUS_NAMES;
  protected readonly identityFields = ['structureNumber', 'name', 'routeCarried', 'featureCrossed'] as const;
  protected readonly coordinateFields = ['longitude', 'latitude'] as const;
  protected readonly wholeNumberFields = ['yearBuilt', 'yearLastMajorWork', 'adt', 'adtt'] as const;
  protected readonly conditionFields = ['deckCondition', 'superstructureCondition', 'substructureCondition'] as const;

  protected readonly form = this.formBuilder.group({
    structureNumber: '',
    name: '',
    routeCarried: '',
    featureCrossed: '',
    district: '',
    longitude: this.formBuilder.control<number | null>(null),
    latitude: this.formBuilder.control<number | null>(null),
    yearBuilt: this.formBuilder.control<number | null>(null),
    yearLastMajorWork: this.formBuilder.control<number | null>(null),
    adt: this.formBuilder.control<number | null>(null),
    adtt: this.formBuilder.control<number | null>(null),
    skewDeg: this.formBuilder.control<number | null>(null),
    deckCondition: this.formBuilder.control<number | null>(null),
    superstructureCondition: this.formBuilder.control<number | null>(null),
    substructureCondition: this.formBuilder.control<number | null>(null),
    /** A native date input: "YYYY-MM-DD", or empty for no date. */
    conditionRatedOn: '',
    status: this.formBuilder.control<StructureStatus>('open'),
    notes: '',
  });

  protected readonly saving = signal(false);
  protected readonly conflict = signal(false);
  /** Problems no single input shows, and failures that are not about fields. */
  protected readonly formProblems = signal<readonly FieldProblem[]>([]);
  protected readonly failure = signal<string | null>(null);
  protected readonly nothingChanged = signal(false);

  private readonly districts = toSignal(this.client.fetchDistricts().pipe(catchError(() => of<string[]>([]))), { initialValue: [] });
  /** Districts the structure may move to: those the user may edit in, and always the one it is in. */
  protected readonly districtChoices = computed(() => {
    const user = this.session.user();
    const current = this.structure().district;
    const allowed = user ? this.districts().filter((district) => canInDistrict(user, 'editInventory', district)) : [];
    return [...new Set([current, ...allowed])].sort((a, b) => a.localeCompare(b));
  });

  /** The status says whether a structure is posted or closed: a posting decision, which only managers make. */
  protected readonly mayDecideStatus = computed(() => {
    const user = this.session.user();
    return user != null && canInDistrict(user, 'decidePostings', this.structure().district);
  });

  constructor() {
    effect(() => {
      const structure = this.structure();
      untracked(() => this.startFrom(structure));
    });
    effect(() => {
      const status = this.form.controls.status;
      if (this.mayDecideStatus()) status.enable();
      else status.disable();
    });
  }

  protected save(): void {
    this.clearMessages();
    const structure = this.structure();
    const values = this.formValues();
    const missing = missingValues(this.form, REQUIRED_NUMBERS);
    const checked = structureChange.safeParse({ version: structure.version, ...values });
    const problems = [...missing, ...(checked.success ? [] : schemaProblems(checked.error).filter((p) => !missing.some((m) => m.field === p.field)))];
    if (problems.length > 0) return this.showProblems(problems);
    if (!checked.success) return;

    const change = changedFields(fieldsOf(structure), checked.data);
    if (Object.keys(change).length === 0) {
      this.nothingChanged.set(true);
      return;
    }
    this.saving.set(true);
    this.client.changeStructure(structure.id, { version: structure.version, ...change }).subscribe({
      next: (updated) => {
        this.saving.set(false);
        this.saved.emit(updated);
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

  protected cancel(): void {
    this.cancelled.emit();
  }

  protected reload(): void {
    this.reloadRequested.emit();
  }

  private startFrom(structure: StructureDetail): void {
    const fields = fieldsOf(structure);
    this.form.reset({ ...fields, conditionRatedOn: fields.conditionRatedOn ?? '' });
    this.clearMessages();
  }

  /** The form's values as the change body names and types them. */
  private formValues(): StructureFields {
    const values = this.form.getRawValue();
    return { ...values, conditionRatedOn: values.conditionRatedOn === '' ? null : values.conditionRatedOn } as StructureFields;
  }

  private showProblems(problems: readonly FieldProblem[]): void {
    this.formProblems.set(placeProblems(this.form, problems));
  }

  private clearMessages(): void {
    this.conflict.set(false);
    this.failure.set(null);
    this.formProblems.set([]);
    this.nothingChanged.set(false);
  }
}

/** The fields whose checked value differs from the structure as read. */
function changedFields(original: Required<StructureFields>, checked: StructureFields): StructureFields {
  const entries = Object.entries(checked).filter(([field, value]) => value !== undefined && value !== original[field as FieldName]);
  return Object.fromEntries(entries) as StructureFields;
}
