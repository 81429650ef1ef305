import { Router } from 'express';
import { allow } from '../access/access-policy';
import { structureMapQuery } from '../../../shared/src';
import type { Database } from '../db/database';
import { parseRequest } from '../http/validate';
import { listStructuresForMap } from './structures.service';

export function structuresRouter(db: Database): Router {
  const router = Router();
  router.get('/structures', allow.to('view'), async (req, res) => {
    const query = parseRequest(structureMapQuery, req.query, 'query parameter');
    res.type('application/geo+json').json(await listStructuresForMap({ db }, query));
  });
  return router;
}
