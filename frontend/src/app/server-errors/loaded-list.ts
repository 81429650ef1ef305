import { computed, type Signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { catchError, map, of, startWith, switchMap, type Observable } from 'rxjs';

import { saveFailureOf } from '../structures/field-problems';

type ListState<T> = { readonly kind: 'loading' } | { readonly kind: 'loaded'; readonly items: readonly T[] } | { readonly kind: 'failed'; readonly message: string };

/** A list as a page shows it: its items once loaded, whether it is loading, and why it failed. */
export interface LoadedList<T> {
  /** Empty while loading or failed. */
  readonly items: Signal<readonly T[]>;
  readonly loading: Signal<boolean>;
  readonly failure: Signal<string | null>;
}

function plainFailureText(error: unknown): string {
  const failure = saveFailureOf(error);
  return failure.kind === 'other' ? failure.message : 'Reload the page.';
}

/**
 * A list fetched for a key (a structure's id, say) and fetched again whenever the key changes,
 * the earlier request dropped. Call it where `inject` may be called (a field initialiser).
 */
export function loadedList<K, T>(key: Signal<K>, fetch: (key: K) => Observable<readonly T[]>, failureText: (error: unknown) => string = plainFailureText): LoadedList<T> {
  const state = toSignal(
    toObservable(key).pipe(
      switchMap((value) =>
        fetch(value).pipe(
          map((items): ListState<T> => ({ kind: 'loaded', items })),
          catchError((error: unknown) => of<ListState<T>>({ kind: 'failed', message: failureText(error) })),
          startWith<ListState<T>>({ kind: 'loading' }),
        ),
      ),
    ),
    { initialValue: { kind: 'loading' } as ListState<T> },
  );
  return {
    items: computed(() => {
      const now = state();
      return now.kind === 'loaded' ? now.items : [];
    }),
    loading: computed(() => state().kind === 'loading'),
    failure: computed(() => {
      const now = state();
      return now.kind === 'failed' ? now.message : null;
    }),
  };
}
