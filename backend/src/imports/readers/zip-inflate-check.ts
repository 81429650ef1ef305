import { createReadStream } from 'node:fs';
import { Readable, Writable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import zlib from 'node:zlib';
import { ImportFileError } from './import-file-error';
import type { ZipEntry } from './zip-directory';

const METHOD_DEFLATED = 8;

/** A directory entry with where its compressed bytes start, found from its local header. */
export interface LocatedZipEntry {
  readonly entry: ZipEntry;
  readonly dataStart: number;
}

/**
 * Proves that every entry unpacks to the size and CRC-32 its directory entry declares, by inflating it
 * into a counter that keeps nothing: a hand-made zip can declare a kilobyte and inflate to gigabytes.
 * An entry is stopped as soon as it passes its declared size, so the work is bounded by the sum of the
 * declared sizes, which the directory checks have already held under the total cap.
 */
export async function checkEntriesInflateAsDeclared(filePath: string, entries: readonly LocatedZipEntry[]): Promise<void> {
  for (const located of entries) await checkEntryInflatesAsDeclared(filePath, located);
}

async function checkEntryInflatesAsDeclared(filePath: string, { entry, dataStart }: LocatedZipEntry): Promise<void> {
  const source = compressedBytes(filePath, dataStart, entry.compressedSize);
  const counter = new DeclaredSizeCounter(entry.uncompressedSize);
  const inflate = entry.compressionMethod === METHOD_DEFLATED ? zlib.createInflateRaw() : undefined;
  try {
    await (inflate ? pipeline(source, inflate, counter) : pipeline(source, counter));
  } catch (error) {
    if (isZlibError(error)) throw damagedPart('its compressed data cannot be unpacked');
    throw error;
  }
  // The spreadsheet reader stops at the end of the deflate stream; bytes after it would go unchecked.
  if (inflate && inflate.bytesWritten !== entry.compressedSize) throw damagedPart('it holds bytes after its compressed data');
  if (counter.byteCount !== entry.uncompressedSize) throw damagedPart('it unpacks to fewer bytes than it declares');
  if (counter.crc32 !== entry.crc32) throw damagedPart('its checksum does not match its content');
}

function compressedBytes(filePath: string, start: number, length: number): Readable {
  // `end` is inclusive, and a read stream cannot be asked for nothing.
  return length === 0 ? Readable.from([]) : createReadStream(filePath, { start, end: start + length - 1 });
}

/** Counts and checksums the bytes written to it, keeping none; fails once they pass the declared size. */
class DeclaredSizeCounter extends Writable {
  byteCount = 0;
  crc32 = 0;
  private readonly declaredSize: number;

  constructor(declaredSize: number) {
    super();
    this.declaredSize = declaredSize;
  }

  override _write(chunk: Buffer, _encoding: BufferEncoding, done: (error?: Error | null) => void): void {
    this.byteCount += chunk.length;
    // Failing here makes the pipeline destroy the file stream and the inflater: nothing more is read.
    if (this.byteCount > this.declaredSize) {
      done(
        new ImportFileError({
          code: 'zip_bomb',
          message: 'The workbook has a part that unpacks to more than its table of contents declares; it was refused as a possible zip bomb',
        }),
      );
      return;
    }
    this.crc32 = zlib.crc32(chunk, this.crc32);
    done();
  }
}

/** zlib reports bad compressed data with codes such as Z_DATA_ERROR and Z_BUF_ERROR; file system errors stay as they are. */
export function isZlibError(error: unknown): boolean {
  const code = (error as { code?: unknown } | null)?.code;
  return typeof code === 'string' && code.startsWith('Z_');
}

function damagedPart(reason: string): ImportFileError {
  return new ImportFileError({
    code: 'corrupt_file',
    message: `The workbook has a damaged part (${reason}); open and save it in a spreadsheet program, then upload it again`,
  });
}
