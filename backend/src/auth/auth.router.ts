import express, { Router, type NextFunction, type Request, type RequestHandler, type Response } from 'express';
import type { AuthenticateOptions } from 'passport';
import type { Profile, Strategy } from '@node-saml/passport-saml';
import { allow, signedInUser } from '../access/access-policy';
import type { AppConfig } from '../config';
import type { Database } from '../db/database';
import { AppError } from '../http/app-error';
import { identityFromAssertion, recordSignOut, signIn } from './auth.service';
import { assertAddressedTo } from './response-destination';
import { safeReturnPath } from './return-path';
import { SAML_STRATEGY, type SamlAuthenticator } from './saml-strategy';
import { SESSION_COOKIE, endSession, startSignedInSession } from './sessions';
import { XSRF_COOKIE, setXsrfCookie } from './xsrf';

const signInFailed = (cause: unknown) => new AppError({ code: 'sign_in_failed', status: 401, message: 'The sign-in response was refused', cause });

/** Runs the SAML strategy on a POSTed response; any failure (bad signature, wrong audience, expired, replayed) is a 401. */
function validateSamlResponse(passport: SamlAuthenticator, req: Request, res: Response): Promise<Profile> {
  return new Promise((resolve, reject) => {
    const callback = (error: unknown, profile: Profile | false | undefined) => {
      if (error || !profile) reject(error instanceof AppError ? error : signInFailed(error));
      else resolve(profile);
    };
    passport.authenticate(SAML_STRATEGY, { session: false }, callback)(req, res, (error: unknown) => reject(signInFailed(error)));
  });
}

/** A browser arrives here by a form post, so a refusal is a page with a way back, still answered 401. */
function answerRefusedSignIn(error: unknown, req: Request, res: Response, next: NextFunction): void {
  if (!(error instanceof AppError) || error.code !== 'sign_in_failed') return next(error);
  req.log.info({ reason: error.cause instanceof Error ? error.cause.message : error.message }, 'sign-in refused');
  res
    .status(401)
    .type('html')
    .send(
      '<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Sign-in refused · Spanledger</title></head><body>' +
        `<h1>Sign-in refused</h1><p>${error.message}. Nothing was signed in.</p><p><a href="/auth/saml/login">Sign in again</a></p></body></html>`,
    );
}

/**
 * The assertion consumer (`POST /auth/saml/callback`). It sits before the XSRF check: the identity
 * provider's cross-site POST is protected by the response's signatures and its InResponseTo instead.
 */
export function samlCallbackRouter(config: AppConfig, db: Database, passport: SamlAuthenticator): Router {
  const consumeAssertion: RequestHandler = async (req, res) => {
    const body = (req.body ?? {}) as Record<string, unknown>;
    assertAddressedTo(body['SAMLResponse'], config.saml.callbackUrl);
    const profile = await validateSamlResponse(passport, req, res);
    const user = await signIn({ db }, identityFromAssertion(profile, config.saml.attributes));
    const xsrfToken = await startSignedInSession(req, user);
    setXsrfCookie(res, xsrfToken, config.session.secureCookies);
    res.redirect(303, safeReturnPath(body['RelayState']));
  };
  const router = Router();
  router.post('/auth/saml/callback', allow.public, express.urlencoded({ extended: false, limit: '512kb' }), consumeAssertion, answerRefusedSignIn);
  return router;
}

/** Sign-in, sign-out and the service provider's metadata. */
export function authRouter(config: AppConfig, db: Database, passport: SamlAuthenticator, strategy: Strategy): Router {
  const router = Router();
  router.get('/auth/saml/login', allow.public, (req, res, next) => {
    const returnTo = safeReturnPath(req.query['returnTo']);
    if (req.user) return res.redirect(returnTo);
    // RelayState carries the page to come back to through the identity provider (SAML 2.0 bindings §3.4.3).
    passport.authenticate(SAML_STRATEGY, { session: false, additionalParams: { RelayState: returnTo } } as AuthenticateOptions)(req, res, next);
  });

  router.get('/auth/saml/metadata', allow.public, (_req, res) => {
    res.type('application/samlmetadata+xml').send(strategy.generateServiceProviderMetadata(null));
  });

  router.post('/auth/logout', allow.public, async (req, res) => {
    if (req.user) await recordSignOut({ db, user: signedInUser(req) });
    await endSession(req);
    const cookieOptions = { path: '/', sameSite: 'lax' as const, secure: config.session.secureCookies };
    res.clearCookie(SESSION_COOKIE, { ...cookieOptions, httpOnly: true });
    res.clearCookie(XSRF_COOKIE, cookieOptions);
    res.sendStatus(204);
  });
  return router;
}

/**
 * `GET /api/me`: who is signed in, or 401. `GET /api/session` says the same to the browser app
 * without an error status, since a visitor who has not signed in yet is no failure.
 */
export function meRouter(): Router {
  const router = Router();
  router.get('/me', allow.signedIn, (req, res) => {
    res.json(signedInUser(req));
  });
  router.get('/session', allow.public, (req, res) => {
    res.json({ user: req.user ?? null });
  });
  return router;
}
