import { createReadStream } from 'node:fs';
import { open, type FileHandle } from 'node:fs/promises';
import { pipeline, Readable } from 'node:stream';
import { StringDecoder } from 'node:string_decoder';
import zlib from 'node:zlib';
import { ImportFileError } from './import-file-error';
import { XmlScanner } from './xlsx-xml-scanner';
import { readBytes, readZipDirectory, type ZipEntry } from './zip-directory';
import { isZlibError } from './zip-inflate-check';

const LOCAL_HEADER_SIGNATURE = 0x04034b50;
const LOCAL_HEADER_LENGTH = 30;
const METHOD_DEFLATED = 8;
/** Large reads and inflated chunks keep the per-chunk work (a promise, a scanner push) small next to the scanning. */
const CHUNK_BYTES = 64 * 1024;

/**
 * The parts of an XLSX package, found by its central directory and unpacked one at a time as
 * streams of text. Call only after `checkXlsxSafety` has passed the file: sizes, checksums and the
 * layout of the entries are taken as proven here.
 */
export class XlsxZipParts {
  private readonly byName = new Map<string, ZipEntry>();
  /** Part names are case-insensitive (ECMA-376 Part 2, 8.1.1.2). */
  private readonly byLowerCaseName = new Map<string, ZipEntry>();

  private constructor(
    private readonly filePath: string,
    private readonly file: FileHandle,
    entries: readonly ZipEntry[],
  ) {
    for (const entry of entries) {
      this.byName.set(entry.name, entry);
      this.byLowerCaseName.set(entry.name.toLowerCase(), entry);
    }
  }

  static async open(filePath: string): Promise<XlsxZipParts> {
    const file = await open(filePath, 'r');
    try {
      const { size } = await file.stat();
      const { entries } = await readZipDirectory(file, size);
      return new XlsxZipParts(filePath, file, entries);
    } catch (error) {
      await file.close();
      throw error;
    }
  }

  async close(): Promise<void> {
    await this.file.close();
  }

  /** The entry of a part named without its leading slash (`xl/workbook.xml`), if the package holds it. */
  find(partName: string): ZipEntry | undefined {
    return this.byName.get(partName) ?? this.byLowerCaseName.get(partName.toLowerCase());
  }

  /**
   * Unpacks one part into `scanner` chunk by chunk, calling `consume` after each chunk and once more
   * after `scanner.finish()`. `consume` is one object's method, not a closure, so the caller keeps its
   * state in fields and nothing is created per chunk.
   */
  async scanPart(entry: ZipEntry, scanner: XmlScanner, consumer: { consume(scanner: XmlScanner): void }): Promise<void> {
    for await (const text of this.textChunks(entry, scanner)) {
      scanner.push(text);
      consumer.consume(scanner);
    }
    scanner.finish();
    consumer.consume(scanner);
  }

  /** The part's text, inflated and decoded as UTF-8 one chunk at a time. */
  async *textChunks(entry: ZipEntry, scanner: XmlScanner): AsyncGenerator<string> {
    const bytes = await this.uncompressedBytes(entry);
    const decoder = new StringDecoder('utf8');
    let first = true;
    try {
      for await (const chunk of bytes) {
        if (first) {
          checkUtf8(chunk as Buffer, scanner);
          first = false;
        }
        const text = decoder.write(chunk as Buffer);
        if (text.length > 0) yield text;
      }
    } catch (error) {
      if (isZlibError(error)) throw scanner.notUnderstood('its compressed data cannot be unpacked');
      throw error;
    } finally {
      bytes.destroy();
    }
    const rest = decoder.end();
    if (rest.length > 0) yield rest;
  }

  private async uncompressedBytes(entry: ZipEntry): Promise<Readable> {
    const dataStart = await this.dataStart(entry);
    const source =
      entry.compressedSize === 0
        ? emptyStream()
        : createReadStream(this.filePath, { start: dataStart, end: dataStart + entry.compressedSize - 1, highWaterMark: CHUNK_BYTES });
    if (entry.compressionMethod !== METHOD_DEFLATED) return source;
    const inflate = zlib.createInflateRaw({ chunkSize: CHUNK_BYTES });
    // Errors of either stream reach the reader through `inflate`; the callback only keeps them from being unhandled.
    return pipeline(source, inflate, ignoreError);
  }

  /** Where the entry's bytes start: after its local header, whose name and extra field lengths may differ from the directory's. */
  private async dataStart(entry: ZipEntry): Promise<number> {
    const header = await readBytes(this.file, entry.localHeaderOffset, LOCAL_HEADER_LENGTH);
    if (header.length < LOCAL_HEADER_LENGTH || header.readUInt32LE(0) !== LOCAL_HEADER_SIGNATURE) {
      throw new ImportFileError({ code: 'corrupt_file', message: 'The file is not a readable zip archive: a part’s header is missing' });
    }
    return entry.localHeaderOffset + LOCAL_HEADER_LENGTH + header.readUInt16LE(26) + header.readUInt16LE(28);
  }
}

/** A read stream cannot be asked for no bytes (`end` is inclusive). */
function emptyStream(): Readable {
  return Readable.from([]);
}

function ignoreError(): void {}

/** Spreadsheet programs write their parts in UTF-8; a UTF-16 part would scan as nonsense, so it is refused. */
function checkUtf8(firstChunk: Buffer, scanner: XmlScanner): void {
  const [first, second] = firstChunk;
  if ((first === 0xff && second === 0xfe) || (first === 0xfe && second === 0xff)) {
    throw scanner.notUnderstood('it is written in UTF-16');
  }
}
