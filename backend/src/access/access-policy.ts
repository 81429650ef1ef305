import type { Request, RequestHandler } from 'express';
import { can, permissionFor, type Action, type SignedInUser } from '../../../shared/src';
import { AppError } from '../http/app-error';

const POLICY = Symbol('access policy');

/** A route's declared access rule: a middleware that also names itself, so routes without one can be found. */
export type AccessPolicy = RequestHandler & { readonly [POLICY]: string };

function policy(description: string, decide: (user: SignedInUser | null) => 'allow' | 'sign in' | 'forbidden'): AccessPolicy {
  const handler: RequestHandler = (req, _res, next) => {
    const decision = decide(req.user ?? null);
    if (decision === 'allow') return next();
    if (decision === 'sign in') return next(AppError.signInRequired());
    next(AppError.forbidden(`Your role may not do this: ${description}`));
  };
  return Object.assign(handler, { [POLICY]: description });
}

/** The access rules routes declare; every route must start with one of them (deny by default). */
export const allow = {
  /** Anyone, signed in or not: health, sign-in, metadata, the page shell. */
  public: policy('anyone', () => 'allow'),
  signedIn: policy('any signed-in user', (user) => (user ? 'allow' : 'sign in')),
  /** What the permission matrix lets the user's role (and admin capability) do. */
  to(action: Action): AccessPolicy {
    return policy(permissionFor(action).description.toLowerCase(), (user) => {
      if (!user) return 'sign in';
      return can(user, action) ? 'allow' : 'forbidden';
    });
  },
};

export function isAccessPolicy(handler: unknown): handler is AccessPolicy {
  return typeof handler === 'function' && POLICY in handler;
}

export function policyDescription(handler: AccessPolicy): string {
  return handler[POLICY];
}

export function signedInUser(req: Request): SignedInUser {
  if (!req.user) throw AppError.signInRequired();
  return req.user;
}
