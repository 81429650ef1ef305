import { Router } from 'express';
import { ratingRerun, ratingReturn, ratingRun, ratingStep } from '../../../shared/src';
import { allow, signedInUser } from '../access/access-policy';
import type { Database } from '../db/database';
import { idFrom, parseRequest } from '../http/validate';
import {
  approveRating,
  getRating,
  listRatingsOfStructure,
  listRatingsWaitingForReview,
  ratingSetup,
  rerunRating,
  returnRating,
  runRating,
  submitRating,
} from './ratings.service';

/** Rating records of spans: run, run again, submit, approve or return. */
export function ratingsRouter(db: Database): Router {
  const router = Router();
  const writer = (req: Parameters<typeof signedInUser>[0]) => ({ db, user: signedInUser(req) });

  router.get('/spans/:id/rating-setup', allow.to('view'), async (req, res) => {
    res.json(await ratingSetup({ db }, idFrom(req.params)));
  });
  router.post('/spans/:id/ratings', allow.to('runRatings'), async (req, res) => {
    const spanId = idFrom(req.params);
    res.status(201).json(await runRating(writer(req), spanId, parseRequest(ratingRun, req.body, 'body field')));
  });
  router.get('/structures/:id/ratings', allow.to('view'), async (req, res) => {
    res.json(await listRatingsOfStructure({ db }, idFrom(req.params)));
  });
  router.get('/ratings/waiting-for-review', allow.to('view'), async (_req, res) => {
    res.json(await listRatingsWaitingForReview({ db }));
  });
  router.get('/ratings/:id', allow.to('view'), async (req, res) => {
    res.json(await getRating(writer(req), idFrom(req.params)));
  });
  router.put('/ratings/:id', allow.to('runRatings'), async (req, res) => {
    const id = idFrom(req.params);
    res.json(await rerunRating(writer(req), id, parseRequest(ratingRerun, req.body, 'body field')));
  });
  router.post('/ratings/:id/submit', allow.to('runRatings'), async (req, res) => {
    const id = idFrom(req.params);
    const { version, comment } = parseRequest(ratingStep, req.body, 'body field');
    res.json(await submitRating(writer(req), id, version, comment));
  });
  router.post('/ratings/:id/approve', allow.to('approveRatings'), async (req, res) => {
    const id = idFrom(req.params);
    const { version, comment } = parseRequest(ratingStep, req.body, 'body field');
    res.json(await approveRating(writer(req), id, version, comment));
  });
  router.post('/ratings/:id/return', allow.to('approveRatings'), async (req, res) => {
    const id = idFrom(req.params);
    const { version, comment } = parseRequest(ratingReturn, req.body, 'body field');
    res.json(await returnRating(writer(req), id, version, comment));
  });
  return router;
}
