/** What every upload route shares: how a client's file name is kept, how a size limit reads. */

const LONGEST_FILE_NAME = 200;

/** A client's file name, kept only as a label: no folders, no control characters, not too long; the fallback when nothing is left. */
export function cleanUploadFileName(name: string, fallback: string): string {
  const base = name.split(/[\\/]/).pop() ?? '';
  return Array.from(base.replace(/\p{Cc}/gu, '').trim()).slice(0, LONGEST_FILE_NAME).join('') || fallback;
}

/** "10 MB" for 10 485 760 bytes: how people read a size limit. */
export function megabytes(bytes: number): string {
  return `${Number((bytes / (1024 * 1024)).toFixed(1))} MB`;
}
