import type { StrandRow } from '../engine/calc-file/girder';
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
/** The span a `spanKey` stands for. */
export function spanOfKey(key: string): SpanReference {
  const [structureNumber, spanIndex] = JSON.parse(key) as [string, number];
  return { structureNumber, spanIndex };
}
export const girderKey = (girder: GirderReference): string => JSON.stringify([girder.structureNumber, girder.spanIndex, girder.girderNumber]);

/** What identifies a row within its template, as people read it. */
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

/** A row's key as comparable text; a structure, span or girder row's is the one other rows refer to it by. */
function rowKey(row: AnyConvertedRow): string {
  switch (row.template) {
    case 'structures':
      return structureKey(row.body.structureNumber);
    case 'spans':
      return spanKey(row.body);
    case 'girders':
      return girderKey(row.body);
    default:
      return JSON.stringify(keyParts(row));
  }
}

function duplicateProblem(row: AnyConvertedRow, first: AnyConvertedRow): ImportProblem {
  const parts = keyParts(row);
  const where = first.sheet === row.sheet ? `row ${first.rowNumber}` : `row ${first.rowNumber} of sheet ${first.sheet}`;
  return {
    sheet: row.sheet,
    row: row.rowNumber,
    column: row.keyColumns,
    value: parts.map((part) => (part === null ? '' : String(part))).join(' / '),
    message: `the same ${row.keyColumns} as ${where}; each may appear once in a file`,
  };
}

/** Parts of the upload that rows refer to, kept when the upload does not hold them, by key in file order. */
interface Missing {
  readonly structures: Map<string, string>;
  readonly spans: Map<string, SpanReference>;
  readonly girders: Map<string, GirderReference>;
}

function referToStructure(missing: Missing, inUpload: ReadonlySet<string>, structureNumber: string): void {
  const key = structureKey(structureNumber);
  if (!inUpload.has(key) && !missing.structures.has(key)) missing.structures.set(key, structureNumber);
}

function referToSpan(missing: Missing, inUpload: ReadonlySet<string>, structureNumber: string, spanIndex: number): void {
  const key = spanKey({ structureNumber, spanIndex });
  if (!inUpload.has(key) && !missing.spans.has(key)) missing.spans.set(key, { structureNumber, spanIndex });
}

function referToGirder(missing: Missing, inUpload: ReadonlySet<string>, key: string, girder: GirderReference): void {
  if (inUpload.has(key) || missing.girders.has(key)) return;
  const { structureNumber, spanIndex, girderNumber } = girder;
  missing.girders.set(key, { structureNumber, spanIndex, girderNumber });
}

/** A girder's strand rows as the file gives them, gathered row by row. */
interface StrandRowGroup {
  readonly girder: GirderReference;
  readonly strandRows: StrandRow[];
  readonly rows: { readonly sheet: string; readonly rowNumber: number }[];
}

function addStrandRow(groups: Map<string, StrandRowGroup>, key: string, row: ConvertedRow<'strand-rows'>): void {
  const { structureNumber, spanIndex, girderNumber, strandRow } = row.body;
  let group = groups.get(key);
  if (group === undefined) {
    group = { girder: { structureNumber, spanIndex, girderNumber }, strandRows: [], rows: [] };
    groups.set(key, group);
  }
  group.strandRows.push(strandRow);
  group.rows.push({ sheet: row.sheet, rowNumber: row.rowNumber });
}

/**
 * Checks the converted rows of one upload (every sheet) against each other. Two passes over the
 * rows, each key worked out once a row: the first finds the keys given twice and what the upload
 * holds, the second what rows refer to (a row may refer to one further down the file).
 */
export function checkUpload(rows: readonly AnyConvertedRow[]): UploadCheck {
  const problems: ImportProblem[] = [];
  // The same key in two templates is no duplicate: one map of keys seen per template.
  const firstSeen = new Map<ImportTemplateName, Map<string, AnyConvertedRow>>();
  const structuresInUpload = new Set<string>();
  const spansInUpload = new Set<string>();
  const girdersInUpload = new Set<string>();
  for (const row of rows) {
    const key = rowKey(row);
    let seen = firstSeen.get(row.template);
    if (seen === undefined) firstSeen.set(row.template, (seen = new Map()));
    const first = seen.get(key);
    if (first === undefined) seen.set(key, row);
    else problems.push(duplicateProblem(row, first));
    if (row.template === 'structures') structuresInUpload.add(key);
    else if (row.template === 'spans') spansInUpload.add(key);
    else if (row.template === 'girders') girdersInUpload.add(key);
  }

  const missing: Missing = { structures: new Map(), spans: new Map(), girders: new Map() };
  const strandRowGroups = new Map<string, StrandRowGroup>();
  for (const row of rows) {
    switch (row.template) {
      case 'structures':
        break;
      case 'spans':
        referToStructure(missing, structuresInUpload, row.body.structureNumber);
        break;
      case 'girders':
        referToSpan(missing, spansInUpload, row.body.structureNumber, row.body.spanIndex);
        break;
      case 'strand-rows': {
        const key = girderKey(row.body);
        referToGirder(missing, girdersInUpload, key, row.body);
        addStrandRow(strandRowGroups, key, row);
        break;
      }
      case 'findings':
        referToGirder(missing, girdersInUpload, girderKey(row.body), row.body);
        break;
      case 'prior-ratings': {
        const { structureNumber, spanIndex } = row.body;
        if (spanIndex === null) referToStructure(missing, structuresInUpload, structureNumber);
        else referToSpan(missing, spansInUpload, structureNumber, spanIndex);
        break;
      }
    }
  }

  return {
    problems,
    mustExist: { structures: [...missing.structures.values()], spans: [...missing.spans.values()], girders: [...missing.girders.values()] },
    strandRowsByGirder: strandRowGroups,
  };
}
