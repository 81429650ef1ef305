/**
 * US customary ↔ SI conversions, used only at the edges: the engine works in N, mm and MPa
 * (engineering.md §1). The defining constants are the ones §1 fixes — 1 in = 25.4 mm,
 * 1 ft = 0.3048 m, 1 kip = 4.448222 kN, 1 ksi = 6.894757 MPa — and everything else is derived
 * from them. Stresses derive from the ksi constant and forces from the kip constant; the two
 * agree with each other (kip/in² against ksi) to about 1 part in 10⁷.
 */

const MM_PER_IN = 25.4;
const MM_PER_FT = 304.8;
const N_PER_KIP = 4448.222;
const MPA_PER_KSI = 6.894757;
/** Standard gravity (CGPM 1901), the weight of one kilogram or one metric tonne. */
export const STANDARD_GRAVITY_M_PER_S2 = 9.80665;
const N_PER_LBF = N_PER_KIP / 1000;
const M3_PER_FT3 = (MM_PER_FT / 1000) ** 3;

/**
 * How many of each quantity's SI reference unit one named unit holds. The reference units are
 * mm, mm², mm⁴, N, MPa, N·mm, N/mm (= kN/m) and kN/m³.
 */
const UNIT_FACTORS = {
  length: { mm: 1, m: 1000, in: MM_PER_IN, ft: MM_PER_FT },
  area: { mm2: 1, m2: 1e6, in2: MM_PER_IN ** 2, ft2: MM_PER_FT ** 2 },
  secondMomentOfArea: { mm4: 1, m4: 1e12, in4: MM_PER_IN ** 4, ft4: MM_PER_FT ** 4 },
  force: {
    N: 1,
    kN: 1000,
    lbf: N_PER_LBF,
    kip: N_PER_KIP,
    /** US (short) ton-force, 2000 lbf: posting weights in the United States. */
    ton: 2 * N_PER_KIP,
    /** Metric tonne-force, 1000 kg under standard gravity: posting weights elsewhere. */
    tonne: 1000 * STANDARD_GRAVITY_M_PER_S2,
  },
  stress: { MPa: 1, kPa: 1e-3, Pa: 1e-6, psi: MPA_PER_KSI / 1000, ksi: MPA_PER_KSI, ksf: MPA_PER_KSI / 144 },
  moment: { Nmm: 1, kNm: 1e6, kipIn: N_PER_KIP * MM_PER_IN, kipFt: N_PER_KIP * MM_PER_FT },
  lineLoad: { 'N/mm': 1, 'kN/m': 1, 'kip/ft': N_PER_KIP / MM_PER_FT, 'lbf/ft': N_PER_LBF / MM_PER_FT },
  unitWeight: {
    'kN/m3': 1,
    pcf: N_PER_LBF / 1000 / M3_PER_FT3,
    kcf: N_PER_KIP / 1000 / M3_PER_FT3,
  },
} as const;

type UnitTable = typeof UNIT_FACTORS;
/** A physical quantity the conversion table knows. */
export type Quantity = keyof UnitTable;
/** The unit names of one quantity, e.g. `UnitOf<'stress'>` is 'MPa' | 'kPa' | 'Pa' | 'psi' | 'ksi' | 'ksf'. */
export type UnitOf<Q extends Quantity> = keyof UnitTable[Q] & string;
/** Every unit name the table knows; names are unique across quantities. */
export type Unit = { [Q in Quantity]: UnitOf<Q> }[Quantity];
/** The quantity a unit measures, so `convert` only accepts a target unit of the same kind. */
export type QuantityOf<U extends Unit> = { [Q in Quantity]: U extends UnitOf<Q> ? Q : never }[Quantity];

interface UnitEntry {
  readonly quantity: Quantity;
  readonly factor: number;
}

const UNIT_ENTRIES: ReadonlyMap<string, UnitEntry> = new Map(
  Object.entries(UNIT_FACTORS).flatMap(([quantity, units]) =>
    Object.entries(units).map(([unit, factor]): [string, UnitEntry] => [unit, { quantity: quantity as Quantity, factor }]),
  ),
);

