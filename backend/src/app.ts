import cookieParser from 'cookie-parser';
import express, { type Express } from 'express';
import './auth/express-augmentation';
import { assertEveryRouteDeclaresAPolicy } from './access/route-table';
import { authRouter, meRouter, samlCallbackRouter } from './auth/auth.router';
import { createSamlAuthenticator, createSamlStrategy } from './auth/saml-strategy';
import { currentUser, sessions } from './auth/sessions';
import { xsrfProtection } from './auth/xsrf';
import type { AppConfig } from './config';
import type { Database } from './db/database';
import type { Logger } from './logger';
import { calcRouter } from './calc/calc.router';
import { clientConfigRouter } from './client-config/client-config.router';
import { healthRouter } from './health/health.router';
import { apiNotFound, errorMiddleware } from './http/error-middleware';
import { frontendRouter } from './http/frontend';
import { requestLogging } from './http/request-logging';
import { securityHeaders } from './http/security-headers';
import { networkRegisterRouter } from './network-register/network-register.router';
import { structuresRouter } from './structures/structures.router';
import { spansRouter } from './spans/spans.router';
import { girdersRouter } from './girders/girders.router';
import { libraryRouter } from './library/library.router';
import { inspectionsRouter } from './inspections/inspections.router';
import { ratingsRouter } from './ratings/ratings.router';
import { priorRatingsRouter } from './prior-ratings/prior-ratings.router';
import { importsRouter } from './imports/imports.router';
import type { BackgroundJobs } from './jobs/background-jobs';
import { alertsRouter } from './alerts/alerts.router';
import { ObjectStorage } from './photos/object-storage';
import { photosRouter } from './photos/photos.router';

export interface AppDependencies {
  readonly config: AppConfig;
  readonly db: Database;
  readonly logger: Logger;
  /** The background job queue; without one (an app built alone in a test) every import is committed in its request. */
  readonly jobs?: BackgroundJobs;
}

/**
 * The whole HTTP application: sign-in under /auth, the API under /api, the built front end
 * everywhere else. Every route declares who may use it; the app refuses to build otherwise.
 */
export function createApp({ config, db, logger, jobs }: AppDependencies): Express {
  const app = express();
  app.disable('x-powered-by');
  app.set('query parser', 'simple');
  app.set('trust proxy', config.trustProxy);
  app.use(requestLogging(logger));
  app.use(securityHeaders(config));

  const strategy = createSamlStrategy(config.saml, db);
  const passport = createSamlAuthenticator(strategy);

  app.use(cookieParser());
  app.use(sessions(config.session, db, logger));
  app.use(currentUser(config.session));
  app.use(samlCallbackRouter(config, db, passport));
  app.use(xsrfProtection(config.session));
  app.use(authRouter(config, db, passport, strategy));

  const api = express.Router();
  api.use(express.json({ limit: '1mb' }));
  api.use(healthRouter(db));
  api.use(clientConfigRouter(config));
  api.use(meRouter());
  api.use(structuresRouter(db));
  api.use(spansRouter(db));
  api.use(girdersRouter(db));
  api.use(libraryRouter(db));
  const photoStorage = new ObjectStorage(config.objectStorage, logger);
  api.use(inspectionsRouter(db, photoStorage));
  api.use(ratingsRouter(db));
  api.use(priorRatingsRouter(db));
  api.use(importsRouter(db, { sizeLimitBytes: config.importSizeLimitBytes, queue: jobs ? { jobs, backgroundFromBytes: config.importBackgroundFromBytes } : undefined }));
  api.use(alertsRouter(db));
  api.use(photosRouter({ db, storage: photoStorage, sizeLimitBytes: config.photoSizeLimitBytes }));
  api.use(networkRegisterRouter(db));
  api.use(calcRouter());
  api.use(apiNotFound);
  app.use('/api', api);

  app.use(frontendRouter(config.frontendDist, logger));
  app.use(errorMiddleware);
  assertEveryRouteDeclaresAPolicy(app);
  return app;
}
