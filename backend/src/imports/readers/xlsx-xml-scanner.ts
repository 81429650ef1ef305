import { ImportFileError } from './import-file-error';

/**
 * A small pull scanner for the XML of a workbook's parts, fed text chunk by chunk as a part inflates.
 * It knows start tags, end tags and text; comments and processing instructions are skipped and CDATA
 * comes out as text. Tag and attribute names and values are left in the source as offsets, so the
 * hot loop over a worksheet's cells allocates nothing per tag: callers compare names in place and
 * slice only the values they keep. It checks no schema; the readers built on it decide what the
 * elements mean.
 */

/** The scanner needs the next chunk (or `finish()`) before it can say more. */
export const NEED_MORE = 0;
export const START_TAG = 1;
export const END_TAG = 2;
export const TEXT = 3;
/** `finish()` was called and everything before it has been scanned. */
export const END_OF_PART = 4;
export type XmlToken = typeof NEED_MORE | typeof START_TAG | typeof END_TAG | typeof TEXT | typeof END_OF_PART;

/**
 * Unfinished markup carried from one chunk to the next. No tag, comment or CDATA section a
 * spreadsheet program writes comes near this; a part that does is refused rather than held in memory.
 */
const MAX_PENDING_MARKUP_CHARS = 1024 * 1024;

const LESS_THAN = 0x3c;
const GREATER_THAN = 0x3e;
const SLASH = 0x2f;
const BANG = 0x21;
const QUESTION_MARK = 0x3f;
const COLON = 0x3a;
const EQUALS = 0x3d;
const DOUBLE_QUOTE = 0x22;
const SINGLE_QUOTE = 0x27;
const CARRIAGE_RETURN = 0x0d;

const CDATA_START = '<![CDATA[';

export class XmlScanner {
  /** The text being scanned; offsets below point into it and stay valid until the next `push`. */
  source = '';
  /** After START_TAG or END_TAG: where the name starts, where its local part (after any prefix) starts, and where it ends. */
  nameStart = 0;
  localNameStart = 0;
  nameEnd = 0;
  /** After START_TAG: written as `<name/>`, so no END_TAG follows; false after END_TAG. */
  selfClosing = false;
  /** After TEXT: the raw text (entities not yet decoded) is source[textStart, textEnd), unless it came from CDATA. */
  textStart = 0;
  textEnd = 0;
  /** After START_TAG, from `nextAttribute()`: the current attribute's name and raw value. */
  attributeNameStart = 0;
  attributeLocalNameStart = 0;
  attributeNameEnd = 0;
  attributeValueStart = 0;
  attributeValueEnd = 0;

  private position = 0;
  private finished = false;
  /** Each attribute of the current start tag as five offsets: name start, local name start, name end, value start, value end. */
  private attributeOffsets = new Int32Array(5 * 16);
  private attributeCount = 0;
  private attributeIndex = 0;
  /** CDATA text, escaped so that decoding the collected text gives it back unchanged. */
  private cdataText: string | undefined;

  /** `partName` names the part in error messages. */
  constructor(readonly partName: string) {}

  /** Adds the next chunk of the part's text. */
  push(text: string): void {
    if (this.finished) throw new Error('push after finish');
    const pending = this.source.length - this.position;
    if (pending === 0) {
      this.source = text;
    } else {
      if (pending > MAX_PENDING_MARKUP_CHARS) throw this.notUnderstood('it holds markup longer than any spreadsheet program writes');
      this.source = this.source.slice(this.position) + text;
    }
    this.position = 0;
  }

  /** No more text will come: markup still unfinished is then an error. */
  finish(): void {
    this.finished = true;
  }

