import { Router } from 'express';
import { allow } from '../access/access-policy';
import { calculateCapacity, calculateRating } from './calc.service';

/**
 * Stateless calculations over the calculation file (docs/calc-file.md): nothing is stored, so
 * any signed-in user may run them; storing a rating is a separate, permissioned action.
 */
export function calcRouter(): Router {
  const router = Router();
  router.post('/calc/capacity', allow.signedIn, (req, res) => {
    res.json(calculateCapacity(req.body));
  });
  router.post('/calc/rate', allow.signedIn, (req, res) => {
    res.json(calculateRating(req.body));
  });
  return router;
}
