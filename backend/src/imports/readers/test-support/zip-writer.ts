import { createReadStream, createWriteStream, type WriteStream } from 'node:fs';
import { stat } from 'node:fs/promises';
import { once } from 'node:events';
import zlib from 'node:zlib';

/**
 * A small zip writer for tests (PKWARE APPNOTE.TXT 4.3): builds archives the way a program other than
 * exceljs would, including hostile ones. Writes to disk as it goes, so a 1 GB entry costs no memory.
 */

const DOS_DATE_1980_01_01 = 0x0021;
const FLAG_DATA_DESCRIPTOR = 0x0008;

export interface ZipPartOptions {
  readonly deflate?: boolean;
  /** Extra general-purpose flags, e.g. 0x0001 to mark the entry encrypted. */
  readonly flags?: number;
  /** What the headers claim instead of the truth, for a part that lies about its content. */
  readonly declaredUncompressedSize?: number;
  readonly declaredCrc?: number;
  /** Bytes written after the part's compressed data and counted in its compressed size. */
  readonly trailingBytes?: Buffer;
}

/** What a zip's headers say about a part's uncompressed content. */
export interface DeclaredContent {
  readonly crc: number;
  readonly uncompressedSize: number;
}

interface WrittenEntry {
  readonly name: Buffer;
  readonly flags: number;
  readonly method: number;
  readonly crc: number;
  readonly compressedSize: number;
  readonly uncompressedSize: number;
  readonly offset: number;
}

export class ZipFileWriter {
  private readonly out: WriteStream;
  private readonly entries: WrittenEntry[] = [];
  private offset = 0;

  constructor(filePath: string) {
    this.out = createWriteStream(filePath);
  }

  /** Adds a part whose bytes are known, with its sizes in the local header. */
  async addPart(name: string, data: Buffer | string, options: ZipPartOptions = {}): Promise<void> {
    const raw = Buffer.isBuffer(data) ? data : Buffer.from(data, 'utf8');
    const method = options.deflate === false ? 0 : 8;
    const compressed = method === 8 ? zlib.deflateRawSync(raw) : raw;
    const stored = Buffer.concat([compressed, options.trailingBytes ?? Buffer.alloc(0)]);
    const entry = {
      name: Buffer.from(name, 'utf8'),
      flags: options.flags ?? 0,
      method,
      crc: options.declaredCrc ?? zlib.crc32(raw),
      compressedSize: stored.length,
      uncompressedSize: options.declaredUncompressedSize ?? raw.length,
      offset: this.offset,
    };
    await this.write(localHeader(entry));
    await this.write(stored);
    this.entries.push(entry);
  }

  /** Adds `byteCount` zero bytes deflated as a stream, sizes in a trailing data descriptor: a zip bomb's payload. */
  async addDeflatedZeros(name: string, byteCount: number): Promise<void> {
    const start = { name: Buffer.from(name, 'utf8'), flags: FLAG_DATA_DESCRIPTOR, method: 8, offset: this.offset };
    await this.write(localHeader({ ...start, crc: 0, compressedSize: 0, uncompressedSize: 0 }));
    const { crc, compressedSize } = await deflateZeros(byteCount, (chunk) => this.write(chunk));
    const entry = { ...start, crc, compressedSize, uncompressedSize: byteCount };
    const descriptor = Buffer.alloc(16);
    descriptor.writeUInt32LE(0x08074b50, 0);
    descriptor.writeUInt32LE(crc, 4);
    descriptor.writeUInt32LE(compressedSize, 8);
    descriptor.writeUInt32LE(byteCount, 12);
    await this.write(descriptor);
    this.entries.push(entry);
  }

  /**
   * Adds a part whose raw-deflated bytes are already in `deflatedPath`, with sizes in the local header
   * and the content `declared` (true or not) in both headers; the bytes are copied, never held.
   */
  async addDeflatedFile(name: string, deflatedPath: string, declared: DeclaredContent): Promise<void> {
    const { size: compressedSize } = await stat(deflatedPath);
    const entry = { name: Buffer.from(name, 'utf8'), flags: 0, method: 8, ...declared, compressedSize, offset: this.offset };
    await this.write(localHeader(entry));
    for await (const chunk of createReadStream(deflatedPath)) await this.write(chunk as Buffer);
    this.entries.push(entry);
  }

