import { z } from 'zod';
import { ftToM, kipToKn } from '../../units';
import { describeIssues } from '../calc-file/json-path';
import { EngineInputError } from '../materials/errors';
import { usEditionCase } from './test-vehicles';
import {
  LIBRARY_VEHICLE_IDS,
  UnknownVehicleError,
  VEHICLE_FILES,
  VEHICLE_LIBRARY,
  inlineVehicleSchema,
  resolveVehicle,
  vehicleReferenceSchema,
} from './vehicle-library';
import { vehicleDefinitionSchema, type VehicleDefinitionInput } from './vehicle-schema';

const entries = VEHICLE_FILES.flatMap((file) => file.vehicles.map((entry) => [entry.id, entry] as const));
const library = [...VEHICLE_LIBRARY.values()];
const sumOf = (values: readonly number[]) => values.reduce((sum, value) => sum + value, 0);

/** Relative agreement, for values converted with one multiply and one divide. */
function expectRelativelyClose(actual: number, expected: number, relativeTolerance: number): void {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(relativeTolerance * Math.abs(expected));
}

describe('the vehicle library data', () => {
  it('holds the twelve vehicles engineering.md §6 lists, each id once', () => {
    expect(LIBRARY_VEHICLE_IDS).toEqual(['hl93', 'type-3', 'type-3s2', 'type-3-3', 'lane-legal', 'su4', 'su5', 'su6', 'su7', 'nrl', 'ev2', 'ev3']);
    expect(entries).toHaveLength(LIBRARY_VEHICLE_IDS.length);
  });

  it.each(entries)('%s parses with the vehicle schema', (_id, entry) => {
    const result = vehicleDefinitionSchema.safeParse(entry);
    expect(result.success ? [] : describeIssues(result.error)).toEqual([]);
  });

  it.each(library.map((vehicle) => [vehicle.id, vehicle] as const))('%s names its source with a confidence tag, and says to verify what is recalled', (_id, vehicle) => {
    expect(vehicle.source).toMatch(/(AASHTO|FHWA)/);
    expect(vehicle.source).toMatch(/\[R\]/);
    expect(vehicle.source).toMatch(/from memory — verify|recalled, verify/);
  });

  it.each(library.map((vehicle) => [vehicle.id, vehicle] as const))('%s weighs the sum of its weight case\'s axles, in kN and in kip', (_id, vehicle) => {
    const weightCase = vehicle.cases.find((loadCase) => loadCase.id === vehicle.weightCaseId)!;
    expectRelativelyClose(sumOf(weightCase.axleLoadsKn), vehicle.weightKn, 1e-12);
    expect(sumOf(weightCase.us!.axleLoadsKip)).toBe(vehicle.us!.weightKip);
  });

  describe.each(library.filter((vehicle) => vehicle.us?.siValues === 'converted').map((vehicle) => [vehicle.id, vehicle] as const))(
    '%s, converted from US customary values',
    (_id, vehicle) => {
      it('has SI values equal to the exact conversion (1 kip = 4.448222 kN, 1 ft = 304.8 mm, engineering.md §1)', () => {
        expectRelativelyClose(vehicle.weightKn, kipToKn(vehicle.us!.weightKip), 1e-12);
        for (const loadCase of vehicle.cases) {
          const converted = usEditionCase(loadCase);
          loadCase.axleLoadsKn.forEach((loadKn, axle) => expectRelativelyClose(loadKn, converted.axleLoadsKn[axle]!, 1e-12));
          loadCase.axleSpacingsMm.forEach((spacingMm, gap) => expectRelativelyClose(spacingMm, converted.axleSpacingsMm[gap]!, 1e-12));
          if (loadCase.laneLoadKnPerM !== undefined) expectRelativelyClose(loadCase.laneLoadKnPerM, converted.laneLoadKnPerM!, 1e-12);
          if (loadCase.variableSpacing !== undefined) {
            expectRelativelyClose(loadCase.variableSpacing.minMm, converted.variableSpacing!.minMm, 1e-12);
            expectRelativelyClose(loadCase.variableSpacing.maxMm, converted.variableSpacing!.maxMm, 1e-12);
          }
        }
      });
    },
  );

  describe('hl93 (AASHTO LRFD 3.6.1.2 [R], as engineering.md §6 states it)', () => {
    const hl93 = resolveVehicle('hl93');
    const [truck, tandem] = hl93.cases;

    it('has the SI design truck 35/145/145 kN at 4.3 m and 4.3–9.0 m with 9.3 kN/m lane', () => {
      expect(truck).toMatchObject({ axleLoadsKn: [35, 145, 145], axleSpacingsMm: [4300, 4300], laneLoadKnPerM: 9.3 });
      expect(truck!.variableSpacing).toEqual({ gapIndex: 1, minMm: 4300, maxMm: 9000 });
    });

    it('has the design tandem 2 × 110 kN at 1.2 m with the same lane', () => {
      expect(tandem).toMatchObject({ axleLoadsKn: [110, 110], axleSpacingsMm: [1200], laneLoadKnPerM: 9.3 });
    });

    it('applies the dynamic load allowance to the truck and tandem, not the lane (3.6.2.1 [R])', () => {
      for (const loadCase of hl93.cases) expect(loadCase.dynamicLoadAllowance).toEqual({ axles: true, lane: false });
    });

    it('publishes SI values within 2 % of its US values (the SI edition rounds; common practice, no source)', () => {
      for (const loadCase of hl93.cases) {
        const converted = usEditionCase(loadCase);
        loadCase.axleLoadsKn.forEach((loadKn, axle) => expectRelativelyClose(loadKn, converted.axleLoadsKn[axle]!, 0.02));
        loadCase.axleSpacingsMm.forEach((spacingMm, gap) => expectRelativelyClose(spacingMm, converted.axleSpacingsMm[gap]!, 0.02));
        expectRelativelyClose(loadCase.laneLoadKnPerM!, kipToKn(loadCase.us!.laneLoadKipPerFt!) / ftToM(1), 0.02);
      }
    });
  });

  it('scales the lane-type legal load\'s trucks by 0.75 (AASHTO MBE 6A.4.4.2.1a [R], from memory — verify)', () => {
    expect(resolveVehicle('lane-legal').cases.map((loadCase) => loadCase.axleScale)).toEqual([0.75]);
  });

  it('is frozen, so one rating cannot change a vehicle for the next', () => {
    const truck = resolveVehicle('type-3').cases[0]!;
    expect(() => {
      (truck.axleLoadsKn as number[])[0] = 1;
    }).toThrow(TypeError);
  });
});

