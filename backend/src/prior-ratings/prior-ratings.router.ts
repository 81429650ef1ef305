import { Router } from 'express';
import { allow } from '../access/access-policy';
import type { Database } from '../db/database';
import { idFrom } from '../http/validate';
import { listPriorRatingsOfStructure } from './prior-ratings.service';

/** Ratings on file from before Spanledger; they arrive by import (docs/api.md, Imports). */
export function priorRatingsRouter(db: Database): Router {
  const router = Router();
  router.get('/structures/:id/prior-ratings', allow.to('view'), async (req, res) => {
    res.json(await listPriorRatingsOfStructure({ db }, idFrom(req.params)));
  });
  return router;
}
