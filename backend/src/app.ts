import express, { type Express } from 'express';
import type { AppConfig } from './config';
import type { Database } from './db/database';
import type { Logger } from './logger';
import { clientConfigRouter } from './client-config/client-config.router';
import { healthRouter } from './health/health.router';
import { apiNotFound, errorMiddleware } from './http/error-middleware';
import { frontendRouter } from './http/frontend';
import { requestLogging } from './http/request-logging';
import { securityHeaders } from './http/security-headers';
import { structuresRouter } from './structures/structures.router';

export interface AppDependencies {
  readonly config: AppConfig;
  readonly db: Database;
  readonly logger: Logger;
}

/** The whole HTTP application: API under /api, the built front end everywhere else. */
export function createApp({ config, db, logger }: AppDependencies): Express {
  const app = express();
  app.disable('x-powered-by');
  app.set('query parser', 'simple');
  app.use(requestLogging(logger));
  app.use(securityHeaders(config));

  const api = express.Router();
  api.use(express.json({ limit: '1mb' }));
  api.use(healthRouter(db));
  api.use(clientConfigRouter(config));
  api.use(structuresRouter(db));
  api.use(apiNotFound);
  app.use('/api', api);

  app.use(frontendRouter(config.frontendDist, logger));
  app.use(errorMiddleware);
  return app;
}