  /** Writes the central directory and the end record, then closes the file. */
  async finish(): Promise<void> {
    const directoryOffset = this.offset;
    for (const entry of this.entries) await this.write(directoryHeader(entry));
    const end = Buffer.alloc(22);
    end.writeUInt32LE(0x06054b50, 0);
    end.writeUInt16LE(this.entries.length, 8);
    end.writeUInt16LE(this.entries.length, 10);
    end.writeUInt32LE(this.offset - directoryOffset, 12);
    end.writeUInt32LE(directoryOffset, 16);
    await this.write(end);
    this.out.end();
    await once(this.out, 'close');
  }

  private async write(bytes: Buffer): Promise<void> {
    this.offset += bytes.length;
    if (!this.out.write(bytes)) await once(this.out, 'drain');
  }
}

/** Raw-deflates `byteCount` zeros into `filePath` as a stream, so a 1 GB payload costs no memory; returns what they are. */
export async function writeDeflatedZeros(filePath: string, byteCount: number): Promise<DeclaredContent> {
  const out = createWriteStream(filePath);
  const { crc } = await deflateZeros(byteCount, async (chunk) => {
    if (!out.write(chunk)) await once(out, 'drain');
  });
  out.end();
  await once(out, 'close');
  return { crc, uncompressedSize: byteCount };
}

/** Streams `byteCount` zeros through raw deflate, handing each compressed chunk to `onChunk` in order. */
async function deflateZeros(
  byteCount: number,
  onChunk: (chunk: Buffer) => Promise<void>,
): Promise<{ crc: number; compressedSize: number }> {
  const deflate = zlib.createDeflateRaw({ level: 9 });
  let compressedSize = 0;
  const copied = (async () => {
    for await (const chunk of deflate) {
      compressedSize += (chunk as Buffer).length;
      await onChunk(chunk as Buffer);
    }
  })();
  const zeros = Buffer.alloc(1024 * 1024);
  let crc = 0;
  for (let written = 0; written < byteCount; written += zeros.length) {
    const chunk = zeros.subarray(0, Math.min(zeros.length, byteCount - written));
    crc = zlib.crc32(chunk, crc);
    if (!deflate.write(chunk)) await once(deflate, 'drain');
  }
  deflate.end();
  await copied;
  return { crc, compressedSize };
}

function localHeader(entry: WrittenEntry): Buffer {
  const header = Buffer.alloc(30);
  header.writeUInt32LE(0x04034b50, 0);
  header.writeUInt16LE(20, 4);
  header.writeUInt16LE(entry.flags, 6);
  header.writeUInt16LE(entry.method, 8);
  header.writeUInt16LE(DOS_DATE_1980_01_01, 12);
  header.writeUInt32LE(entry.crc, 14);
  header.writeUInt32LE(entry.compressedSize, 18);
  header.writeUInt32LE(entry.uncompressedSize, 22);
  header.writeUInt16LE(entry.name.length, 26);
  return Buffer.concat([header, entry.name]);
}

function directoryHeader(entry: WrittenEntry): Buffer {
  const header = Buffer.alloc(46);
  header.writeUInt32LE(0x02014b50, 0);
  header.writeUInt16LE(20, 4);
  header.writeUInt16LE(20, 6);
  header.writeUInt16LE(entry.flags, 8);
  header.writeUInt16LE(entry.method, 10);
  header.writeUInt16LE(DOS_DATE_1980_01_01, 14);
  header.writeUInt32LE(entry.crc, 16);
  header.writeUInt32LE(entry.compressedSize, 20);
  header.writeUInt32LE(entry.uncompressedSize, 24);
  header.writeUInt16LE(entry.name.length, 28);
  header.writeUInt32LE(entry.offset, 42);
  return Buffer.concat([header, entry.name]);
}

/** Writes a zip of small parts in the order given. */
export async function writeZip(
  filePath: string,
  parts: ReadonlyArray<{ name: string; data: Buffer | string; options?: ZipPartOptions }>,
): Promise<void> {
  const zip = new ZipFileWriter(filePath);
  for (const part of parts) await zip.addPart(part.name, part.data, part.options);
  await zip.finish();
}
