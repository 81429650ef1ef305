import { Router } from 'express';
import { allow } from '../access/access-policy';
import type { Database } from '../db/database';
import { idFrom } from '../http/validate';
import { listGirderTypes, listGirdersOfSpan } from './girders.service';

export function girdersRouter(db: Database): Router {
  const router = Router();
  router.get('/spans/:id/girders', allow.to('view'), async (req, res) => {
    res.json(await listGirdersOfSpan({ db }, idFrom(req.params)));
  });
  router.get('/girder-types', allow.to('view'), async (_req, res) => {
    res.json(await listGirderTypes({ db }));
  });
  return router;
}