  /** Scans the next token; its details are in the fields above until the next call. */
  next(): XmlToken {
    for (;;) {
      const source = this.source;
      const at = this.position;
      if (at >= source.length) return this.finished ? END_OF_PART : NEED_MORE;
      if (source.charCodeAt(at) !== LESS_THAN) return this.readText(at);
      const second = source.charCodeAt(at + 1);
      if (second === SLASH) return this.readEndTag(at);
      if (second === BANG) {
        const token = this.readBangMarkup(at);
        if (token !== undefined) return token;
        continue;
      }
      if (second === QUESTION_MARK) {
        const end = source.indexOf('?>', at + 2);
        if (end < 0) return this.unfinished();
        this.position = end + 2;
        continue;
      }
      if (Number.isNaN(second)) return this.unfinished();
      return this.readStartTag(at);
    }
  }

  /** The current TEXT token as a string, entities still encoded (see `decodeXmlText`). */
  rawText(): string {
    return this.cdataText ?? this.source.slice(this.textStart, this.textEnd);
  }

  /** Whether the current tag's local name (after any `x:` prefix) is `name`. */
  localNameIs(name: string): boolean {
    return this.nameEnd - this.localNameStart === name.length && this.source.startsWith(name, this.localNameStart);
  }

  /** Moves to the current start tag's next attribute; false when there is none left. */
  nextAttribute(): boolean {
    if (this.attributeIndex >= this.attributeCount) return false;
    const offsets = this.attributeOffsets;
    const base = this.attributeIndex * 5;
    this.attributeIndex += 1;
    this.attributeNameStart = offsets[base]!;
    this.attributeLocalNameStart = offsets[base + 1]!;
    this.attributeNameEnd = offsets[base + 2]!;
    this.attributeValueStart = offsets[base + 3]!;
    this.attributeValueEnd = offsets[base + 4]!;
    return true;
  }

  /** Whether the current attribute's whole name is `name` (attributes without a prefix are the usual ones). */
  attributeNameIs(name: string): boolean {
    return this.attributeNameEnd - this.attributeNameStart === name.length && this.source.startsWith(name, this.attributeNameStart);
  }

  /** Whether the current attribute has a prefix and its local name is `name`, as `r:id` is. */
  prefixedAttributeIs(name: string): boolean {
    return (
      this.attributeLocalNameStart > this.attributeNameStart &&
      this.attributeNameEnd - this.attributeLocalNameStart === name.length &&
      this.source.startsWith(name, this.attributeLocalNameStart)
    );
  }

  /** Whether the current attribute's raw value is exactly `value`. */
  attributeValueIs(value: string): boolean {
    return this.attributeValueEnd - this.attributeValueStart === value.length && this.source.startsWith(value, this.attributeValueStart);
  }

  /** The current attribute's value with its entities decoded. */
  attributeValue(): string {
    const decoded = decodeXmlText(this.source.slice(this.attributeValueStart, this.attributeValueEnd));
    if (decoded === undefined) throw this.notUnderstood('an attribute holds a character reference this reader does not understand');
    return decoded;
  }

  /** The current attribute's value as a whole number of decimal digits; -1 when it is anything else. */
  attributeWholeNumber(): number {
    return wholeNumberIn(this.source, this.attributeValueStart, this.attributeValueEnd);
  }

  notUnderstood(reason: string): ImportFileError {
    return new ImportFileError({
      code: 'corrupt_file',
      message: `The workbook part ${this.partName} could not be read (${reason}); open and save it in a spreadsheet program, then upload it again`,
    });
  }

  private readText(at: number): XmlToken {
    let end = this.source.indexOf('<', at);
    // Text that runs to the end of the chunk is handed over now rather than carried: a long text
    // then costs no re-scanning, and callers collect the pieces and decode them once at the end tag.
    if (end < 0) end = this.source.length;
    this.textStart = at;
    this.textEnd = end;
    this.cdataText = undefined;
    this.position = end;
    return TEXT;
  }

  private readEndTag(at: number): XmlToken {
    const end = this.source.indexOf('>', at + 2);
    if (end < 0) return this.unfinished();
    this.readName(at + 2, end);
    this.selfClosing = false;
    this.position = end + 1;
    return END_TAG;
  }

