import type { CapacityFile } from '../calc-file/capacity-file';
import { RESULT_CAUTION } from '../caution';
import type { SectionProperties } from '../section';
import { aashtoApproximateStrength } from './aashto-approximate';
import { buildSectionModel } from './build-section-model';
import { is1343Strength } from './is1343';
import type { FlexuralStrength, SectionModel } from './section-model';
import { strainCompatibilityStrength } from './strain-compatibility';

/** Elastic properties as the calculation file prints them (calc-file.md, Output of capacity). */
export interface SectionPropertiesOutput {
  readonly areaMm2: number;
  readonly centroidFromSoffitMm: number;
  readonly inertiaMm4: number;
  readonly topModulusMm3: number;
  readonly bottomModulusMm3: number;
}

/** The output of `spanledger capacity` and `POST /api/calc/capacity`. */
export interface CapacityOutput extends FlexuralStrength {
  readonly girderSection: SectionPropertiesOutput;
  readonly compositeSection?: SectionPropertiesOutput;
  /** Stresses in this output are tension positive (engineering.md §1). */
  readonly signConvention: string;
  readonly caution: string;
}

function propertiesOutput(properties: SectionProperties): SectionPropertiesOutput {
  const { areaMm2, centroidFromSoffitMm, inertiaMm4, topModulusMm3, bottomModulusMm3 } = properties;
  return { areaMm2, centroidFromSoffitMm, inertiaMm4, topModulusMm3, bottomModulusMm3 };
}

function strengthBy(model: SectionModel, options: CapacityFile['options']): FlexuralStrength {
  switch (options.method) {
    case 'strain-compatibility':
      return strainCompatibilityStrength(model, { strandCurve: options.strandCurve, concreteModel: options.concreteModel });
    case 'aashto-approximate':
      return aashtoApproximateStrength(model);
    case 'is1343':
      return is1343Strength(model);
  }
}

/**
 * Flexural strength of one girder section with its damage applied, by the method the file
 * names (engineering.md §4), with the damaged section's elastic properties. Takes a file that
 * `parseCapacityFile` accepted; a method that cannot take the section throws EngineInputError.
 */
export function computeCapacity(file: CapacityFile): CapacityOutput {
  const model = buildSectionModel(file);
  const strength = strengthBy(model, file.options);
  return {
    ...strength,
    warnings: [...model.warnings, ...strength.warnings],
    girderSection: propertiesOutput(model.girderSection),
    ...(model.compositeSection ? { compositeSection: propertiesOutput(model.compositeSection) } : {}),
    signConvention: 'stresses and strains: tension positive',
    caution: RESULT_CAUTION,
  };
}
