import type { FileHandle } from 'node:fs/promises';
import { ImportFileError } from './import-file-error';

/**
 * Reads a zip archive's central directory (PKWARE APPNOTE.TXT, sections 4.3.12 to 4.3.16) without
 * inflating anything: only the directory's own bytes are read, so memory stays small whatever the
 * entries claim to hold.
 */

const END_OF_DIRECTORY_SIGNATURE = 0x06054b50;
const ZIP64_END_OF_DIRECTORY_SIGNATURE = 0x06064b50;
const ZIP64_LOCATOR_SIGNATURE = 0x07064b50;
const DIRECTORY_ENTRY_SIGNATURE = 0x02014b50;
const END_OF_DIRECTORY_LENGTH = 22;
const ZIP64_LOCATOR_LENGTH = 20;
const MAX_COMMENT_LENGTH = 0xffff;
const ZIP64_EXTRA_FIELD_ID = 0x0001;
/** A directory larger than this is not an office document; refuse it rather than read it. */
const MAX_DIRECTORY_BYTES = 16 * 1024 * 1024;

export interface ZipEntry {
  readonly name: string;
  /** General purpose bit flags: bit 0 encrypted, bit 3 sizes in a data descriptor, bit 6 strong encryption. */
  readonly flags: number;
  /** 0 stored, 8 deflated. */
  readonly compressionMethod: number;
  /** CRC-32 of the uncompressed bytes (APPNOTE 4.4.7), as an unsigned 32-bit number. */
  readonly crc32: number;
  readonly compressedSize: number;
  readonly uncompressedSize: number;
  readonly localHeaderOffset: number;
}

export interface ZipDirectory {
  readonly entries: readonly ZipEntry[];
  /** Where the central directory starts: the entries' data must all end before it. */
  readonly directoryOffset: number;
}

function corrupt(detail: string): ImportFileError {
  return new ImportFileError({ code: 'corrupt_file', message: `The file is not a readable zip archive: ${detail}` });
}

export async function readBytes(file: FileHandle, position: number, length: number): Promise<Buffer> {
  const buffer = Buffer.alloc(length);
  const { bytesRead } = await file.read(buffer, 0, length, position);
  return buffer.subarray(0, bytesRead);
}

/** Reads the central directory of the zip archive open in `file` (of `fileSize` bytes). */
export async function readZipDirectory(file: FileHandle, fileSize: number): Promise<ZipDirectory> {
  const tailLength = Math.min(fileSize, END_OF_DIRECTORY_LENGTH + MAX_COMMENT_LENGTH);
  const tailStart = fileSize - tailLength;
  const tail = await readBytes(file, tailStart, tailLength);
  const endAt = findEndOfDirectory(tail);
  if (endAt < 0) throw corrupt('its end-of-directory record is missing');

  let entryCount = tail.readUInt16LE(endAt + 10);
  let directorySize = tail.readUInt32LE(endAt + 12);
  let directoryOffset = tail.readUInt32LE(endAt + 16);
  if (entryCount === 0xffff || directorySize === 0xffffffff || directoryOffset === 0xffffffff) {
    ({ entryCount, directorySize, directoryOffset } = await readZip64End(file, tailStart + endAt));
  }
  if (directoryOffset + directorySize > fileSize) throw corrupt('its directory points past the end of the file');
  if (directorySize > MAX_DIRECTORY_BYTES) throw corrupt('its directory is too large for an office document');

  const directory = await readBytes(file, directoryOffset, directorySize);
  return { entries: parseEntries(directory, entryCount), directoryOffset };
}

/** The record is the last one with its signature: a comment may follow it, up to 64 KB. */
function findEndOfDirectory(tail: Buffer): number {
  for (let at = tail.length - END_OF_DIRECTORY_LENGTH; at >= 0; at -= 1) {
    if (tail.readUInt32LE(at) === END_OF_DIRECTORY_SIGNATURE) return at;
  }
  return -1;
}

