import { Router } from 'express';
import { allow, signedInUser } from '../access/access-policy';
import type { Database } from '../db/database';
import { idFrom } from '../http/validate';
import { listAlerts, readAlert } from './alerts.service';

/** A person's own alerts in the app (critical findings for raters of the district). */
export function alertsRouter(db: Database): Router {
  const router = Router();
  router.get('/alerts', allow.signedIn, async (req, res) => {
    res.json(await listAlerts({ db, user: signedInUser(req) }));
  });
  router.post('/alerts/:id/read', allow.signedIn, async (req, res) => {
    await readAlert({ db, user: signedInUser(req) }, idFrom(req.params));
    res.sendStatus(204);
  });
  return router;
}
