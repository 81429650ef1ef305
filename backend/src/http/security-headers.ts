import helmet from 'helmet';
import type { AppConfig } from '../config';

/**
 * helmet's headers with a content security policy that lets the page reach only its own origin,
 * plus the tile server when one is configured: fonts, icons and basemap ship with the app.
 */
export function securityHeaders(config: AppConfig) {
  const tileOrigin = config.basemapTileUrl ? new URL(config.basemapTileUrl.replace(/\{[a-z]\}/g, '0')).origin : null;
  return helmet({
    contentSecurityPolicy: {
      useDefaults: true,
      directives: {
        'default-src': ["'self'"],
        'script-src': ["'self'"],
        // Angular Material and Leaflet set element styles at run time.
        'style-src': ["'self'", "'unsafe-inline'"],
        'font-src': ["'self'", 'data:'],
        'img-src': ["'self'", 'data:', 'blob:', ...(tileOrigin ? [tileOrigin] : [])],
        'connect-src': ["'self'"],
        'object-src': ["'none'"],
        'frame-ancestors': ["'none'"],
        'upgrade-insecure-requests': null,
      },
    },
  });
}
