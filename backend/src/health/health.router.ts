import { Router } from 'express';
import { allow } from '../access/access-policy';
import type { Database } from '../db/database';
import { checkHealth } from './health.service';

export function healthRouter(db: Database): Router {
  const router = Router();
  router.get('/health', allow.public, async (_req, res) => {
    res.json(await checkHealth({ db }));
  });
  return router;
}
