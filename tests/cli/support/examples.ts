import fs from 'node:fs';
import path from 'node:path';
import { REPO_ROOT } from './run-spanledger';

export const EXAMPLES_DIR = path.join(REPO_ROOT, 'examples');

/** The valid examples: every examples/*.json (the bad ones live in examples/bad/). */
export const VALID_EXAMPLES = fs
  .readdirSync(EXAMPLES_DIR)
  .filter((name) => name.endsWith('.json'))
  .map((name) => name.slice(0, -'.json'.length))
  .sort();

/** The rating examples, examples/rate/*.json, with their outputs in examples/rate/expected/. */
export const RATE_EXAMPLES = fs
  .readdirSync(path.join(EXAMPLES_DIR, 'rate'))
  .filter((name) => name.endsWith('.json'))
  .map((name) => `rate/${name.slice(0, -'.json'.length)}`)
  .sort();

export const readExample = (relativePath: string): string => fs.readFileSync(path.join(EXAMPLES_DIR, relativePath), 'utf8');

/** `name` or `rate/name`: the golden output sits in the `expected/` folder beside the example. */
export const goldenOutput = (name: string): unknown => {
  const slash = name.lastIndexOf('/');
  return JSON.parse(readExample(`${name.slice(0, slash + 1)}expected/${name.slice(slash + 1)}.out.json`));
};

/** The parts of a calculation file that the bad-input cases change. */
export interface EditableFile {
  [key: string]: unknown;
  girder: { [key: string]: unknown; section: Record<string, unknown>; strandRows: Record<string, unknown>[] };
  damage?: Record<string, unknown>[];
}

/** The rectangle example with a change applied, as JSON text: a base for bad-input cases. */
export function rectangleWith(change: (file: EditableFile) => void): string {
  const file = JSON.parse(readExample('rectangle-two-rows.json')) as EditableFile;
  change(file);
  return JSON.stringify(file, null, 2);
}
