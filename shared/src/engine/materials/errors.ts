/**
 * Bad input to the engine: a value the chosen method cannot accept (a PCI curve for strand of
 * another grade, a cube strength given to a cylinder-strength formula). `path` is the
 * calculation file's JSON path of the offending value, e.g. `girder.strandRows[2].fpuMpa`, and
 * the message reads `path: problem` as the command line prints it (calc-file.md).
 */
export class EngineInputError extends Error {
  override readonly name = 'EngineInputError';

  constructor(
    readonly path: string,
    readonly problem: string,
  ) {
    super(`${path}: ${problem}`);
  }
}

/** Joins a parent JSON path and a key: `joinPath('girder.concrete', 'basis')`; an empty parent gives the key alone. */
export function joinPath(parentPath: string, key: string): string {
  return parentPath === '' ? key : `${parentPath}.${key}`;
}
