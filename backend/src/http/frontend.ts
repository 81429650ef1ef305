import fs from 'node:fs';
import path from 'node:path';
import express, { Router } from 'express';
import { allow } from '../access/access-policy';
import type { Logger } from '../logger';

/**
 * Serves the built Angular app and sends every other non-API GET to its index.html, so deep
 * links work. When the build is missing the API still runs and the page says how to build.
 */
export function frontendRouter(distFolder: string, logger: Logger): Router {
  const router = Router();
  const root = path.resolve(distFolder);
  const indexFile = path.join(root, 'index.html');
  if (!fs.existsSync(indexFile)) {
    logger.warn({ distFolder: root }, 'front end not built; run `npm run build:frontend`');
  }
  // Hashed bundles may be cached for a long time; index.html must always be fresh.
  router.use(express.static(root, { index: false, maxAge: '1y', immutable: true }));
  // The page shell holds no data: what it shows comes from the API, which checks who asks.
  router.get('/{*splat}', allow.public, (_req, res) => {
    if (!fs.existsSync(indexFile)) {
      res.status(503).type('text/plain').send('The front end is not built yet: run `npm run build:frontend`.');
      return;
    }
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(indexFile);
  });
  return router;
}
