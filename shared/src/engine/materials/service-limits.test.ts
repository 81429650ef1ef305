import c12 from '../fixtures/materials/c12-service-tension.json';
import { SERVICE_TENSION_CAP_MPA, SERVICE_TENSION_COEFFICIENTS, serviceTensionLimitMpa } from './service-limits';

describe(`${c12.id} ${c12.title} (${c12.source})`, () => {
  it.each(c12.cases)('gives $expectedLimitMpa MPa at f′c = $fcMpa MPa', ({ fcMpa, expectedLimitMpa }) => {
    expect(serviceTensionLimitMpa(fcMpa, c12.inputs.coefficient)).toBeCloseTo(expectedLimitMpa, c12.precision.decimals);
    expect(serviceTensionLimitMpa(fcMpa)).toBeCloseTo(expectedLimitMpa, c12.precision.decimals);
  });
});

describe('serviceTensionLimitMpa (engineering.md §7 [R])', () => {
  it('gives 1.46 MPa at f′c = 34.5 MPa for severe corrosive conditions (hand check: 0.249 × √34.5)', () => {
    expect(serviceTensionLimitMpa(34.5, SERVICE_TENSION_COEFFICIENTS.severeCorrosion)).toBeCloseTo(1.46, 2);
  });

  it('applies the 4.14 MPa cap only when asked (hand check: 0.4989 × √80 = 4.46 MPa)', () => {
    expect(serviceTensionLimitMpa(80)).toBeCloseTo(4.46, 2);
    expect(serviceTensionLimitMpa(80, SERVICE_TENSION_COEFFICIENTS.normal, SERVICE_TENSION_CAP_MPA)).toBe(4.14);
    expect(serviceTensionLimitMpa(34.5, SERVICE_TENSION_COEFFICIENTS.normal, SERVICE_TENSION_CAP_MPA)).toBeCloseTo(2.93, 2);
  });
});
