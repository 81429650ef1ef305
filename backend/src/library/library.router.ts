import { Router } from 'express';
import { ratingPolicySchema, vehicleDefinitionSchema } from '../../../shared/src';
import { allow, signedInUser } from '../access/access-policy';
import type { Database } from '../db/database';
import { parseRequest } from '../http/validate';
import { addPolicyVersion, addVehicleVersion, listLibrary } from './library.service';

/** The vehicle library and rating policies: everyone reads them; administrators add versions. */
export function libraryRouter(db: Database): Router {
  const router = Router();
  router.get('/vehicles', allow.to('view'), async (_req, res) => {
    res.json(await listLibrary({ db }, 'vehicles'));
  });
  router.post('/vehicles', allow.to('manageSettings'), async (req, res) => {
    const vehicle = parseRequest(vehicleDefinitionSchema, req.body, 'body field');
    res.status(201).json(await addVehicleVersion({ db, user: signedInUser(req) }, vehicle));
  });
  router.get('/rating-policies', allow.to('view'), async (_req, res) => {
    res.json(await listLibrary({ db }, 'rating_policies'));
  });
  router.post('/rating-policies', allow.to('manageSettings'), async (req, res) => {
    const policy = parseRequest(ratingPolicySchema, req.body, 'body field');
    res.status(201).json(await addPolicyVersion({ db, user: signedInUser(req) }, policy));
  });
  return router;
}
