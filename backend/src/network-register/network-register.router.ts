import { Router } from 'express';
import { allow } from '../access/access-policy';
import type { Database } from '../db/database';
import { networkRegisterCsv } from './network-register.service';

export function networkRegisterRouter(db: Database): Router {
  const router = Router();
  router.get('/network-register.csv', allow.to('exportRegister'), async (_req, res) => {
    const day = new Date().toISOString().slice(0, 10);
    res
      .type('text/csv; charset=utf-8')
      .attachment(`network-register-${day}.csv`)
      .send(await networkRegisterCsv({ db }));
  });
  return router;
}