/** The unit names of one quantity, in table order (for pickers and tests). */
export function unitsOf<Q extends Quantity>(quantity: Q): UnitOf<Q>[] {
  return Object.keys(UNIT_FACTORS[quantity]) as UnitOf<Q>[];
}

function entryFor(unit: string): UnitEntry {
  const entry = UNIT_ENTRIES.get(unit);
  if (entry === undefined) throw new RangeError(`unknown unit "${unit}"`);
  return entry;
}

/**
 * Converts a value between two units of the same quantity, e.g. `convert(1, 'ksi', 'MPa')`.
 * The types refuse a pair of different quantities; a name the table lacks (from untyped input)
 * throws a RangeError, as does a pair of different quantities that bypassed the types.
 */
export function convert<U extends Unit>(value: number, fromUnit: U, toUnit: UnitOf<QuantityOf<U>>): number {
  const from = entryFor(fromUnit);
  const to = entryFor(toUnit);
  if (from.quantity !== to.quantity) {
    throw new RangeError(`cannot convert ${from.quantity} (${fromUnit}) to ${to.quantity} (${toUnit})`);
  }
  return from.factor === to.factor ? value : (value * from.factor) / to.factor;
}

/** Named conversions for the pairs the product shows and imports most; each is `convert` with fixed units. */
const { length, area, secondMomentOfArea, force, stress, moment, lineLoad, unitWeight } = UNIT_FACTORS;

export const ksiToMpa = (stressKsi: number): number => stressKsi * stress.ksi;
export const mpaToKsi = (stressMpa: number): number => stressMpa / stress.ksi;
export const ksfToKpa = (stressKsf: number): number => (stressKsf * stress.ksf) / stress.kPa;
export const kpaToKsf = (stressKpa: number): number => (stressKpa * stress.kPa) / stress.ksf;
export const inToMm = (lengthIn: number): number => lengthIn * length.in;
export const mmToIn = (lengthMm: number): number => lengthMm / length.in;
export const ftToM = (lengthFt: number): number => (lengthFt * length.ft) / length.m;
export const mToFt = (lengthM: number): number => (lengthM * length.m) / length.ft;
export const in2ToMm2 = (areaIn2: number): number => areaIn2 * area.in2;
export const mm2ToIn2 = (areaMm2: number): number => areaMm2 / area.in2;
export const in4ToMm4 = (inertiaIn4: number): number => inertiaIn4 * secondMomentOfArea.in4;
export const mm4ToIn4 = (inertiaMm4: number): number => inertiaMm4 / secondMomentOfArea.in4;
export const kipToKn = (forceKip: number): number => (forceKip * force.kip) / force.kN;
export const knToKip = (forceKn: number): number => (forceKn * force.kN) / force.kip;
export const kipFtToKnM = (momentKipFt: number): number => (momentKipFt * moment.kipFt) / moment.kNm;
export const knMToKipFt = (momentKnM: number): number => (momentKnM * moment.kNm) / moment.kipFt;
export const kipPerFtToKnPerM = (loadKipPerFt: number): number => loadKipPerFt * lineLoad['kip/ft'];
export const knPerMToKipPerFt = (loadKnPerM: number): number => loadKnPerM / lineLoad['kip/ft'];
export const pcfToKnPerM3 = (weightPcf: number): number => weightPcf * unitWeight.pcf;
export const knPerM3ToPcf = (weightKnPerM3: number): number => weightKnPerM3 / unitWeight.pcf;
export const kcfToKnPerM3 = (weightKcf: number): number => weightKcf * unitWeight.kcf;
export const knPerM3ToKcf = (weightKnPerM3: number): number => weightKnPerM3 / unitWeight.kcf;
export const usTonsToKn = (weightTons: number): number => (weightTons * force.ton) / force.kN;
export const knToUsTons = (weightKn: number): number => (weightKn * force.kN) / force.ton;
export const tonnesToKn = (weightTonnes: number): number => (weightTonnes * force.tonne) / force.kN;
export const knToTonnes = (weightKn: number): number => (weightKn * force.kN) / force.tonne;
