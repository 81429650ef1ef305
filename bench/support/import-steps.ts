import path from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import type { ImportDetail, ImportProblem } from '../../shared/src';
import type { HttpAnswer, SignedInHttp } from './signed-in-http';

/** How often a commit in the background is asked about: often enough that the time it finished is known to a fraction of a second. */
const POLL_MS = 200;

/** The error's code and message of an API answer, or the start of its body. */
export function describeAnswer(answer: HttpAnswer): string {
  try {
    const { error } = JSON.parse(answer.text) as { error?: { code?: string; message?: string } };
    if (error?.message) return `${error.code ?? 'error'}: ${error.message}`;
  } catch {
    // Not JSON: the text itself says what happened.
  }
  return answer.text.slice(0, 300);
}

/** One problem of an import as the error report lists it: where, the value, what is wrong. */
export function describeProblem(problem: ImportProblem): string {
  const column = problem.column === '' ? '' : `, ${problem.column}`;
  const value = problem.value === null ? '' : ` (${JSON.stringify(problem.value)})`;
  return `${problem.sheet} row ${problem.row}${column}${value}: ${problem.message}`;
}

function answerOf(answer: HttpAnswer, request: string, expected: readonly number[]): ImportDetail {
  if (!expected.includes(answer.status)) throw new Error(`${request} answered ${answer.status}: ${describeAnswer(answer)}`);
  return JSON.parse(answer.text) as ImportDetail;
}

/** `POST /api/imports`: uploads the file as the import page does and answers the check (with whatever problems it found). */
export async function uploadForCheck(http: SignedInHttp, filePath: string): Promise<ImportDetail> {
  return answerOf(await http.postFile('/api/imports', 'file', filePath, path.basename(filePath)), 'POST /api/imports', [201]);
}

/**
 * `POST /api/imports/:id/commit`, then waits until the import is written or has failed, whichever
 * way the server takes it: answered when done (200), or accepted (202, `committing`), done in the
 * background and asked about every POLL_MS. `onProgress` hears each answer while it commits.
 */
export async function commitAndWait(
  http: SignedInHttp,
  checked: Pick<ImportDetail, 'id' | 'version'>,
  onProgress: (progress: ImportDetail['progress']) => void = () => undefined,
): Promise<{ detail: ImportDetail; status: number }> {
  const answer = await http.postJson(`/api/imports/${checked.id}/commit`, { version: checked.version });
  let detail = answerOf(answer, `POST /api/imports/${checked.id}/commit`, [200, 202]);
  while (detail.state === 'committing') {
    onProgress(detail.progress);
    await sleep(POLL_MS);
    detail = answerOf(await http.get(`/api/imports/${checked.id}`), `GET /api/imports/${checked.id}`, [200]);
  }
  return { detail, status: answer.status };
}
