import { Router } from 'express';
import { newStructure, pageQuery, structureChange, structureListQuery } from '../../../shared/src';
import { allow, signedInUser } from '../access/access-policy';
import { structureHistory } from '../audit/history.service';
import type { Database } from '../db/database';
import { idFrom, parseRequest } from '../http/validate';
import { listSpansOfStructure } from '../spans/spans.service';
import { changeStructure, createStructure, getStructure, listDistricts, listStructures } from './structures.service';

export function structuresRouter(db: Database): Router {
  const router = Router();
  router.get('/structures', allow.to('view'), async (req, res) => {
    const query = parseRequest(structureListQuery, req.query, 'query parameter');
    res.type('application/geo+json').json(await listStructures({ db }, query));
  });
  router.post('/structures', allow.to('editInventory'), async (req, res) => {
    const structure = parseRequest(newStructure, req.body, 'body field');
    res.status(201).json(await createStructure({ db, user: signedInUser(req) }, structure));
  });
  router.get('/districts', allow.to('view'), async (_req, res) => {
    res.json(await listDistricts({ db }));
  });
  router.get('/structures/:id', allow.to('view'), async (req, res) => {
    res.json(await getStructure({ db }, idFrom(req.params)));
  });
  router.patch('/structures/:id', allow.to('editInventory'), async (req, res) => {
    const id = idFrom(req.params);
    const change = parseRequest(structureChange, req.body, 'body field');
    res.json(await changeStructure({ db, user: signedInUser(req) }, id, change));
  });
  router.get('/structures/:id/spans', allow.to('view'), async (req, res) => {
    res.json(await listSpansOfStructure({ db }, idFrom(req.params)));
  });
  router.get('/structures/:id/history', allow.to('view'), async (req, res) => {
    const id = idFrom(req.params);
    res.json(await structureHistory({ db }, id, parseRequest(pageQuery, req.query, 'query parameter')));
  });
  return router;
}
