import { open } from 'node:fs/promises';
import type { FileHandle } from 'node:fs/promises';
import { ImportFileError } from './import-file-error';
import { readBytes, readZipDirectory, type ZipDirectory, type ZipEntry } from './zip-directory';
import { checkEntriesInflateAsDeclared, type LocatedZipEntry } from './zip-inflate-check';

export interface XlsxSafetyLimits {
  /** Sum of every entry's declared uncompressed size. */
  readonly maxTotalUncompressedBytes: number;
  /** Uncompressed ÷ compressed above which an entry counts as a zip bomb… */
  readonly maxCompressionRatio: number;
  /** …once its uncompressed size passes this (small parts such as styles compress far better). */
  readonly ratioCheckFromBytes: number;
  readonly maxEntries: number;
}

const MB = 1024 * 1024;

/**
 * 100:1 above 1 MB is the same 1 % minimum inflate ratio Apache POI's ZipSecureFile applies to office
 * files (from memory — verify); 200 MB of XML holds far more rows than the import's row cap.
 */
export const DEFAULT_XLSX_SAFETY_LIMITS: XlsxSafetyLimits = {
  maxTotalUncompressedBytes: 200 * MB,
  maxCompressionRatio: 100,
  ratioCheckFromBytes: 1 * MB,
  maxEntries: 1000,
};

const LOCAL_HEADER_SIGNATURE = 0x04034b50;
const LOCAL_HEADER_LENGTH = 30;
const FLAG_ENCRYPTED = 0x0001;
const FLAG_DATA_DESCRIPTOR = 0x0008;
const FLAG_STRONG_ENCRYPTION = 0x0040;
const METHOD_STORED = 0;
const METHOD_DEFLATED = 8;
/** A data descriptor is 12 bytes, 16 with its optional signature, 20 or 24 with zip64 sizes (APPNOTE 4.3.9). */
const DATA_DESCRIPTOR_LENGTHS = new Set([12, 16, 20, 24]);

/**
 * Refuses an XLSX whose zip structure could exhaust memory, disk or time when opened, or that hides
 * entries. First the central directory and the local headers are read and their declared sizes
 * checked against the limits; only then is each entry inflated, into a counter that keeps nothing, to
 * prove it holds what it declares. Throws `ImportFileError`; resolves when the file may be handed to
 * the spreadsheet reader.
 */
export async function checkXlsxSafety(filePath: string, limits: Partial<XlsxSafetyLimits> = {}): Promise<void> {
  const chosen = { ...DEFAULT_XLSX_SAFETY_LIMITS, ...limits };
  const entries = await checkZipStructure(filePath, chosen);
  await checkEntriesInflateAsDeclared(filePath, entries);
}

/** The checks that read only the directory and the local headers; returns where each entry's data starts. */
async function checkZipStructure(filePath: string, limits: XlsxSafetyLimits): Promise<LocatedZipEntry[]> {
  const file = await open(filePath, 'r');
  try {
    const { size } = await file.stat();
    const directory = await readZipDirectory(file, size);
    checkEntries(directory.entries, limits);
    return await checkLocalHeadersMatch(file, directory);
  } finally {
    await file.close();
  }
}

function checkEntries(entries: readonly ZipEntry[], limits: XlsxSafetyLimits): void {
  if (entries.length > limits.maxEntries) {
    throw new ImportFileError({
      code: 'too_many_entries',
      message: `The workbook holds ${entries.length} parts; at most ${limits.maxEntries} are accepted`,
    });
  }
  let totalUncompressed = 0;
  for (const entry of entries) {
    checkEntry(entry, limits);
    totalUncompressed += entry.uncompressedSize;
  }
  if (totalUncompressed > limits.maxTotalUncompressedBytes) {
    throw new ImportFileError({
      code: 'file_too_large_uncompressed',
      message: `The workbook unpacks to ${formatMegabytes(totalUncompressed)}; at most ${formatMegabytes(limits.maxTotalUncompressedBytes)} are accepted — split it into smaller files`,
    });
  }
}

