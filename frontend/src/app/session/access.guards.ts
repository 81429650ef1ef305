import { inject } from '@angular/core';
import { CanActivateFn, Router } from '@angular/router';
import { can, type Action } from '@spanledger/shared';

import { SessionStore } from './session.store';

/** Pages that show data need a signed-in user; a visitor goes to the sign-in page and comes back. */
export const signedInGuard: CanActivateFn = async (_route, state) => {
  // inject() works only before the first await.
  const router = inject(Router);
  const user = await inject(SessionStore).load();
  return user ? true : router.createUrlTree(['/sign-in'], { queryParams: { returnTo: state.url } });
};

/** A page for those whose role may do `action`; the server checks again on every request. */
export function allowedTo(action: Action): CanActivateFn {
  return async (_route, state) => {
    const router = inject(Router);
    const user = await inject(SessionStore).load();
    if (!user) return router.createUrlTree(['/sign-in'], { queryParams: { returnTo: state.url } });
    return can(user, action) ? true : router.createUrlTree(['/not-allowed'], { queryParams: { page: state.url } });
  };
}
