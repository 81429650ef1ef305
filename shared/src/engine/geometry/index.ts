/** Plane geometry of sections: polygons, their properties, clipping and integration over bands. */
export { polygonMm, polygonYRangeMm, ringDoubleSignedAreaMm2, type PointMm, type PolygonMm, type RingMm } from './polygon';
export {
  areaIntegrals,
  centroidalProperties,
  polygonProperties,
  sumAreaIntegrals,
  type AreaIntegrals,
  type PolygonProperties,
} from './properties';
export { clipPolygonToBand } from './clip';
export { integrateOverBand, widthAtMm, type BandIntegral } from './band-integration';
export { polygonContainsPointMm, ringContainsPointMm } from './contains';
