import { Router } from 'express';
import { girderChange, girderTypeChange, newGirderType } from '../../../shared/src';
import { allow, signedInUser } from '../access/access-policy';
import type { Database } from '../db/database';
import { idFrom, parseRequest } from '../http/validate';
import { changeGirder, changeGirderType, createGirderType, getGirder, listGirderTypes, listGirdersOfSpan } from './girders.service';

export function girdersRouter(db: Database): Router {
  const router = Router();
  router.get('/spans/:id/girders', allow.to('view'), async (req, res) => {
    res.json(await listGirdersOfSpan({ db }, idFrom(req.params)));
  });
  router.get('/girders/:id', allow.to('view'), async (req, res) => {
    res.json(await getGirder({ db }, idFrom(req.params)));
  });
  router.put('/girders/:id', allow.to('editInventory'), async (req, res) => {
    const id = idFrom(req.params);
    const change = parseRequest(girderChange, req.body, 'body field');
    res.json(await changeGirder({ db, user: signedInUser(req) }, id, change));
  });
  router.get('/girder-types', allow.to('view'), async (_req, res) => {
    res.json(await listGirderTypes({ db }));
  });
  router.post('/girder-types', allow.to('editInventory'), async (req, res) => {
    const type = parseRequest(newGirderType, req.body, 'body field');
    res.status(201).json(await createGirderType({ db, user: signedInUser(req) }, type));
  });
  router.patch('/girder-types/:id', allow.to('editInventory'), async (req, res) => {
    const id = idFrom(req.params);
    const change = parseRequest(girderTypeChange, req.body, 'body field');
    res.json(await changeGirderType({ db, user: signedInUser(req) }, id, change));
  });
  return router;
}
