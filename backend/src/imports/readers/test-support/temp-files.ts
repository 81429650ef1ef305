import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { ImportFileError } from '../import-file-error';
import { readRows, type ReadRowsOptions } from '../read-rows';

/** A temporary folder per test file, removed afterwards; `file(name)` gives a path inside it. */
export function useTempFolder() {
  let folder = '';
  beforeAll(() => {
    folder = fs.mkdtempSync(path.join(os.tmpdir(), 'spanledger-import-readers-'));
  });
  afterAll(() => fs.rmSync(folder, { recursive: true, force: true }));
  return { file: (name: string) => path.join(folder, name) };
}

export async function readAllRows(filePath: string, options?: ReadRowsOptions) {
  const rows = [];
  for await (const row of readRows(filePath, options)) rows.push(row);
  return rows;
}

/** The ImportFileError the promise rejects with; fails the test when it resolves or rejects otherwise. */
export async function importFailure(promise: Promise<unknown>): Promise<ImportFileError> {
  try {
    await promise;
  } catch (error) {
    if (error instanceof ImportFileError) return error;
    throw error;
  }
  throw new Error('expected an ImportFileError, but the file was accepted');
}
