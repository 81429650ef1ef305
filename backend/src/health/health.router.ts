import { Router } from 'express';
import type { Database } from '../db/database';
import { checkHealth } from './health.service';

export function healthRouter(db: Database): Router {
  const router = Router();
  router.get('/health', async (_req, res) => {
    res.json(await checkHealth({ db }));
  });
  return router;
}
