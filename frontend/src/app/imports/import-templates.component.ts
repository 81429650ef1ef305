import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { IMPORT_TEMPLATES, IMPORT_TEMPLATE_NAMES, type ImportTemplateName } from '@spanledger/shared';

import { TEMPLATE_WORKBOOK_URL, templateDownloadUrl } from './imports.client';

/** The empty templates to fill in, each as CSV and as XLSX; those the user's role may not import are marked. */
@Component({
  selector: 'sl-import-templates',
  imports: [MatButtonModule, MatIconModule],
  templateUrl: './import-templates.component.html',
  styleUrl: './import-templates.component.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ImportTemplatesComponent {
  /** The templates whose rows the signed-in user may import. */
  readonly importable = input.required<readonly ImportTemplateName[]>();

  protected readonly workbookUrl = TEMPLATE_WORKBOOK_URL;

  protected readonly rows = computed(() =>
    IMPORT_TEMPLATE_NAMES.map((name) => {
      const { title, summary } = IMPORT_TEMPLATES[name];
      return {
        name,
        title,
        summary,
        importable: this.importable().includes(name),
        csvUrl: templateDownloadUrl(name, 'csv'),
        xlsxUrl: templateDownloadUrl(name, 'xlsx'),
        csvLabel: `${title} template as CSV`,
        xlsxLabel: `${title} template as XLSX, with a sheet describing its columns`,
      };
    }),
  );
}
