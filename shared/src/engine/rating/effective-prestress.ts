import type { Girder } from '../calc-file/girder';
import type { RateFile } from '../calc-file/rate-file';
import { effectivePrestress, type EffectivePrestressResult } from '../losses';
import { EngineInputError } from '../materials';
import type { RatingPolicy } from '../policy/rating-policy';
import { sectionProperties, shapeToPolygons } from '../section';
import { uniformLoadMomentNmm } from './simple-span';

/**
 * The girder with each row's effective prestress: as given, or computed by the AASHTO
 * approximate method from the jacking stress, f'ci and humidity (`losses/`), with the girder's
 * own weight acting at midspan at transfer. Loss errors are reported at the rows' paths.
 */
export function withEffectivePrestress(file: RateFile, girder: Girder, policy: RatingPolicy): { girder: Girder; losses: EffectivePrestressResult | null } {
  const losses = file.losses;
  if (losses.method === 'given') return { girder, losses: null };
  const gross = sectionProperties(shapeToPolygons(girder.section));
  const selfWeightNPerMm = gross.areaMm2 * girder.concrete.unitWeightKnM3 * 1e-6;
  const spanLengthMm = file.span.lengthM * 1000;
  try {
    const result = effectivePrestress({
      rows: girder.strandRows.map((row) => ({ rowId: row.id, yMm: row.yMm, areaMm2: row.count * row.strandAreaMm2, epsMpa: row.epsMpa })),
      section: { areaMm2: gross.areaMm2, centroidFromSoffitMm: gross.centroidFromSoffitMm, inertiaMm4: gross.inertiaMm4 },
      jackingStressMpa: losses.jackingStressMpa,
      fciMpa: losses.fciMpa,
      ...(losses.eciMpa !== undefined ? { eciMpa: losses.eciMpa } : {}),
      eciFormula: { formula: file.options.elasticModulusFormula ?? policy.section.elasticModulusFormula, unitWeightKnM3: girder.concrete.unitWeightKnM3 },
      relativeHumidityPct: losses.relativeHumidityPct,
      strandType: losses.strandType,
      selfWeightMomentNmm: uniformLoadMomentNmm(selfWeightNPerMm, spanLengthMm, spanLengthMm / 2),
    });
    const fpeByRow = new Map(result.rows.map((row) => [row.rowId, row.fpeMpa]));
    return { girder: { ...girder, strandRows: girder.strandRows.map((row) => ({ ...row, fpeMpa: fpeByRow.get(row.id)! })) }, losses: result };
  } catch (error) {
    if (error instanceof EngineInputError) throw new EngineInputError(error.path.replace(/^losses\.rows\[(\d+)\]/, 'girder.strandRows[$1]'), error.problem);
    throw error;
  }
}