describe('resolveVehicle', () => {
  const inline: VehicleDefinitionInput = {
    id: 'county-permit-7',
    name: 'County permit crane',
    category: 'permit',
    source: 'owner permit record (inline)',
    weightKn: 600,
    weightCaseId: 'axles',
    cases: [{ id: 'axles', axleLoadsKn: [200, 200, 200], axleSpacingsMm: [1500, 1500] }],
  };

  it('returns the library definition of an id', () => {
    expect(resolveVehicle('type-3s2')).toBe(VEHICLE_LIBRARY.get('type-3s2'));
  });

  it('returns a parsed inline vehicle as it is, with defaults filled in', () => {
    const parsed = inlineVehicleSchema.parse(inline);
    expect(resolveVehicle(parsed)).toBe(parsed);
    expect(parsed.cases[0]).toMatchObject({ axleScale: 1, dynamicLoadAllowance: { axles: true, lane: false } });
  });

  it('throws an UnknownVehicleError at the path the caller names', () => {
    let thrown: unknown;
    try {
      resolveVehicle('hs25', 'vehicles[3]');
    } catch (error) {
      thrown = error;
    }
    expect(thrown).toBeInstanceOf(UnknownVehicleError);
    expect(thrown).toBeInstanceOf(EngineInputError);
    expect(thrown).toMatchObject({ path: 'vehicles[3]', vehicleId: 'hs25' });
    expect((thrown as Error).message).toMatch(/^vehicles\[3\]: unknown vehicle "hs25"; the library has hl93, /);
  });
});

describe('vehicleReferenceSchema: the `vehicles` key of a calculation file', () => {
  const vehicles = z.array(vehicleReferenceSchema);
  const issuesOf = (input: unknown) => {
    const result = vehicles.safeParse(input);
    return result.success ? [] : describeIssues(result.error);
  };
  const inline = (overrides: Record<string, unknown>, caseOverrides: Record<string, unknown> = {}) => ({
    id: 'crane',
    name: 'Crane',
    category: 'permit',
    source: 'owner permit record',
    weightKn: 400,
    cases: [{ id: 'axles', axleLoadsKn: [200, 200], axleSpacingsMm: [1500], ...caseOverrides }],
    ...overrides,
  });

  it('accepts library ids and inline vehicles together', () => {
    expect(issuesOf(['hl93', inline({}), 'ev3'])).toEqual([]);
  });

  it.each([
    [['hl93', 'hs20'], '[1]', /unknown vehicle "hs20"/],
    [[42], '[0]', /must be a library vehicle id or an inline vehicle/],
    [[inline({ id: 'hl93' })], '[0].id', /library vehicle's id/],
    [[inline({ category: 'military' })], '[0].category', /must be one of design, legal, permit, notional, emergency/],
    [[inline({ source: '' })], '[0].source', /must not be empty/],
    [[inline({ weightCaseId: 'axles', weightKn: 500 })], '[0].weightKn', /sum of case "axles"'s axle loads \(400 kN\)/],
    [[inline({ weightCaseId: 'tandem' })], '[0].weightCaseId', /names no load case/],
    [[inline({}, { axleSpacingsMm: [] })], '[0].cases[0].axleSpacingsMm', /has 0 spacings for 2 axles \(needs 1\)/],
    [[inline({}, { axleLoadsKn: [200, -5] })], '[0].cases[0].axleLoadsKn[1]', /must be > 0 kN/],
    [[inline({}, { variableSpacing: { gapIndex: 1, minMm: 1000, maxMm: 2000 } })], '[0].cases[0].variableSpacing.gapIndex', /one of the 1 gaps/],
    [[inline({}, { variableSpacing: { gapIndex: 0, minMm: 2000, maxMm: 3000 } })], '[0].cases[0].axleSpacingsMm[0]', /within the variable spacing/],
    [[inline({}, { laneLoadKnPerM: 0 })], '[0].cases[0].laneLoadKnPerM', /must be > 0 kN\/m/],
    [[inline({}, { impact: true })], '[0].cases[0].impact', /unknown key/],
  ])('reports %j at %s', (input, path, message) => {
    const issues = issuesOf(input);
    expect(issues).toContainEqual({ path, message: expect.stringMatching(message) });
  });
});
