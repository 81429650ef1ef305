/** Live load on a simple span: the vehicle library, exact moving-load moment envelopes and the absolute maximum. */
export { absoluteMaximumMoment, type AbsoluteMaximumMoment, type AbsoluteMaximumMomentOptions } from './absolute-maximum';
export { liveLoadMomentEnvelope, type LiveLoadMomentEnvelopeOptions, type StationLiveLoadMoment } from './moment-envelope';
export {
  LIBRARY_VEHICLE_IDS,
  UnknownVehicleError,
  VEHICLE_FILES,
  VEHICLE_LIBRARY,
  inlineVehicleSchema,
  resolveVehicle,
  vehicleReferenceSchema,
  type VehicleReference,
} from './vehicle-library';
export {
  VEHICLE_CATEGORIES,
  loadCaseSchema,
  vehicleDefinitionSchema,
  type LoadCase,
  type VehicleCategory,
  type VehicleDefinition,
  type VehicleDefinitionInput,
} from './vehicle-schema';
