/** What the browser app learns of its deployment from `GET /api/client-config`; nothing secret goes here. */
export interface ClientConfig {
  /** An XYZ raster tile URL with {z}, {x} and {y}, or null for the vector basemap shipped with the app. */
  readonly basemapTileUrl: string | null;
  readonly basemapAttribution: string | null;
}
