import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatTableModule } from '@angular/material/table';
import { FINDING_KIND_NAMES, type RatingDetail } from '@spanledger/shared';

import { UnitsStore } from '../units/units.store';
import { RatingChartComponent } from './rating-chart.component';
import { previousRecordText, ratingCaseText, ratingChangeText, ratingFactorText, whatIfText } from './rating-text';

interface Figure {
  readonly key: string;
  readonly label: string;
  readonly value: string;
  readonly change: string | null;
  readonly belowOne: boolean;
}

/**
 * What a rating record found: the lowest legal-load and design-inventory factors against the
 * rating of record, each girder's rating factors by vehicle and limit state with the controlling
 * ones marked, the girder's capacity along the span, its strand-loss margin, the damage applied
 * and the engine's warnings.
 */
@Component({
  selector: 'sl-rating-results',
  imports: [MatTableModule, MatButtonToggleModule, RatingChartComponent],
  templateUrl: './rating-results.component.html',
  styleUrls: ['../structures/inventory-table.scss', './rating-results.component.scss'],
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RatingResultsComponent {
  readonly rating = input.required<RatingDetail>();

  private readonly units = inject(UnitsStore);

  protected readonly columns = ['girder', 'vehicle', 'case', 'ratingFactor', 'at'];
  protected readonly chosenGirderId = signal<number | null>(null);

  constructor() {
    // A new record opens on the girder that controls its lowest legal (else any) rating.
    effect(() => {
      const rating = this.rating();
      untracked(() => {
        const controlling = rating.results.find((row) => row.controlling && row.level === 'legal') ?? rating.results.find((row) => row.controlling);
        const known = rating.girders.some((girder) => girder.girderId === this.chosenGirderId());
        if (!known) this.chosenGirderId.set(controlling?.girderId ?? rating.girders[0]?.girderId ?? null);
      });
    });
  }

  protected readonly figures = computed<readonly Figure[]>(() => {
    const rating = this.rating();
    const before = rating.previousRecord;
    return [
      {
        key: 'lowestLegalRf',
        label: 'Lowest legal-load rating factor',
        value: ratingFactorText(rating.lowestLegalRf),
        change: before ? ratingChangeText(rating.lowestLegalRf, before.lowestLegalRf) : null,
        belowOne: rating.lowestLegalRf !== null && rating.lowestLegalRf < 1,
      },
      {
        key: 'lowestInventoryRf',
        label: 'Design inventory rating factor',
        value: ratingFactorText(rating.lowestInventoryRf),
        change: before ? ratingChangeText(rating.lowestInventoryRf, before.lowestInventoryRf) : null,
        belowOne: rating.lowestInventoryRf !== null && rating.lowestInventoryRf < 1,
      },
    ];
  });

  protected readonly previousText = computed(() => previousRecordText(this.rating().previousRecord));

  private readonly vehicleNames = computed(() => new Map(this.rating().vehicles.map((vehicle) => [vehicle.id, vehicle.name])));

  protected readonly rows = computed(() =>
    this.rating().results.map((row) => ({
      key: `${row.girderId}/${row.vehicle}/${row.level}/${row.limitState}`,
      girder: `Girder ${row.girderNumber}`,
      vehicle: this.vehicleNames().get(row.vehicle) ?? row.vehicle,
      case: ratingCaseText(row),
      ratingFactor: ratingFactorText(row.ratingFactor),
      belowOne: row.ratingFactor < 1,
      at: this.units.format('spanLength', row.xM, { withUnit: true }),
      controlling: row.controlling,
    })),
  );

  protected readonly girderChoices = computed(() => this.rating().girders.map((girder) => ({ id: girder.girderId, label: `Girder ${girder.girderNumber}` })));
  protected readonly chosenGirder = computed(() => this.rating().girders.find((girder) => girder.girderId === this.chosenGirderId()) ?? null);
  protected readonly chartVehicleNames = computed<Readonly<Record<string, string>>>(() => Object.fromEntries(this.vehicleNames()));

  /** The strand-loss margin of the chosen girder, in words. */
  protected readonly marginText = computed(() => {
    const margin = this.chosenGirder()?.output.summary.strandLossMargin;
    if (!margin) return 'No strand-loss margin: the run rates no legal load, or its strands are too near where their bond begins.';
    if (margin.count === null) return margin.note ?? 'The strand-loss margin could not be found.';
    if (margin.count === 0) return 'No margin: a legal-load rating factor is already below 1.0.';
    const strands = margin.strands.map((strand) => `row ${strand.rowId} strand ${strand.index}`).join(', ');
    const at = margin.atXM === null ? '' : ` at ${this.units.format('spanLength', margin.atXM, { withUnit: true })}`;
    return `${margin.count} more strand${margin.count === 1 ? '' : 's'} could break${at} before a legal-load rating factor falls below 1.0 (${strands}).`;
  });

  protected readonly appliedFindings = computed(() =>
    this.rating().appliedFindings.map((finding) => ({
      id: finding.findingId,
      text: `Girder ${finding.girderNumber} · ${FINDING_KIND_NAMES[finding.kind]}, ${this.units.format('spanLength', finding.fromM)}–${this.units.format('spanLength', finding.toM, { withUnit: true })} (inspected ${finding.inspectedOn})`,
      state: finding.excludedReason !== null ? `Left out: ${finding.excludedReason}` : finding.damageEntry === null ? 'No modelled effect on flexure' : 'Applied',
      excluded: finding.excludedReason !== null,
    })),
  );

  protected readonly whatIfTexts = computed(() => {
    const length = (metres: number) => this.units.format('spanLength', metres, { withUnit: true });
    return this.rating().run.hypothetical.map((whatIf) => whatIfText(whatIf, this.rating().girders.find((each) => each.girderId === whatIf.girderId)?.girderNumber, length));
  });
}
