import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { FINDING_KIND_NAMES, FINDING_SEVERITY_NAMES, WIRES_PER_STRAND, type FindingDetail, type PhotoSummary } from '@spanledger/shared';

import { toShownUnits } from '../units/measures';
import { UnitsStore } from '../units/units.store';
import { DISPOSITION_NAMES, strandsText } from './inspection-text';
import { PhotosComponent } from './photos.component';

/** What the inspector may say of a finding carried forward from the register, short of measuring it again. */
export type QuickDisposition = 'confirmed' | 'repaired';

export interface DispositionChoice {
  readonly finding: FindingDetail;
  readonly disposition: QuickDisposition;
}

interface FindingGroup {
  readonly key: string;
  readonly heading: string;
  readonly rows: readonly FindingRow[];
}

interface FindingRow {
  readonly finding: FindingDetail;
  readonly kind: string;
  readonly details: readonly string[];
  readonly extent: string;
  readonly severity: string;
  readonly disposition: string;
  readonly carried: boolean;
  readonly toReview: boolean;
  readonly photos: readonly PhotoSummary[];
  readonly problem: string | null;
}

/**
 * An inspection's findings grouped by span and girder. Findings carried forward from the register
 * ask to be confirmed, measured again (grown) or marked repaired, with one large button each;
 * the author changes or deletes the findings new in this inspection.
 */
@Component({
  selector: 'sl-findings-list',
  imports: [MatButtonModule, MatIconModule, PhotosComponent],
  templateUrl: './findings-list.component.html',
  styleUrls: ['./inspection-forms.scss', './findings-list.component.scss'],
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class FindingsListComponent {
  readonly inspectionId = input.required<number>();
  readonly findings = input.required<readonly FindingDetail[]>();
  readonly photos = input<readonly PhotoSummary[]>([]);
  readonly editable = input(false);
  /** The finding a change is being sent for: its buttons wait. */
  readonly busyFindingId = input<number | null>(null);
  /** Why a finding stops the inspection from being submitted, by finding id. */
  readonly problems = input<ReadonlyMap<number, string>>(new Map());
  readonly dispositionChosen = output<DispositionChoice>();
  readonly grownRequested = output<FindingDetail>();
  readonly editRequested = output<FindingDetail>();
  readonly deleteRequested = output<FindingDetail>();
  readonly photosChanged = output<void>();

  private readonly units = inject(UnitsStore);
  protected readonly confirmingDeleteId = signal<number | null>(null);

  protected readonly groups = computed<readonly FindingGroup[]>(() => {
    const photos = this.photos();
    const problems = this.problems();
    const sorted = [...this.findings()].sort((a, b) => a.spanIndex - b.spanIndex || a.girderNumber - b.girderNumber || a.id - b.id);
    const groups: { key: string; heading: string; rows: FindingRow[] }[] = [];
    for (const finding of sorted) {
      const key = `${finding.spanId}-${finding.girderId}`;
      let group = groups.at(-1);
      if (group?.key !== key) {
        group = { key, heading: `Span ${finding.spanIndex} · Girder ${finding.girderNumber}`, rows: [] };
        groups.push(group);
      }
      group.rows.push({
        finding,
        kind: FINDING_KIND_NAMES[finding.kind],
        details: this.detailsOf(finding),
        extent: `From ${this.units.format('spanLength', finding.fromM)} to ${this.units.format('spanLength', finding.toM, { withUnit: true })} along the span`,
        severity: FINDING_SEVERITY_NAMES[finding.severity],
        disposition: DISPOSITION_NAMES[finding.disposition],
        carried: finding.carriedFromId !== null,
        toReview: finding.disposition === 'to-review',
        photos: photos.filter((photo) => photo.findingId === finding.id),
        problem: problems.get(finding.id) ?? null,
      });
    }
    return groups;
  });

  protected choose(finding: FindingDetail, disposition: QuickDisposition): void {
    this.dispositionChosen.emit({ finding, disposition });
  }

  protected askToDelete(findingId: number): void {
    this.confirmingDeleteId.set(findingId);
  }

  protected keep(): void {
    this.confirmingDeleteId.set(null);
  }

  protected delete(finding: FindingDetail): void {
    this.confirmingDeleteId.set(null);
    this.deleteRequested.emit(finding);
  }

  /** Cracks are tenths of a millimetre wide: finer than the whole millimetres of section sizes. */
  private crackWidthText(widthMm: number): string {
    const system = this.units.system();
    return `${toShownUnits('sectionSize', widthMm, system).toFixed(system === 'si' ? 2 : 3)} ${this.units.labels().sectionSize}`;
  }

  /** The kind's own values, in the user's units. */
  private detailsOf(finding: FindingDetail): string[] {
    const size = (valueMm: number) => this.units.format('sectionSize', valueMm, { withUnit: true });
    return [
      strandsText(finding.strands),
      finding.lossFraction === null ? '' : `${Math.round(finding.lossFraction * 100)} % of each strand's area lost`,
      finding.brokenWires === null ? '' : `${finding.brokenWires} of ${WIRES_PER_STRAND} wires broken in each strand`,
      finding.spall === null ? '' : `Spall ${size(finding.spall.depthMm)} deep, ${size(finding.spall.widthMm)} wide`,
      finding.deckLossMm === null ? '' : `${size(finding.deckLossMm)} of deck lost`,
      finding.crackWidthMm === null ? '' : `Crack ${this.crackWidthText(finding.crackWidthMm)} wide`,
    ].filter((text) => text !== '');
  }
}
