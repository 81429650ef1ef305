import { ChangeDetectionStrategy, Component, computed, effect, inject, input, output, signal, untracked } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import {
  FINDING_KIND_NAMES,
  RATING_CONCRETE_MODELS,
  RATING_CONCRETE_MODEL_NAMES,
  RATING_STRAND_CURVES,
  RATING_STRAND_CURVE_NAMES,
  ratingRun,
  type AppliedFinding,
  type HypotheticalDamage,
  type RatingRun,
  type RatingSetup,
  type StrandRow,
} from '@spanledger/shared';

import { GirdersClient } from '../girders/girders.client';
import { schemaProblems, type FieldProblem } from '../structures/field-problems';
import { MeasureInputDirective } from '../units/measure-input.directive';
import { whatIfText } from './rating-text';
import { UnitsStore } from '../units/units.store';

/** Vehicles a new rating checks unless the rater changes it: the design load and the legal loads. */
const DEFAULT_CATEGORIES = new Set(['design', 'legal']);

/**
 * The choices of a rating run: girders, vehicles, policy and capacity method; the span's open
 * findings, each applied unless excluded with a reason; and what-if damage, marked hypothetical.
 * Emits a run the shared schema accepts.
 */
@Component({
  selector: 'sl-rating-choices',
  imports: [ReactiveFormsModule, MatButtonModule, MatCheckboxModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule, MeasureInputDirective],
  templateUrl: './rating-choices.component.html',
  styleUrl: './rating-choices.component.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RatingChoicesComponent {
  readonly setup = input.required<RatingSetup>();
  /** The run of the record being run again; a new rating starts from the defaults. */
  readonly previousRun = input<RatingRun | null>(null);
  readonly busy = input(false);
  readonly actionLabel = input('Run the rating');
  readonly run = output<RatingRun>();

  private readonly girders = inject(GirdersClient);
  private readonly units = inject(UnitsStore);
  private readonly formBuilder = inject(NonNullableFormBuilder);

  protected readonly curves = RATING_STRAND_CURVES.map((id) => ({ id, name: RATING_STRAND_CURVE_NAMES[id] }));
  protected readonly concreteModels = RATING_CONCRETE_MODELS.map((id) => ({ id, name: RATING_CONCRETE_MODEL_NAMES[id] }));
  protected readonly kindNames = FINDING_KIND_NAMES;
  protected readonly lengthUnit = computed(() => this.units.labels().spanLength);

  protected readonly form = this.formBuilder.group({
    girderIds: this.formBuilder.control<number[]>([]),
    vehicleIds: this.formBuilder.control<string[]>([]),
    policyId: this.formBuilder.control(''),
    strandCurve: this.formBuilder.control<RatingRun['strandCurve']>('power'),
    concreteModel: this.formBuilder.control<RatingRun['concreteModel']>('whitney'),
    notes: this.formBuilder.control(''),
  });
  /** Reasons by finding id, for the open findings the rater leaves out. */
  protected readonly exclusions = signal<ReadonlyMap<number, string>>(new Map());
  protected readonly whatIfs = signal<readonly HypotheticalDamage[]>([]);
  protected readonly problems = signal<readonly FieldProblem[]>([]);

  protected readonly whatIfForm = this.formBuilder.group({
    girderId: this.formBuilder.control<number | null>(null),
    rowId: this.formBuilder.control(''),
    count: this.formBuilder.control<number | null>(1),
    fromM: this.formBuilder.control<number | null>(null),
    toM: this.formBuilder.control<number | null>(null),
    note: this.formBuilder.control(''),
  });
  protected readonly whatIfRows = signal<readonly StrandRow[]>([]);
  protected readonly addingWhatIf = signal(false);

  protected readonly vehicleGroups = computed(() => {
    const groups = new Map<string, RatingSetup['vehicles'][number][]>();
    for (const vehicle of this.setup().vehicles) {
      const category = vehicle.category ?? 'other';
      groups.set(category, [...(groups.get(category) ?? []), vehicle]);
    }
    return [...groups].map(([category, vehicles]) => ({ category, vehicles }));
  });

  protected readonly findings = computed(() =>
    this.setup().openFindings.map((finding) => ({
      ...finding,
      text: findingText(finding),
      place: `${this.units.format('spanLength', finding.fromM)}–${this.units.format('spanLength', finding.toM, { withUnit: true })}`,
      modelled: finding.damageEntry !== null,
    })),
  );

  protected readonly whatIfTexts = computed(() => {
    const length = (metres: number) => this.units.format('spanLength', metres, { withUnit: true });
    return this.whatIfs().map((whatIf) => whatIfText(whatIf, this.setup().girders.find((each) => each.id === whatIf.girderId)?.girderNumber, length));
  });

  constructor() {
    effect(() => {
      const setup = this.setup();
      const previous = this.previousRun();
      untracked(() => this.startFrom(setup, previous));
    });
  }

  private startFrom(setup: RatingSetup, previous: RatingRun | null): void {
    const defaultPolicy = setup.policies[0]?.id ?? '';
    this.form.setValue({
      girderIds: previous?.girderIds ? [...previous.girderIds] : setup.girders.map((girder) => girder.id),
      vehicleIds: previous ? [...previous.vehicleIds] : setup.vehicles.filter((vehicle) => DEFAULT_CATEGORIES.has(vehicle.category ?? '')).map((vehicle) => vehicle.id),
      policyId: previous?.policyId ?? defaultPolicy,
      strandCurve: previous?.strandCurve ?? 'power',
      concreteModel: previous?.concreteModel ?? 'whitney',
      notes: previous?.notes ?? '',
    });
    this.exclusions.set(new Map((previous?.exclusions ?? []).map((exclusion) => [exclusion.findingId, exclusion.reason])));
    this.whatIfs.set(previous?.hypothetical ?? []);
  }

  protected isExcluded(findingId: number): boolean {
    return this.exclusions().has(findingId);
  }

  protected exclusionReason(findingId: number): string {
    return this.exclusions().get(findingId) ?? '';
  }

  protected setExcluded(findingId: number, excluded: boolean): void {
    const next = new Map(this.exclusions());
    if (excluded) next.set(findingId, next.get(findingId) ?? '');
    else next.delete(findingId);
    this.exclusions.set(next);
  }

  protected setReason(findingId: number, reason: string): void {
    this.exclusions.set(new Map(this.exclusions()).set(findingId, reason));
  }

  protected openWhatIf(): void {
    this.addingWhatIf.set(true);
    this.whatIfForm.reset({ girderId: null, rowId: '', count: 1, fromM: null, toM: null, note: '' });
    this.whatIfRows.set([]);
  }

  /** The strand rows of the girder chosen for a what-if entry, lowest first. */
  protected chooseWhatIfGirder(girderId: number): void {
    this.whatIfRows.set([]);
    this.girders.fetchGirder(girderId).subscribe((girder) => {
      const rows = [...girder.strandRows].sort((a, b) => a.yMm - b.yMm);
      this.whatIfRows.set(rows);
      this.whatIfForm.controls.rowId.setValue(rows[0]?.id ?? '');
    });
  }

  protected addWhatIf(): void {
    const { girderId, rowId, count, fromM, toM, note } = this.whatIfForm.getRawValue();
    if (girderId === null || !rowId || count === null) return;
    const entry = { kind: 'lost-strands' as const, rowId, count, ...(fromM !== null ? { fromM } : {}), ...(toM !== null ? { toM } : {}) };
    this.whatIfs.set([...this.whatIfs(), { girderId, entry, note }]);
    this.addingWhatIf.set(false);
  }

  protected removeWhatIf(index: number): void {
    this.whatIfs.set(this.whatIfs().filter((_, each) => each !== index));
  }

  protected submit(): void {
    const value = this.form.getRawValue();
    const checked = ratingRun.safeParse({
      ...value,
      exclusions: [...this.exclusions()].map(([findingId, reason]) => ({ findingId, reason })),
      hypothetical: this.whatIfs(),
    });
    if (!checked.success) {
      this.problems.set(schemaProblems(checked.error));
      return;
    }
    this.problems.set([]);
    this.run.emit(checked.data);
  }

  protected readonly problemTexts = computed(() => this.problems().map(choiceProblemText));
}

function findingText(finding: AppliedFinding): string {
  const entry = finding.damageEntry;
  const strands = entry && 'rowId' in entry ? `, row ${entry.rowId}: ${entry.strands ? `strands ${entry.strands.join(', ')}` : `${entry.count} strands`}` : '';
  return `Girder ${finding.girderNumber} · ${FINDING_KIND_NAMES[finding.kind]}${strands}`;
}

const FIELD_LABELS: Readonly<Record<string, string>> = {
  girderIds: 'Girders',
  vehicleIds: 'Vehicles',
  policyId: 'Rating policy',
  strandCurve: 'Strand curve',
  concreteModel: 'Concrete model',
  exclusions: 'Excluded finding',
  notes: 'Notes',
};

/**
 * A problem with a run, from the schema or the server, in words a rater reads: findings and
 * girders are named in the message itself; what-if entries by their place in the list.
 */
export function choiceProblemText(problem: FieldProblem): string {
  const [head, index] = problem.field.split('.');
  if (head === 'findings' || head === 'girders') return problem.message;
  if (head === 'hypothetical') return `What-if damage ${Number(index) + 1}: ${problem.message}`;
  return `${FIELD_LABELS[head ?? ''] ?? problem.field}: ${problem.message}`;
}
