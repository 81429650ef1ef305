import { Router } from 'express';
import type { AppConfig } from '../config';

/** What the browser app needs to know of the deployment; nothing secret goes here. */
export interface ClientConfig {
  readonly basemapTileUrl: string | null;
  readonly basemapAttribution: string | null;
}

export function clientConfigRouter(config: AppConfig): Router {
  const body: ClientConfig = { basemapTileUrl: config.basemapTileUrl, basemapAttribution: config.basemapAttribution };
  const router = Router();
  router.get('/client-config', (_req, res) => {
    res.json(body);
  });
  return router;
}
