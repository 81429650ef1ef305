import path from 'node:path';
import { ImportFileError } from './import-file-error';
import { isDateFormatId } from './xlsx-cell-values';
import { decodeXmlText, END_OF_PART, END_TAG, NEED_MORE, START_TAG, TEXT, XmlScanner } from './xlsx-xml-scanner';
import type { XlsxZipParts } from './xlsx-zip-parts';
import type { ZipEntry } from './zip-directory';

/** The workbook part every XLSX has (file-kind.ts tells an XLSX by it) and its relationships. */
const WORKBOOK_PART = 'xl/workbook.xml';
const WORKBOOK_RELATIONSHIPS_PART = 'xl/_rels/workbook.xml.rels';

export interface WorksheetPart {
  readonly name: string;
  readonly partName: string;
  readonly entry: ZipEntry;
}

/** What reading a worksheet's cells needs from the rest of the workbook. */
export interface WorkbookLookups {
  readonly sharedStrings: readonly string[];
  /** By cell style index (the `s` attribute): whether the style's number format shows a date or time. */
  readonly dateStyles: readonly boolean[];
  /** `<workbookPr date1904="1"/>`: serial numbers count days from 1904, not 1900. */
  readonly date1904: boolean;
}

export interface WorkbookParts extends WorkbookLookups {
  /** In the order the workbook lists them, which is the order a spreadsheet program shows their tabs. */
  readonly worksheets: readonly WorksheetPart[];
}

/**
 * Reads the workbook part, its relationships, the styles and the shared strings: everything but the
 * worksheets' rows. Shared strings are held in memory, since cells refer to them by index.
 */
export async function readWorkbookParts(zip: XlsxZipParts): Promise<WorkbookParts> {
  const workbookEntry = zip.find(WORKBOOK_PART);
  const relationshipsEntry = zip.find(WORKBOOK_RELATIONSHIPS_PART);
  if (!workbookEntry || !relationshipsEntry) throw incompleteWorkbook();
  const workbook = new WorkbookReader();
  await zip.scanPart(workbookEntry, new XmlScanner(WORKBOOK_PART), workbook);
  const relationships = new RelationshipsReader();
  await zip.scanPart(relationshipsEntry, new XmlScanner(WORKBOOK_RELATIONSHIPS_PART), relationships);

  const worksheets: WorksheetPart[] = [];
  for (const sheet of workbook.sheets) {
    const relationship = relationships.byId.get(sheet.relationshipId);
    if (!relationship) throw incompleteWorkbook();
    // Chart sheets and dialog sheets hold no rows.
    if (!isOfType(relationship, 'worksheet')) continue;
    const part = findTarget(zip, relationship);
    if (!part) throw incompleteWorkbook();
    worksheets.push({ name: sheet.name, ...part });
  }

  const styles = new StylesReader();
  const stylesPart = findRelated(zip, relationships, 'styles');
  if (stylesPart) await zip.scanPart(stylesPart.entry, new XmlScanner(stylesPart.partName), styles);
  const sharedStrings = new SharedStringsReader();
  const sharedStringsPart = findRelated(zip, relationships, 'sharedStrings');
  if (sharedStringsPart) await zip.scanPart(sharedStringsPart.entry, new XmlScanner(sharedStringsPart.partName), sharedStrings);

  return {
    worksheets,
    date1904: workbook.date1904,
    dateStyles: styles.dateStyles(),
    sharedStrings: sharedStrings.strings,
  };
}

export function incompleteWorkbook(): ImportFileError {
  return new ImportFileError({
    code: 'corrupt_file',
    message: 'The workbook could not be read completely; open and save it in a spreadsheet program, then upload it again',
  });
}

interface Relationship {
  readonly type: string;
  readonly target: string;
  readonly external: boolean;
}

/** Transitional and strict files name relationship types under different roots; the last segment is the same. */
function isOfType(relationship: Relationship, type: string): boolean {
  return relationship.type.endsWith(`/${type}`);
}

function findRelated(zip: XlsxZipParts, relationships: RelationshipsReader, type: string) {
  for (const relationship of relationships.byId.values()) {
    if (isOfType(relationship, type)) return findTarget(zip, relationship);
  }
  return undefined;
}

