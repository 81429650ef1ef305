/**
 * Writes the import templates (`data-import/templates/<name>.csv`) and the column tables of
 * `data-import/README.md` from the column definitions in shared/src/imports. Run it after changing
 * a column: `node --import tsx scripts/write-import-templates.ts`. A test checks that the committed
 * files equal what the definitions give.
 */
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { IMPORT_TEMPLATE_NAMES, allColumnsMarkdown, templateCsv } from '../shared/src/imports';

const dataImport = path.resolve(__dirname, '..', 'data-import');
const COLUMNS_START = '<!-- columns: written by scripts/write-import-templates.ts -->';
const COLUMNS_END = '<!-- end of columns -->';

mkdirSync(path.join(dataImport, 'templates'), { recursive: true });
for (const name of IMPORT_TEMPLATE_NAMES) {
  writeFileSync(path.join(dataImport, 'templates', `${name}.csv`), templateCsv(name));
}

const readmePath = path.join(dataImport, 'README.md');
const readme = readFileSync(readmePath, 'utf8');
const start = readme.indexOf(COLUMNS_START);
const end = readme.indexOf(COLUMNS_END);
if (start < 0 || end < start) throw new Error(`${readmePath} needs the markers ${COLUMNS_START} and ${COLUMNS_END}`);
writeFileSync(readmePath, `${readme.slice(0, start + COLUMNS_START.length)}\n${allColumnsMarkdown()}${readme.slice(end)}`);
console.log(`wrote ${IMPORT_TEMPLATE_NAMES.length} templates and the README's column tables`);
