import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { IMPORT_STATE_NAMES, type ImportDetail } from '@spanledger/shared';

import { momentText } from '../ratings/rating-text';
import { problemsReportUrl } from './imports.client';
import { countText, countsRows, countsSummary, problemColumnText, problemCountText, problemValueText, refusedText, type ImportStep } from './imports-text';

/**
 * One import's check: what each template's rows would do, every problem by sheet, row, column and
 * value, and the next step — commit a clean file, set it aside, follow a commit as it runs, or the
 * outcome once it has run.
 */
@Component({
  selector: 'sl-import-check',
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule, MatTableModule, RouterLink],
  templateUrl: './import-check.component.html',
  styleUrls: ['../structures/inventory-table.scss', './import-state-chip.scss', './import-check.component.scss'],
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ImportCheckComponent {
  readonly detail = input.required<ImportDetail>();
  /** The step the page is waiting on the server for, if any: both buttons wait with it. */
  readonly busyStep = input<ImportStep | null>(null);
  readonly stepFailure = input<string | null>(null);
  /** Set while the progress of a running commit could not be read; the page keeps asking. */
  readonly progressTrouble = input<string | null>(null);
  readonly commit = output<void>();
  readonly discard = output<void>();

  protected readonly countColumns = ['template', 'rows', 'create', 'update', 'unchanged', 'refused'];
  protected readonly problemColumns = ['sheet', 'row', 'column', 'value', 'message'];
  /** The network map, showing only the structures with a span due for re-rating. */
  protected readonly reratingDueFilter = { reratingDue: 'true' };

  protected readonly stateName = computed(() => IMPORT_STATE_NAMES[this.detail().state]);
  protected readonly uploadedText = computed(() => {
    const { uploaded } = this.detail();
    return `Uploaded ${momentText(uploaded.at)}${uploaded.by ? ` by ${uploaded.by}` : ''}`;
  });
  protected readonly counts = computed(() =>
    countsRows(this.detail().counts).map((row) => ({
      ...row,
      // Every row of the template in the file; a check kept before they were counted has only those judged against the register.
      rowsText: countText(row.fileRows ?? row.rows),
      createText: countText(row.create),
      updateText: countText(row.update),
      unchangedText: countText(row.unchanged),
      refusedText: refusedText(row),
    })),
  );
  protected readonly problems = computed(() =>
    this.detail().problems.map((problem) => ({ ...problem, columnText: problemColumnText(problem.column), valueText: problemValueText(problem.value) })),
  );
  protected readonly problemsText = computed(() => problemCountText(this.detail().problemCount));
  protected readonly listedText = computed(() => `Only the first ${countText(this.detail().problems.length)} of ${countText(this.detail().problemCount)} problems are listed here; the error report has every one.`);
  protected readonly reportUrl = computed(() => problemsReportUrl(this.detail().id));

  protected readonly busy = computed(() => this.busyStep() !== null);
  /** Why Commit is not offered, in plain words; null when it is. */
  protected readonly commitBlocked = computed(() => {
    const detail = this.detail();
    if (detail.allowed.commit) return null;
    if (detail.problemCount > 0) return `The file has ${problemCountText(detail.problemCount)}, so none of it can be imported. Fix the file and upload it again.`;
    return 'Only the person who uploaded this file may commit it or set it aside.';
  });

  protected readonly progress = computed(() => {
    const progress = this.detail().progress;
    if (!progress) return { percent: 0, text: 'Importing: starting…' };
    const percent = progress.total > 0 ? Math.round((100 * progress.done) / progress.total) : 0;
    return { percent, text: `Importing: ${countText(progress.done)} of ${countText(progress.total)} rows written (${percent} %)` };
  });

  protected readonly committedText = computed(() => {
    const detail = this.detail();
    const when = detail.committed ? ` ${momentText(detail.committed.at)}` : '';
    return `Imported${when}. ${countsSummary(detail.counts)}.`;
  });

  protected onCommit(): void {
    if (!this.busy()) this.commit.emit();
  }

  protected onDiscard(): void {
    if (!this.busy()) this.discard.emit();
  }
}
