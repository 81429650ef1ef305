import type { StrandRow } from '../engine/calc-file/girder';
import type { ImportBodies } from './bodies';
import type { ImportTemplateName } from './columns';
import type { ConvertedRow, ImportProblem } from './rows';

/**
 * The checks across the rows of one upload that need no database: no key twice within the file,
 * and what each row refers to — in the same upload, or left for the server to find on file. The
 * strand rows are gathered by girder, because those of a file replace a girder's rows as a whole.
 */

export type AnyConvertedRow = { [T in ImportTemplateName]: ConvertedRow<T> }[ImportTemplateName];

export interface SpanReference {
  readonly structureNumber: string;
  readonly spanIndex: number;
}
export interface GirderReference extends SpanReference {
  readonly girderNumber: number;
}

/** The strand rows a file gives for one girder: together they replace the girder's stored rows. */
export interface GirderStrandRows {
  readonly girder: GirderReference;
  readonly strandRows: readonly StrandRow[];
  /** Where they are in the file, in file order. */
  readonly rows: readonly { readonly sheet: string; readonly rowNumber: number }[];
}

export interface UploadCheck {
  readonly problems: readonly ImportProblem[];
  /** What rows refer to that the upload does not hold: the server must find each on file, or refuse the row. */
  readonly mustExist: {
    readonly structures: readonly string[];
    readonly spans: readonly SpanReference[];
    readonly girders: readonly GirderReference[];
  };
  readonly strandRowsByGirder: ReadonlyMap<string, GirderStrandRows>;
}

export const structureKey = (structureNumber: string): string => JSON.stringify([structureNumber]);
export const spanKey = (span: SpanReference): string => JSON.stringify([span.structureNumber, span.spanIndex]);
export const girderKey = (girder: GirderReference): string => JSON.stringify([girder.structureNumber, girder.spanIndex, girder.girderNumber]);

/** What identifies a row within its template, as a comparable string and as people read it. */
function keyParts(row: AnyConvertedRow): (string | number | null)[] {
  switch (row.template) {
    case 'structures':
      return [row.body.structureNumber];
    case 'spans':
      return [row.body.structureNumber, row.body.spanIndex];
    case 'girders':
      return [row.body.structureNumber, row.body.spanIndex, row.body.girderNumber];
    case 'strand-rows':
      return [row.body.structureNumber, row.body.spanIndex, row.body.girderNumber, row.body.strandRow.id];
    case 'findings': {
      const { finding } = row.body;
      return [row.body.structureNumber, row.body.spanIndex, row.body.girderNumber, row.body.inspectedOn, finding.kind, finding.fromM, finding.toM];
    }
    case 'prior-ratings':
      return [row.body.structureNumber, row.body.spanIndex];
  }
}

function duplicateKeys(rows: readonly AnyConvertedRow[]): ImportProblem[] {
  const firstSeen = new Map<string, AnyConvertedRow>();
  const problems: ImportProblem[] = [];
  for (const row of rows) {
    const parts = keyParts(row);
    const key = JSON.stringify([row.template, ...parts]);
    const first = firstSeen.get(key);
    if (first === undefined) {
      firstSeen.set(key, row);
      continue;
    }
    const where = first.sheet === row.sheet ? `row ${first.rowNumber}` : `row ${first.rowNumber} of sheet ${first.sheet}`;
    problems.push({
      sheet: row.sheet,
      row: row.rowNumber,
      column: row.keyColumns,
      value: parts.map((part) => (part === null ? '' : String(part))).join(' / '),
      message: `the same ${row.keyColumns} as ${where}; each may appear once in a file`,
    });
  }
  return problems;
}

/** The structure, span or girder a row refers to (a structure's own row refers to nothing). */
function parentOf(row: AnyConvertedRow): { kind: 'structure'; structureNumber: string } | { kind: 'span'; span: SpanReference } | { kind: 'girder'; girder: GirderReference } | null {
  switch (row.template) {
    case 'structures':
      return null;
    case 'spans':
      return { kind: 'structure', structureNumber: row.body.structureNumber };
    case 'girders':
      return { kind: 'span', span: row.body };
    case 'strand-rows':
    case 'findings':
      return { kind: 'girder', girder: row.body };
    case 'prior-ratings': {
      const { structureNumber, spanIndex } = row.body;
      return spanIndex === null ? { kind: 'structure', structureNumber } : { kind: 'span', span: { structureNumber, spanIndex } };
    }
  }
}

/** Checks the converted rows of one upload (every sheet) against each other. */
export function checkUpload(rows: readonly AnyConvertedRow[]): UploadCheck {
  const structuresInUpload = new Set<string>();
  const spansInUpload = new Set<string>();
  const girdersInUpload = new Set<string>();
  for (const row of rows) {
    if (row.template === 'structures') structuresInUpload.add(structureKey(row.body.structureNumber));
    if (row.template === 'spans') spansInUpload.add(spanKey(row.body));
    if (row.template === 'girders') girdersInUpload.add(girderKey(row.body));
  }

  const structures = new Map<string, string>();
  const spans = new Map<string, SpanReference>();
  const girders = new Map<string, GirderReference>();
  for (const row of rows) {
    const parent = parentOf(row);
    if (parent?.kind === 'structure' && !structuresInUpload.has(structureKey(parent.structureNumber))) {
      structures.set(structureKey(parent.structureNumber), parent.structureNumber);
    } else if (parent?.kind === 'span' && !spansInUpload.has(spanKey(parent.span))) {
      spans.set(spanKey(parent.span), { structureNumber: parent.span.structureNumber, spanIndex: parent.span.spanIndex });
    } else if (parent?.kind === 'girder' && !girdersInUpload.has(girderKey(parent.girder))) {
      const { structureNumber, spanIndex, girderNumber } = parent.girder;
      girders.set(girderKey(parent.girder), { structureNumber, spanIndex, girderNumber });
    }
  }

  return {
    problems: duplicateKeys(rows),
    mustExist: { structures: [...structures.values()], spans: [...spans.values()], girders: [...girders.values()] },
    strandRowsByGirder: strandRowsByGirder(rows),
  };
}

function strandRowsByGirder(rows: readonly AnyConvertedRow[]): Map<string, GirderStrandRows> {
  const groups = new Map<string, { girder: GirderReference; strandRows: StrandRow[]; rows: { sheet: string; rowNumber: number }[] }>();
  for (const row of rows) {
    if (row.template !== 'strand-rows') continue;
    const { structureNumber, spanIndex, girderNumber, strandRow } = row.body as ImportBodies['strand-rows'];
    const key = girderKey({ structureNumber, spanIndex, girderNumber });
    const group = groups.get(key) ?? { girder: { structureNumber, spanIndex, girderNumber }, strandRows: [], rows: [] };
    group.strandRows.push(strandRow);
    group.rows.push({ sheet: row.sheet, rowNumber: row.rowNumber });
    groups.set(key, group);
  }
  return groups;
}
