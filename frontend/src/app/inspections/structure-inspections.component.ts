import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { Router, RouterLink } from '@angular/router';
import { INSPECTION_KIND_NAMES, INSPECTION_STATE_NAMES, canInDistrict, newInspection, type InspectionSummary } from '@spanledger/shared';

import { loadedList } from '../server-errors/loaded-list';
import { schemaProblems, saveFailureOf } from '../structures/field-problems';
import { SessionStore } from '../session/session.store';
import { inspectionDay, inspectionFieldLabel, localToday } from './inspection-text';
import { InspectionsClient } from './inspections.client';

/**
 * A structure's inspections, newest first, each opening its page; an inspector of the district
 * starts a new one here (a routine inspection dated today, both changeable on its page).
 */
@Component({
  selector: 'sl-structure-inspections',
  imports: [MatTableModule, MatButtonModule, MatIconModule, MatProgressBarModule, RouterLink],
  templateUrl: './structure-inspections.component.html',
  styleUrls: ['../structures/inventory-table.scss', './structure-inspections.component.scss'],
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StructureInspectionsComponent {
  readonly structureId = input.required<number>();
  readonly district = input.required<string>();

  private readonly client = inject(InspectionsClient);
  private readonly session = inject(SessionStore);
  private readonly router = inject(Router);

  protected readonly columns = ['date', 'kind', 'state', 'inspector', 'findings', 'critical'];
  protected readonly starting = signal(false);
  protected readonly startFailure = signal<string | null>(null);

  private readonly list = loadedList(this.structureId, (structureId) => this.client.fetchInspectionsOfStructure(structureId), failureText);
  protected readonly loading = this.list.loading;
  protected readonly failure = this.list.failure;
  private readonly inspections = this.list.items;

  protected readonly rows = computed(() =>
    this.inspections().map((inspection) => ({
      id: inspection.id,
      date: inspectionDay(inspection.inspectedOn),
      kind: INSPECTION_KIND_NAMES[inspection.kind],
      state: inspection.state,
      stateName: INSPECTION_STATE_NAMES[inspection.state],
      inspector: inspection.inspectorName,
      findings: inspection.findingCount,
      critical: inspection.criticalCount,
    })),
  );

  /** A structure has one inspection being written at a time; the server refuses a second. */
  protected readonly inProgress = computed(() => this.inspections().find((inspection) => inspection.state === 'draft' || inspection.state === 'returned') ?? null);

  protected readonly canStart = computed(() => {
    const user = this.session.user();
    return !!user && canInDistrict(user, 'editOwnInspections', this.district());
  });

  protected readonly inProgressText = computed(() => {
    const inspection = this.inProgress();
    return inspection ? `${inspection.inspectorName}'s inspection of ${inspectionDay(inspection.inspectedOn)} is still being written (${INSPECTION_STATE_NAMES[inspection.state].toLowerCase()}): open it above. A new one can start once it is submitted.` : '';
  });

  protected start(): void {
    this.startFailure.set(null);
    const checked = newInspection.safeParse({ inspectedOn: localToday(), kind: 'routine' });
    if (!checked.success) {
      this.startFailure.set(schemaProblems(checked.error).map((problem) => `${inspectionFieldLabel(problem.field)}: ${problem.message}`).join('; '));
      return;
    }
    this.starting.set(true);
    this.client.startInspection(this.structureId(), checked.data).subscribe({
      next: (inspection) => {
        this.starting.set(false);
        void this.router.navigate(['/inspections', inspection.id]);
      },
      error: (error: unknown) => {
        this.starting.set(false);
        this.startFailure.set(failureText(error));
      },
    });
  }
}

function failureText(error: unknown): string {
  const failure = saveFailureOf(error);
  if (failure.kind === 'fields') return failure.problems.map((problem) => `${inspectionFieldLabel(problem.field)}: ${problem.message}`).join('; ');
  return failure.kind === 'conflict' ? 'The structure changed meanwhile; reload the page.' : failure.message;
}
