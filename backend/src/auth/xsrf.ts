import { randomBytes, timingSafeEqual } from 'node:crypto';
import type { RequestHandler, Response } from 'express';
import { AppError } from '../http/app-error';

/** The names Angular's HttpClient uses for its XSRF support. */
export const XSRF_COOKIE = 'XSRF-TOKEN';
export const XSRF_HEADER = 'x-xsrf-token';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** Readable by the page's script (not HttpOnly), which echoes it in the header. */
export function setXsrfCookie(res: Response, token: string, secure: boolean): void {
  res.cookie(XSRF_COOKIE, token, { httpOnly: false, sameSite: 'lax', secure, path: '/' });
}

function sameToken(a: string, b: string): boolean {
  const left = Buffer.from(a);
  const right = Buffer.from(b);
  return left.length === right.length && timingSafeEqual(left, right);
}

/**
 * Refuses every unsafe request whose X-XSRF-TOKEN header does not match the token: the session's
 * own once signed in, otherwise the cookie's. Another site can make the browser send the cookie,
 * but cannot read it to copy it into the header.
 */
export function xsrfProtection({ secureCookies }: { secureCookies: boolean }): RequestHandler {
  return (req, res, next) => {
    const cookies = (req.cookies ?? {}) as Record<string, string | undefined>;
    const expected = req.session.xsrfToken ?? cookies[XSRF_COOKIE];
    if (expected === undefined || cookies[XSRF_COOKIE] !== expected) {
      setXsrfCookie(res, req.session.xsrfToken ?? randomBytes(32).toString('base64url'), secureCookies);
    }
    if (SAFE_METHODS.has(req.method)) return next();
    const offered = req.get(XSRF_HEADER);
    if (!offered || !expected || !sameToken(offered, expected)) {
      return next(new AppError({ code: 'xsrf_check_failed', status: 403, message: 'The request lacks a valid X-XSRF-TOKEN header; reload the page and try again' }));
    }
    next();
  };
}
