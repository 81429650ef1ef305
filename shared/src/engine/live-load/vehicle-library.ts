import { z } from 'zod';
import aashtoLegal from '../data/vehicles/aashto-legal.json';
import emergency from '../data/vehicles/emergency.json';
import hl93 from '../data/vehicles/hl93.json';
import notional from '../data/vehicles/notional.json';
import specializedHauling from '../data/vehicles/specialized-hauling.json';
import { EngineInputError } from '../materials/errors';
import { vehicleDefinitionSchema, type VehicleDefinition } from './vehicle-schema';

/** The library's data files, one per family of vehicles; each entry names its own source. */
export const VEHICLE_FILES = [hl93, aashtoLegal, specializedHauling, notional, emergency] as const;

/** Freezes a parsed entry all the way down: every rating in the process shares it. */
function deepFreeze<T>(value: T): T {
  if (typeof value === 'object' && value !== null) {
    for (const child of Object.values(value)) deepFreeze(child);
    Object.freeze(value);
  }
  return value;
}

/**
 * The vehicle library by id: HL-93 (AASHTO LRFD 3.6.1.2 [R]), the AASHTO legal loads and
 * specialized hauling vehicles, the notional rating load (AASHTO MBE 6A.4.4.2.1 [R]) and the
 * FAST Act emergency vehicles (FHWA 2016 [R]). Every entry's `source` says which values are
 * recalled and need checking against the edition an owner adopts.
 */
export const VEHICLE_LIBRARY: ReadonlyMap<string, VehicleDefinition> = new Map(
  VEHICLE_FILES.flatMap((file) => file.vehicles).map((entry) => {
    const vehicle = deepFreeze(vehicleDefinitionSchema.parse(entry));
    return [vehicle.id, vehicle] as const;
  }),
);

export const LIBRARY_VEHICLE_IDS: readonly string[] = [...VEHICLE_LIBRARY.keys()];

function unknownVehicleProblem(vehicleId: string): string {
  return `unknown vehicle "${vehicleId}"; the library has ${LIBRARY_VEHICLE_IDS.join(', ')}`;
}

/**
 * A vehicle id that is not in the library, at the calculation file's path, e.g. `vehicles[3]`. It
 * is an EngineInputError, so the command line reports it as bad input like any other.
 */
export class UnknownVehicleError extends EngineInputError {
  constructor(
    path: string,
    readonly vehicleId: string,
  ) {
    super(path, unknownVehicleProblem(vehicleId));
  }
}

/** An inline vehicle of a calculation file: a library entry's shape, with an id of its own so result keys stay unambiguous. */
export const inlineVehicleSchema = vehicleDefinitionSchema.refine((vehicle) => !VEHICLE_LIBRARY.has(vehicle.id), {
  path: ['id'],
  message: 'is a library vehicle\'s id; give the inline vehicle another',
});

/**
 * One entry of the calculation file's `vehicles`: a library id or an inline vehicle (calc-file.md).
 * Text is read as an id and anything else as an inline vehicle, so each problem is reported at its
 * own path rather than as one "no alternative matched".
 */
export const vehicleReferenceSchema = z.unknown().transform((input, ctx): VehicleReference => {
  if (typeof input !== 'string' && (typeof input !== 'object' || input === null || Array.isArray(input))) {
    ctx.addIssue({ code: 'custom', message: 'must be a library vehicle id or an inline vehicle' });
    return z.NEVER;
  }
  if (typeof input === 'string') {
    if (VEHICLE_LIBRARY.has(input)) return input;
    ctx.addIssue({ code: 'custom', message: unknownVehicleProblem(input) });
    return z.NEVER;
  }
  const result = inlineVehicleSchema.safeParse(input);
  if (result.success) return result.data;
  for (const issue of result.error.issues) ctx.addIssue({ ...issue });
  return z.NEVER;
});
export type VehicleReference = string | VehicleDefinition;

/**
 * The definition of a library id (AASHTO LRFD 3.6.1.2, AASHTO MBE 6A.4.4.2.1, FHWA 2016 [R]), or
 * an inline vehicle already parsed with `inlineVehicleSchema`, returned as it is.
 * @param path the calculation file's path of the reference, for the error: `vehicles[3]`.
 * @throws UnknownVehicleError when the id is not in the library.
 */
export function resolveVehicle(idOrInline: VehicleReference, path = 'vehicles'): VehicleDefinition {
  if (typeof idOrInline !== 'string') return idOrInline;
  const vehicle = VEHICLE_LIBRARY.get(idOrInline);
  if (vehicle === undefined) throw new UnknownVehicleError(path, idOrInline);
  return vehicle;
}