async function readZip64End(file: FileHandle, endOfDirectoryAt: number) {
  const locatorAt = endOfDirectoryAt - ZIP64_LOCATOR_LENGTH;
  if (locatorAt < 0) throw corrupt('its zip64 locator is missing');
  const locator = await readBytes(file, locatorAt, ZIP64_LOCATOR_LENGTH);
  if (locator.readUInt32LE(0) !== ZIP64_LOCATOR_SIGNATURE) throw corrupt('its zip64 locator is missing');
  const recordAt = safeNumber(locator.readBigUInt64LE(8));
  const record = await readBytes(file, recordAt, 56);
  if (record.length < 56 || record.readUInt32LE(0) !== ZIP64_END_OF_DIRECTORY_SIGNATURE) {
    throw corrupt('its zip64 end-of-directory record is missing');
  }
  return {
    entryCount: safeNumber(record.readBigUInt64LE(32)),
    directorySize: safeNumber(record.readBigUInt64LE(40)),
    directoryOffset: safeNumber(record.readBigUInt64LE(48)),
  };
}

function safeNumber(value: bigint): number {
  if (value > BigInt(Number.MAX_SAFE_INTEGER)) throw corrupt('it declares a size beyond any real file');
  return Number(value);
}

function parseEntries(directory: Buffer, entryCount: number): ZipEntry[] {
  const entries: ZipEntry[] = [];
  let at = 0;
  while (at < directory.length) {
    if (at + 46 > directory.length || directory.readUInt32LE(at) !== DIRECTORY_ENTRY_SIGNATURE) {
      throw corrupt('its directory holds a damaged entry');
    }
    const nameLength = directory.readUInt16LE(at + 28);
    const extraLength = directory.readUInt16LE(at + 30);
    const commentLength = directory.readUInt16LE(at + 32);
    const nameStart = at + 46;
    const extraStart = nameStart + nameLength;
    const next = extraStart + extraLength + commentLength;
    if (next > directory.length) throw corrupt('its directory holds a damaged entry');
    const sizes = withZip64Sizes(
      {
        compressedSize: directory.readUInt32LE(at + 20),
        uncompressedSize: directory.readUInt32LE(at + 24),
        localHeaderOffset: directory.readUInt32LE(at + 42),
      },
      directory.subarray(extraStart, extraStart + extraLength),
    );
    entries.push({
      name: directory.toString('utf8', nameStart, extraStart),
      flags: directory.readUInt16LE(at + 8),
      compressionMethod: directory.readUInt16LE(at + 10),
      crc32: directory.readUInt32LE(at + 16),
      ...sizes,
    });
    at = next;
  }
  if (entries.length !== entryCount) throw corrupt('its directory and its entry count disagree');
  return entries;
}

interface EntrySizes {
  compressedSize: number;
  uncompressedSize: number;
  localHeaderOffset: number;
}

/** APPNOTE 4.5.3: a 32-bit field of all ones means the real value sits in the zip64 extra field, in this order. */
function withZip64Sizes(sizes: EntrySizes, extra: Buffer): EntrySizes {
  const fields = ['uncompressedSize', 'compressedSize', 'localHeaderOffset'] as const;
  if (!fields.some((field) => sizes[field] === 0xffffffff)) return sizes;
  let at = 0;
  while (at + 4 <= extra.length) {
    const id = extra.readUInt16LE(at);
    const length = extra.readUInt16LE(at + 2);
    if (id === ZIP64_EXTRA_FIELD_ID) {
      const result = { ...sizes };
      let valueAt = at + 4;
      for (const field of fields) {
        if (sizes[field] !== 0xffffffff) continue;
        if (valueAt + 8 > at + 4 + length) throw corrupt('an entry has a damaged zip64 field');
        result[field] = safeNumber(extra.readBigUInt64LE(valueAt));
        valueAt += 8;
      }
      return result;
    }
    at += 4 + length;
  }
  throw corrupt('an entry declares zip64 sizes without a zip64 field');
}
