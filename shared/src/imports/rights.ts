import { can, type Action, type SignedInUser } from '../access';
import { IMPORT_TEMPLATE_NAMES, type ImportTemplateName } from './columns';

/**
 * The permission each template's rows need (product.md, permission matrix): the inventory by its
 * editors, findings by inspectors and raters, prior ratings of record by those who run ratings.
 * The server checks every row against it in the row's district; the app shows by it what a user
 * may bring.
 */
export const IMPORT_ACTION_OF: Readonly<Record<ImportTemplateName, Action>> = {
  structures: 'editInventory',
  spans: 'editInventory',
  girders: 'editInventory',
  'strand-rows': 'editInventory',
  findings: 'importFindings',
  'prior-ratings': 'runRatings',
};

/** The templates whose rows the user's role may import, in the templates' own order; none for nobody. */
export function templatesUserMayImport(user: Pick<SignedInUser, 'role' | 'admin'> | null | undefined): ImportTemplateName[] {
  return user ? IMPORT_TEMPLATE_NAMES.filter((template) => can(user, IMPORT_ACTION_OF[template])) : [];
}

/** The template a sheet name stands for ("Strand rows", "strand_rows", "strand-rows"), if any. */
export function templateNamed(text: string): ImportTemplateName | null {
  const name = text.trim().toLowerCase().replace(/[ _]+/g, '-');
  return IMPORT_TEMPLATE_NAMES.find((template) => template === name) ?? null;
}

/** The template a CSV file's name stands for ("spans.csv", "Strand rows.csv"), as the server reads it when no template is sent. */
export function templateOfFileName(fileName: string): ImportTemplateName | null {
  return templateNamed(fileName.replace(/\.[^.]*$/, ''));
}

/**
 * The sheet of a template workbook that describes its columns. It is the product's own, so an
 * upload of a filled-in template skips it rather than calling it a sheet of no template.
 */
export const COLUMNS_SHEET_NAME = 'columns';