function checkEntry(entry: ZipEntry, limits: XlsxSafetyLimits): void {
  if (entry.flags & (FLAG_ENCRYPTED | FLAG_STRONG_ENCRYPTION)) {
    throw new ImportFileError({
      code: 'encrypted_file',
      message: 'The workbook is encrypted; remove its password and upload it again',
    });
  }
  if (escapesArchive(entry.name)) {
    throw new ImportFileError({
      code: 'unsafe_entry_path',
      message: 'The workbook holds a part whose path leaves the archive; it was not made by a spreadsheet program',
    });
  }
  if (entry.compressionMethod !== METHOD_STORED && entry.compressionMethod !== METHOD_DEFLATED) {
    throw new ImportFileError({
      code: 'corrupt_file',
      message: `The workbook uses a compression method (${entry.compressionMethod}) spreadsheet programs do not write`,
    });
  }
  if (entry.compressionMethod === METHOD_STORED && entry.compressedSize !== entry.uncompressedSize) {
    throw new ImportFileError({ code: 'corrupt_file', message: 'The workbook has a part whose sizes disagree' });
  }
  const ratio = entry.uncompressedSize / Math.max(entry.compressedSize, 1);
  if (entry.uncompressedSize > limits.ratioCheckFromBytes && ratio > limits.maxCompressionRatio) {
    throw new ImportFileError({
      code: 'zip_bomb',
      message: `The workbook has a part that expands ${Math.round(ratio)} times (more than ${limits.maxCompressionRatio}); it was refused as a possible zip bomb`,
    });
  }
}

/** `..` segments, absolute paths and drive letters could write or read outside a folder the parts unpack to. */
function escapesArchive(name: string): boolean {
  if (name.includes('\0') || /^[\\/]/.test(name) || /^[A-Za-z]:/.test(name)) return true;
  return name.split(/[\\/]/).some((segment) => segment === '..');
}

/**
 * Our reader finds each part by the directory checked above, but other zip readers walk the local
 * headers from the start of the file. So every local header must agree with its directory entry and
 * the entries must sit back to back from byte 0 to the directory: nothing unchecked can hide between
 * them, and every reader sees the same parts.
 */
async function checkLocalHeadersMatch(file: FileHandle, directory: ZipDirectory): Promise<LocatedZipEntry[]> {
  const byOffset = [...directory.entries].sort((a, b) => a.localHeaderOffset - b.localHeaderOffset);
  const located: LocatedZipEntry[] = [];
  let expectedOffset = 0;
  for (const [index, entry] of byOffset.entries()) {
    if (entry.localHeaderOffset !== expectedOffset) throw hiddenData();
    const dataStart = await readLocalHeaderEnd(file, entry);
    located.push({ entry, dataStart });
    const dataEnd = dataStart + entry.compressedSize;
    const nextOffset = byOffset[index + 1]?.localHeaderOffset ?? directory.directoryOffset;
    const gap = nextOffset - dataEnd;
    const gapAllowed = entry.flags & FLAG_DATA_DESCRIPTOR ? DATA_DESCRIPTOR_LENGTHS.has(gap) : gap === 0;
    if (!gapAllowed) throw hiddenData();
    expectedOffset = nextOffset;
  }
  if (expectedOffset !== directory.directoryOffset) throw hiddenData();
  return located;
}

/** Checks one local header against its directory entry; returns where the entry's data starts. */
async function readLocalHeaderEnd(file: FileHandle, entry: ZipEntry): Promise<number> {
  const nameBytes = Buffer.from(entry.name, 'utf8');
  const header = await readBytes(file, entry.localHeaderOffset, LOCAL_HEADER_LENGTH + nameBytes.length);
  if (header.length < LOCAL_HEADER_LENGTH || header.readUInt32LE(0) !== LOCAL_HEADER_SIGNATURE) throw hiddenData();
  const method = header.readUInt16LE(8);
  const localCompressedSize = header.readUInt32LE(18);
  const nameLength = header.readUInt16LE(26);
  const extraLength = header.readUInt16LE(28);
  const sameName = nameLength === nameBytes.length && header.subarray(LOCAL_HEADER_LENGTH).equals(nameBytes);
  // With a data descriptor the local size may be 0 (the reader then scans for the descriptor); zip64 puts all ones here.
  const sizeDeferred = (entry.flags & FLAG_DATA_DESCRIPTOR && localCompressedSize === 0) || localCompressedSize === 0xffffffff;
  const sameSize = sizeDeferred || localCompressedSize === entry.compressedSize;
  if (!sameName || method !== entry.compressionMethod || !sameSize) throw hiddenData();
  return entry.localHeaderOffset + LOCAL_HEADER_LENGTH + nameLength + extraLength;
}

function hiddenData(): ImportFileError {
  return new ImportFileError({
    code: 'corrupt_file',
    message: 'The workbook’s parts do not match its table of contents; open and save it in a spreadsheet program, then upload it again',
  });
}

function formatMegabytes(bytes: number): string {
  return `${Math.round(bytes / MB)} MB`;
}
