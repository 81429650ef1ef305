import { convert } from '@spanledger/shared';

import type { UnitSystem } from '../units/measures';

/** Section quantities the inventory's measures do not cover: area, second moment of area and section modulus. */
export type SectionQuantity = 'area' | 'inertia' | 'modulus';

interface QuantityFormat {
  /** SI values this large are shown as a multiple of a power of ten, as section tables print them. */
  readonly siScale: number;
  readonly siLabel: string;
  readonly siDecimals: number;
  readonly usLabel: string;
  readonly usDecimals: number;
  readonly toUs: (valueSi: number) => number;
}

const MM3_PER_IN3 = convert(1, 'in', 'mm') ** 3;

const FORMATS: Readonly<Record<SectionQuantity, QuantityFormat>> = {
  area: { siScale: 1, siLabel: 'mm²', siDecimals: 0, usLabel: 'in²', usDecimals: 1, toUs: (mm2) => convert(mm2, 'mm2', 'in2') },
  inertia: { siScale: 1e9, siLabel: '× 10⁹ mm⁴', siDecimals: 2, usLabel: 'in⁴', usDecimals: 0, toUs: (mm4) => convert(mm4, 'mm4', 'in4') },
  modulus: { siScale: 1e6, siLabel: '× 10⁶ mm³', siDecimals: 1, usLabel: 'in³', usDecimals: 0, toUs: (mm3) => mm3 / MM3_PER_IN3 },
};

/** A section quantity given in SI (mm², mm⁴, mm³) as people read it in the unit system, with its unit. */
export function formatSectionQuantity(quantity: SectionQuantity, valueSi: number, system: UnitSystem): string {
  const format = FORMATS[quantity];
  const [value, decimals, label] = system === 'si' ? [valueSi / format.siScale, format.siDecimals, format.siLabel] : [format.toUs(valueSi), format.usDecimals, format.usLabel];
  return `${value.toLocaleString('en', { minimumFractionDigits: decimals, maximumFractionDigits: decimals })} ${label}`;
}

