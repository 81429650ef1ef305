import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { IMPORT_STATE_NAMES, type ImportSummary } from '@spanledger/shared';

import { momentText } from '../ratings/rating-text';
import { problemsReportUrl } from './imports.client';
import { countsSummary, problemCountText } from './imports-text';

/** The import history as the server sends it, newest first; each row opens that import's check. */
@Component({
  selector: 'sl-import-history',
  imports: [MatTableModule, RouterLink],
  templateUrl: './import-history.component.html',
  styleUrls: ['../structures/inventory-table.scss', './import-state-chip.scss', './import-history.component.scss'],
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ImportHistoryComponent {
  readonly imports = input.required<readonly ImportSummary[]>();
  /** The import open above the history, marked in its row. */
  readonly openedId = input<number | null>(null);

  /** The import's number first: the check, a refusal of the same bytes and the history's entries all name an import by it. */
  protected readonly columns = ['number', 'file', 'uploadedBy', 'uploadedAt', 'state', 'counts', 'problems', 'open'];

  protected readonly rows = computed(() =>
    this.imports().map((each) => ({
      id: each.id,
      fileName: each.fileName,
      uploadedBy: each.uploaded.by ?? '—',
      uploadedAt: momentText(each.uploaded.at),
      state: each.state,
      stateName: IMPORT_STATE_NAMES[each.state],
      counts: countsSummary(each.counts),
      problemCount: each.problemCount,
      problemsText: each.problemCount === 0 ? 'None' : problemCountText(each.problemCount),
      reportUrl: problemsReportUrl(each.id),
      opened: each.id === this.openedId(),
    })),
  );
}