/**
 * The part a workbook relationship points to. A target is relative to the workbook's folder
 * (`worksheets/sheet1.xml`) or absolute from the package root (`/xl/worksheets/sheet1.xml`), and may
 * be percent-encoded (ECMA-376 Part 2, 9.3); one that leaves the package is not found.
 */
function findTarget(zip: XlsxZipParts, relationship: Relationship): { partName: string; entry: ZipEntry } | undefined {
  if (relationship.external) return undefined;
  const target = relationship.target;
  const joined = target.startsWith('/') ? target.slice(1) : `${path.posix.dirname(WORKBOOK_PART)}/${target}`;
  const partName = path.posix.normalize(joined);
  if (partName.startsWith('../') || partName === '..' || partName.startsWith('/')) return undefined;
  const entry = zip.find(partName) ?? zip.find(percentDecoded(partName));
  return entry ? { partName, entry } : undefined;
}

function percentDecoded(name: string): string {
  try {
    return decodeURIComponent(name);
  } catch {
    return name;
  }
}

/**
 * Base of the part readers below: each one is called after every chunk and reads tokens until the
 * scanner needs more, keeping its place in fields. `depth` counts the elements open around the
 * current token, so an element is taken only where the schema puts it, not where an extension
 * (`<extLst>`) reuses its name.
 */
abstract class PartReader {
  protected depth = 0;

  consume(scanner: XmlScanner): void {
    for (let token = scanner.next(); token !== NEED_MORE && token !== END_OF_PART; token = scanner.next()) {
      if (token === START_TAG) {
        this.startElement(scanner, this.depth);
        if (scanner.selfClosing) this.endElement(scanner, this.depth);
        else this.depth += 1;
      } else if (token === END_TAG) {
        this.depth -= 1;
        this.endElement(scanner, this.depth);
      } else if (token === TEXT) {
        this.text(scanner);
      }
    }
  }

  /** `depth` is 0 for the part's root element. */
  protected abstract startElement(scanner: XmlScanner, depth: number): void;
  protected endElement(_scanner: XmlScanner, _depth: number): void {}
  protected text(_scanner: XmlScanner): void {}
}

/** xl/workbook.xml: the sheets in tab order and the date system (ECMA-376 Part 1, 18.2). */
class WorkbookReader extends PartReader {
  readonly sheets: Array<{ name: string; relationshipId: string }> = [];
  date1904 = false;
  private inSheets = false;

  protected startElement(scanner: XmlScanner, depth: number): void {
    if (depth === 1 && scanner.localNameIs('workbookPr')) {
      while (scanner.nextAttribute()) {
        if (scanner.attributeNameIs('date1904')) this.date1904 = scanner.attributeValueIs('1') || scanner.attributeValueIs('true');
      }
    } else if (depth === 1 && scanner.localNameIs('sheets')) {
      this.inSheets = !scanner.selfClosing;
    } else if (depth === 2 && this.inSheets && scanner.localNameIs('sheet')) {
      this.readSheet(scanner);
    }
  }

  protected override endElement(scanner: XmlScanner, depth: number): void {
    if (depth === 1 && scanner.localNameIs('sheets')) this.inSheets = false;
  }

  private readSheet(scanner: XmlScanner): void {
    let name: string | undefined;
    let relationshipId: string | undefined;
    while (scanner.nextAttribute()) {
      if (scanner.attributeNameIs('name')) name = scanner.attributeValue();
      else if (scanner.prefixedAttributeIs('id')) relationshipId = scanner.attributeValue();
    }
    if (name === undefined || relationshipId === undefined) throw scanner.notUnderstood('a sheet has no name or no part');
    this.sheets.push({ name, relationshipId });
  }
}

/** A part's relationships (ECMA-376 Part 2, 9.3). */
class RelationshipsReader extends PartReader {
  readonly byId = new Map<string, Relationship>();

  protected startElement(scanner: XmlScanner, depth: number): void {
    if (depth !== 1 || !scanner.localNameIs('Relationship')) return;
    let id: string | undefined;
    let type = '';
    let target: string | undefined;
    let external = false;
    while (scanner.nextAttribute()) {
      if (scanner.attributeNameIs('Id')) id = scanner.attributeValue();
      else if (scanner.attributeNameIs('Type')) type = scanner.attributeValue();
      else if (scanner.attributeNameIs('Target')) target = scanner.attributeValue();
      else if (scanner.attributeNameIs('TargetMode')) external = scanner.attributeValueIs('External');
    }
    if (id === undefined || target === undefined) throw scanner.notUnderstood('a relationship has no id or no target');
    this.byId.set(id, { type, target, external });
  }
}