  /**
   * Reads a start tag and the offsets of its attributes in one pass: names are walked, quoted values
   * jumped over with indexOf, so a `>` inside a value does not end the tag.
   */
  private readStartTag(at: number): XmlToken {
    const source = this.source;
    const length = source.length;
    let position = this.readName(at + 1, length);
    let count = 0;
    let selfClosing = false;
    for (;;) {
      position = skipSpace(source, position, length);
      if (position >= length) return this.unfinished();
      const code = source.charCodeAt(position);
      if (code === GREATER_THAN) break;
      if (code === SLASH) {
        if (position + 1 >= length) return this.unfinished();
        if (source.charCodeAt(position + 1) !== GREATER_THAN) throw this.notUnderstood('a tag is damaged');
        selfClosing = true;
        position += 1;
        break;
      }
      const nameStart = position;
      let localNameStart = position;
      for (; position < length; position += 1) {
        const nameCode = source.charCodeAt(position);
        if (nameCode === EQUALS || isSpace(nameCode) || nameCode === GREATER_THAN || nameCode === SLASH || nameCode === LESS_THAN) break;
        if (nameCode === COLON) localNameStart = position + 1;
      }
      const nameEnd = position;
      position = skipSpace(source, position, length);
      if (position >= length) return this.unfinished();
      if (nameEnd === nameStart || source.charCodeAt(position) !== EQUALS) throw this.notUnderstood('a tag holds a damaged attribute');
      position = skipSpace(source, position + 1, length);
      if (position >= length) return this.unfinished();
      const quote = source.charCodeAt(position);
      if (quote !== DOUBLE_QUOTE && quote !== SINGLE_QUOTE) throw this.notUnderstood('a tag holds an attribute without quotes');
      const valueEnd = source.indexOf(quote === DOUBLE_QUOTE ? '"' : "'", position + 1);
      if (valueEnd < 0) return this.unfinished();
      this.storeAttribute(count, nameStart, localNameStart, nameEnd, position + 1, valueEnd);
      count += 1;
      position = valueEnd + 1;
    }
    this.selfClosing = selfClosing;
    this.attributeCount = count;
    this.attributeIndex = 0;
    this.position = position + 1;
    return START_TAG;
  }

  private storeAttribute(index: number, nameStart: number, localNameStart: number, nameEnd: number, valueStart: number, valueEnd: number): void {
    let offsets = this.attributeOffsets;
    const base = index * 5;
    if (base + 5 > offsets.length) {
      offsets = new Int32Array(offsets.length * 2);
      offsets.set(this.attributeOffsets);
      this.attributeOffsets = offsets;
    }
    offsets[base] = nameStart;
    offsets[base + 1] = localNameStart;
    offsets[base + 2] = nameEnd;
    offsets[base + 3] = valueStart;
    offsets[base + 4] = valueEnd;
  }

  /** Sets the name fields from the name starting at `from`, which ends at white space, `/`, `>` or `end`; returns where it ends. */
  private readName(from: number, end: number): number {
    const source = this.source;
    let localStart = from;
    let at = from;
    for (; at < end; at += 1) {
      const code = source.charCodeAt(at);
      if (code === SLASH || code === GREATER_THAN || isSpace(code)) break;
      if (code === COLON) localStart = at + 1;
      else if (code === LESS_THAN) throw this.notUnderstood('a tag is not closed');
    }
    if (at === from) throw this.notUnderstood('a tag has no name');
    this.nameStart = from;
    this.localNameStart = localStart;
    this.nameEnd = at;
    return at;
  }

