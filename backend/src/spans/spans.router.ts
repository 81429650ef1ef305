import { Router } from 'express';
import { spanChange } from '../../../shared/src';
import { allow, signedInUser } from '../access/access-policy';
import type { Database } from '../db/database';
import { idFrom, parseRequest } from '../http/validate';
import { changeSpan, getSpan } from './spans.service';

export function spansRouter(db: Database): Router {
  const router = Router();
  router.get('/spans/:id', allow.to('view'), async (req, res) => {
    res.json(await getSpan({ db }, idFrom(req.params)));
  });
  router.patch('/spans/:id', allow.to('editInventory'), async (req, res) => {
    const id = idFrom(req.params);
    const change = parseRequest(spanChange, req.body, 'body field');
    res.json(await changeSpan({ db, user: signedInUser(req) }, id, change));
  });
  return router;
}
