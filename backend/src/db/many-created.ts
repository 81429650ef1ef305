import type { AppError } from '../http/app-error';

/**
 * What adding many records at once gives back: the new id of each item, in the order given (null
 * where it was refused), and each refusal by the item's index. The items accepted are written
 * even when others are refused; the caller decides whether its transaction keeps them.
 */
export interface ManyCreated {
  readonly ids: readonly (number | null)[];
  readonly refused: ReadonlyMap<number, AppError>;
}

/** The one refusal of a single-item call, thrown as the single-item API would; else the one id. */
export function onlyCreatedId(created: ManyCreated): number {
  const refusal = created.refused.get(0);
  if (refusal) throw refusal;
  return created.ids[0]!;
}

/** Slices of at most `size` items, so one statement stays well under PostgreSQL's bind-parameter limit. */
export function* inChunks<T>(items: readonly T[], size: number): Generator<readonly T[]> {
  for (let start = 0; start < items.length; start += size) yield items.slice(start, start + size);
}
