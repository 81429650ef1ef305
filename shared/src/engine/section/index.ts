/** Girder cross-sections: the calculation file's shapes, their polygons, and elastic section properties. */
export {
  boxSectionSchema,
  doubleTeeSectionSchema,
  iGirderSectionSchema,
  polygonSectionSchema,
  profileSectionSchema,
  rectangleSectionSchema,
  sectionShapeSchema,
  teeSectionSchema,
  voidedSlabSectionSchema,
  type BoxSection,
  type DoubleTeeSection,
  type IGirderSection,
  type PolygonSection,
  type ProfileSection,
  type RectangleSection,
  type SectionShape,
  type TeeSection,
  type VoidedSlabSection,
} from './shapes';
export { CIRCLE_POLYGON_SIDES, flatTopWidthMm, sectionDepthMm, shapeToPolygons } from './polygons';
export { sectionProperties, transformedSectionProperties, type SectionProperties, type WeightedPolygons } from './properties';
export { buildCompositeSection, type CompositeRegion, type CompositeSection, type CompositeSectionOptions } from './composite';