/**
 * xl/styles.xml: the workbook's own number formats (`<numFmts>`) and, for every cell style
 * (`<cellXfs>`, which a cell's `s` attribute indexes), its number format (ECMA-376 Part 1, 18.8).
 */
class StylesReader extends PartReader {
  private readonly customFormats = new Map<number, string>();
  private readonly styleFormatIds: number[] = [];
  private inNumberFormats = false;
  private inCellStyles = false;

  dateStyles(): boolean[] {
    return this.styleFormatIds.map((formatId) => isDateFormatId(formatId, this.customFormats));
  }

  protected startElement(scanner: XmlScanner, depth: number): void {
    if (depth === 1) {
      this.inNumberFormats = scanner.localNameIs('numFmts') && !scanner.selfClosing;
      this.inCellStyles = scanner.localNameIs('cellXfs') && !scanner.selfClosing;
    } else if (depth === 2 && this.inNumberFormats && scanner.localNameIs('numFmt')) {
      this.readNumberFormat(scanner);
    } else if (depth === 2 && this.inCellStyles && scanner.localNameIs('xf')) {
      this.styleFormatIds.push(this.numberFormatIdOf(scanner));
    }
  }

  protected override endElement(_scanner: XmlScanner, depth: number): void {
    if (depth === 1) {
      this.inNumberFormats = false;
      this.inCellStyles = false;
    }
  }

  private readNumberFormat(scanner: XmlScanner): void {
    let id = -1;
    let code: string | undefined;
    while (scanner.nextAttribute()) {
      if (scanner.attributeNameIs('numFmtId')) id = scanner.attributeWholeNumber();
      else if (scanner.attributeNameIs('formatCode')) code = scanner.attributeValue();
    }
    if (id < 0 || code === undefined) throw scanner.notUnderstood('a number format has no id or no code');
    this.customFormats.set(id, code);
  }

  /** A style without `numFmtId` uses format 0, General. */
  private numberFormatIdOf(scanner: XmlScanner): number {
    while (scanner.nextAttribute()) {
      if (!scanner.attributeNameIs('numFmtId')) continue;
      const id = scanner.attributeWholeNumber();
      if (id < 0) throw scanner.notUnderstood('a cell style has a damaged number format id');
      return id;
    }
    return 0;
  }
}

/**
 * xl/sharedStrings.xml: each `<si>` is a plain `<t>` or rich text runs `<r><t>` whose texts join;
 * phonetic guides (`<rPh>`) are not part of the value (ECMA-376 Part 1, 18.4).
 */
class SharedStringsReader extends PartReader {
  readonly strings: string[] = [];
  private inItem = false;
  private phoneticDepth = 0;
  private inText = false;
  private rawText = '';

  protected startElement(scanner: XmlScanner, depth: number): void {
    if (depth === 1 && scanner.localNameIs('si')) {
      this.inItem = true;
      this.rawText = '';
      this.phoneticDepth = 0;
    } else if (this.inItem && scanner.localNameIs('rPh')) {
      if (!scanner.selfClosing) this.phoneticDepth += 1;
    } else if (this.inItem && this.phoneticDepth === 0 && scanner.localNameIs('t')) {
      this.inText = !scanner.selfClosing;
    }
  }

  protected override endElement(scanner: XmlScanner, depth: number): void {
    if (depth === 1 && scanner.localNameIs('si')) {
      const text = decodeXmlText(this.rawText);
      if (text === undefined) throw scanner.notUnderstood('a shared string holds a character reference this reader does not understand');
      this.strings.push(text);
      this.inItem = false;
    } else if (this.inItem && scanner.localNameIs('rPh')) {
      if (!scanner.selfClosing) this.phoneticDepth -= 1;
    } else if (scanner.localNameIs('t')) {
      this.inText = false;
    }
  }

  protected override text(scanner: XmlScanner): void {
    if (this.inText) this.rawText += scanner.rawText();
  }
}