  /** Comments are skipped (undefined), CDATA becomes TEXT; a document type declaration is refused. */
  private readBangMarkup(at: number): XmlToken | undefined {
    const source = this.source;
    if (source.length - at < CDATA_START.length && !this.finished) return NEED_MORE;
    if (source.startsWith('<!--', at)) {
      const end = source.indexOf('-->', at + 4);
      if (end < 0) return this.unfinished();
      this.position = end + 3;
      return undefined;
    }
    if (source.startsWith(CDATA_START, at)) {
      const end = source.indexOf(']]>', at + CDATA_START.length);
      if (end < 0) return this.unfinished();
      this.cdataText = escapeXmlText(source.slice(at + CDATA_START.length, end));
      this.position = end + 3;
      return TEXT;
    }
    // Office Open XML parts may not declare a document type (ECMA-376 Part 2, 8.1.4); one that does could define entities.
    throw this.notUnderstood('it declares a document type');
  }

  private unfinished(): XmlToken {
    if (this.finished) throw this.notUnderstood('it ends in the middle of a tag');
    return NEED_MORE;
  }
}

function isSpace(code: number): boolean {
  return code === 0x20 || code === 0x0a || code === 0x09 || code === CARRIAGE_RETURN;
}

function skipSpace(source: string, from: number, end: number): number {
  let at = from;
  while (at < end && isSpace(source.charCodeAt(at))) at += 1;
  return at;
}

/** source[start, end) as a whole number of decimal digits, or -1. */
export function wholeNumberIn(source: string, start: number, end: number): number {
  if (end <= start || end - start > 15) return -1;
  let value = 0;
  for (let at = start; at < end; at += 1) {
    const digit = source.charCodeAt(at) - 0x30;
    if (digit < 0 || digit > 9) return -1;
    value = value * 10 + digit;
  }
  return value;
}

const NAMED_ENTITIES: Readonly<Record<string, string>> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" };
const CHARACTER_REFERENCE = /^#(?:x[0-9a-fA-F]{1,6}|[0-9]{1,7})$/;
const LINE_BREAK = /\r\n?/g;
/** `&#x10FFFF;` is the longest reference the decoder accepts; anything longer is no reference. */
const MAX_ENTITY_LENGTH = 10;

/**
 * XML text as its reader sees it (XML 1.0, 2.11 and 4.1): line breaks made `\n`, then the five
 * predefined entities and character references replaced. Undefined when the text holds an `&` that
 * is none of those; the caller names where.
 */
export function decodeXmlText(raw: string): string | undefined {
  const text = raw.indexOf('\r') >= 0 ? raw.replace(LINE_BREAK, '\n') : raw;
  let ampersand = text.indexOf('&');
  if (ampersand < 0) return text;
  let decoded = '';
  let copiedUpTo = 0;
  while (ampersand >= 0) {
    const semicolon = text.indexOf(';', ampersand + 1);
    if (semicolon < 0 || semicolon - ampersand > MAX_ENTITY_LENGTH) return undefined;
    const replacement = entityText(text.slice(ampersand + 1, semicolon));
    if (replacement === undefined) return undefined;
    decoded += text.slice(copiedUpTo, ampersand) + replacement;
    copiedUpTo = semicolon + 1;
    ampersand = text.indexOf('&', copiedUpTo);
  }
  return decoded + text.slice(copiedUpTo);
}

function entityText(name: string): string | undefined {
  if (name.charCodeAt(0) !== 0x23) return Object.hasOwn(NAMED_ENTITIES, name) ? NAMED_ENTITIES[name] : undefined;
  if (!CHARACTER_REFERENCE.test(name)) return undefined;
  const codePoint = name.charCodeAt(1) === 0x78 ? Number.parseInt(name.slice(2), 16) : Number.parseInt(name.slice(1), 10);
  const isCharacter = codePoint > 0 && codePoint <= 0x10ffff && (codePoint < 0xd800 || codePoint > 0xdfff);
  return isCharacter ? String.fromCodePoint(codePoint) : undefined;
}

/** Escapes CDATA content so that `decodeXmlText` gives it back unchanged (its line breaks are normalised, as XML 1.0, 2.11 asks). */
function escapeXmlText(text: string): string {
  return text.replace(/&/g, '&amp;');
}
