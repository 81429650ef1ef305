import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import type { GirderSummary } from '@spanledger/shared';
import { catchError, map, of, startWith, switchMap } from 'rxjs';

import { describeServerError, serverErrorReport } from '../server-errors/server-error';
import { UnitsStore } from '../units/units.store';
import { InventoryClient } from './inventory.client';

type GirdersState = { readonly kind: 'loading' } | { readonly kind: 'loaded'; readonly girders: readonly GirderSummary[] } | { readonly kind: 'failed'; readonly message: string };

const POSITION_NAMES: Readonly<Record<GirderSummary['position'], string>> = { interior: 'Interior', exterior: 'Exterior' };
const TENSIONING_NAMES: Readonly<Record<GirderSummary['tensioning'], string>> = { pre: 'Pretensioned', post: 'Post-tensioned' };

/** The girders of one span, in girder-number order, with their section and strands in brief; each opens its girder editor. */
@Component({
  selector: 'sl-girders-table',
  imports: [MatTableModule, MatProgressBarModule, RouterLink],
  template: `
    @switch (state().kind) {
      @case ('loading') {
        <mat-progress-bar mode="indeterminate" aria-label="Loading girders" />
      }
      @case ('failed') {
        <p class="message error" role="alert" data-testid="girders-error">The girders could not be loaded. {{ failure() }}</p>
      }
      @default {
        @if (rows().length === 0) {
          <p class="message" data-testid="girders-empty">No girders are recorded for this span yet.</p>
        } @else {
          <div class="table-scroll">
            <table mat-table [dataSource]="rows()" class="girders" data-testid="girders-table" aria-label="Girders">
              <ng-container matColumnDef="number">
                <th mat-header-cell *matHeaderCellDef scope="col">Girder</th>
                <td mat-cell *matCellDef="let row">
                  <a class="girder-link" data-testid="girder-link" [routerLink]="['/girders', row.id]" [attr.aria-label]="'Open girder ' + row.girderNumber">{{ row.girderNumber }}</a>
                </td>
              </ng-container>
              <ng-container matColumnDef="position">
                <th mat-header-cell *matHeaderCellDef scope="col">Position</th>
                <td mat-cell *matCellDef="let row">{{ row.position }}</td>
              </ng-container>
              <ng-container matColumnDef="section">
                <th mat-header-cell *matHeaderCellDef scope="col">Girder type</th>
                <td mat-cell *matCellDef="let row">{{ row.section }}</td>
              </ng-container>
              <ng-container matColumnDef="strandRows">
                <th mat-header-cell *matHeaderCellDef scope="col" class="number">Strand rows</th>
                <td mat-cell *matCellDef="let row" class="number">{{ row.strandRowCount }}</td>
              </ng-container>
              <ng-container matColumnDef="strands">
                <th mat-header-cell *matHeaderCellDef scope="col" class="number">Strands</th>
                <td mat-cell *matCellDef="let row" class="number">{{ row.strandCount }}</td>
              </ng-container>
              <ng-container matColumnDef="harped">
                <th mat-header-cell *matHeaderCellDef scope="col">Harped</th>
                <td mat-cell *matCellDef="let row">{{ row.harped }}</td>
              </ng-container>
              <ng-container matColumnDef="debonded">
                <th mat-header-cell *matHeaderCellDef scope="col">Debonded</th>
                <td mat-cell *matCellDef="let row">{{ row.debonded }}</td>
              </ng-container>
              <ng-container matColumnDef="strength">
                <th mat-header-cell *matHeaderCellDef scope="col" class="number">f′c ({{ units.labels().strength }})</th>
                <td mat-cell *matCellDef="let row" class="number">{{ row.concreteStrength }}</td>
              </ng-container>
              <ng-container matColumnDef="tensioning">
                <th mat-header-cell *matHeaderCellDef scope="col">Tensioning</th>
                <td mat-cell *matCellDef="let row">{{ row.tensioning }}</td>
              </ng-container>
              <tr mat-header-row *matHeaderRowDef="columns"></tr>
              <tr mat-row *matRowDef="let row; columns: columns" data-testid="girder-row" [attr.data-girder-number]="row.girderNumber"></tr>
            </table>
          </div>
        }
      }
    }
  `,
  styleUrl: './inventory-table.scss',
  // A tap target a finger can hit on a tablet.
  styles: `
    .girder-link {
      display: inline-flex;
      align-items: center;
      min-width: 44px;
      min-height: 44px;
      font-weight: 700;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class GirdersTableComponent {
  readonly spanId = input.required<number>();

  protected readonly units = inject(UnitsStore);
  private readonly client = inject(InventoryClient);
  protected readonly columns = ['number', 'position', 'section', 'strandRows', 'strands', 'harped', 'debonded', 'strength', 'tensioning'];

  protected readonly state = toSignal(
    toObservable(this.spanId).pipe(
      switchMap((spanId) =>
        this.client.fetchGirders(spanId).pipe(
          map((girders): GirdersState => ({ kind: 'loaded', girders })),
          catchError((error: unknown) => of<GirdersState>({ kind: 'failed', message: failureText(error) })),
          startWith<GirdersState>({ kind: 'loading' }),
        ),
      ),
    ),
    { initialValue: { kind: 'loading' } as GirdersState },
  );

  protected readonly failure = computed(() => {
    const state = this.state();
    return state.kind === 'failed' ? state.message : '';
  });

  protected readonly rows = computed(() => {
    const state = this.state();
    if (state.kind !== 'loaded') return [];
    return state.girders.map((girder) => ({
      id: girder.id,
      girderNumber: girder.girderNumber,
      position: POSITION_NAMES[girder.position],
      section: girder.girderTypeName ?? 'Custom section',
      strandRowCount: girder.strandRowCount,
      strandCount: girder.strandCount,
      harped: girder.harped ? 'Yes' : 'No',
      debonded: girder.debonded ? 'Yes' : 'No',
      concreteStrength: this.units.format('strength', girder.concreteStrengthMpa),
      tensioning: TENSIONING_NAMES[girder.tensioning],
    }));
  });
}

function failureText(error: unknown): string {
  return error instanceof HttpErrorResponse ? describeServerError(serverErrorReport(error)) : String(error);
}
