import { Router } from 'express';
import { allow } from '../access/access-policy';
import type { ClientConfig } from '../../../shared/src';
import type { AppConfig } from '../config';

export function clientConfigRouter(config: AppConfig): Router {
  const body: ClientConfig = { basemapTileUrl: config.basemapTileUrl, basemapAttribution: config.basemapAttribution };
  const router = Router();
  router.get('/client-config', allow.public, (_req, res) => {
    res.json(body);
  });
  return router;
}
