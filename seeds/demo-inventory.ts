import type { Knex } from 'knex';
import girderTypeCatalogue from './data/girder-types.json';
import { demoStructures, seededRandom } from './demo-structures';

/**
 * The demo scenario's girder inventory: every structure of the fictional authority gets 2–4
 * simple spans of prestressed girders from the catalogue, with invented but plausible
 * dimensions, materials and strand patterns (some rows harped on the longer spans). Demo data,
 * not checks.
 */

const STRAND = { strand_area_mm2: 98.7, strand_diameter_mm: 12.7, fpu_mpa: 1860, fpy_mpa: 1674, eps_mpa: 196500 };

/** The catalogue type a span of this length would be built with, shortest first. */
function typeNameFor(lengthM: number): string {
  if (lengthM < 18) return 'AASHTO Type II I-girder';
  if (lengthM < 24) return 'AASHTO Type III I-girder';
  if (lengthM < 30) return 'AASHTO Type IV I-girder';
  return lengthM < 34 ? 'AASHTO-PCI BT-63 bulb-tee' : 'AASHTO-PCI BT-72 bulb-tee';
}

interface DemoRow {
  row_key: string;
  y_mm: number;
  strand_count: number;
  fpe_mpa: number;
}

/** Two or three bottom rows at 50 mm pitch, sized to the span, and a harped row on spans over 26 m. */
function strandRowsFor(lengthM: number, random: () => number): { rows: DemoRow[]; harped: boolean } {
  const bottomStrands = Math.round(8 + lengthM * 0.55 + random() * 4);
  const perRow = [Math.min(12, bottomStrands), Math.min(12, Math.max(bottomStrands - 12, 4))];
  if (bottomStrands > 24) perRow.push(bottomStrands - 24);
  const fpe = Math.round(1080 + random() * 80);
  const rows = perRow.map((count, i) => ({ row_key: `r${i + 1}`, y_mm: 50 + 50 * i, strand_count: count, fpe_mpa: fpe }));
  const harped = lengthM > 26;
  if (harped) rows.push({ row_key: 'h1', y_mm: 50 + 50 * perRow.length, strand_count: 6, fpe_mpa: fpe });
  return { rows, harped };
}

function sectionDepthOf(section: { shape: string; depthMm?: number; widthsMm?: number[][] }): number {
  return section.depthMm ?? section.widthsMm![section.widthsMm!.length - 1]![0]!;
}

/** Knex seed entry point: the girder-type catalogue, then spans, girders and strand rows of every demo structure without spans. */
export async function seed(knex: Knex): Promise<void> {
  await knex('girder_types')
    .insert(girderTypeCatalogue.types.map((type) => ({ name: type.name, section: JSON.stringify(type.section), source: type.source })))
    .onConflict('name')
    .ignore();
  const types = new Map((await knex('girder_types').select('id', 'name', 'section')).map((type) => [type.name as string, type]));
  const structures = new Map((await knex('structures').select('id', 'structure_number')).map((row) => [row.structure_number as string, row.id as number]));
  const random = seededRandom(20261215);
  for (const structure of demoStructures()) {
    const structureId = structures.get(structure.structure_number);
    if (structureId === undefined || (await knex('spans').where({ structure_id: structureId }).first())) continue;
    const spanCount = 2 + Math.floor(random() * 3);
    const lengthM = Math.round((16 + random() * 20) * 2) / 2;
    const girderCount = 4 + Math.floor(random() * 4);
    const spacingMm = Math.round((2100 + random() * 600) / 50) * 50;
    const type = types.get(typeNameFor(lengthM))!;
    const fcMpa = Math.round(41 + random() * 14);
    const { rows, harped } = strandRowsFor(lengthM, random);
    for (let spanIndex = 1; spanIndex <= spanCount; spanIndex++) {
      const [span] = await knex('spans')
        .insert({
          structure_id: structureId,
          span_index: spanIndex,
          length_m: lengthM,
          girder_count: girderCount,
          girder_spacing_mm: spacingMm,
          overhang_mm: 900,
          roadway_width_mm: (girderCount - 1) * spacingMm + 2 * 900 - 2 * 450,
          barrier_face_to_girder_mm: 450,
          deck_thickness_mm: 200,
          haunch_mm: 25,
          wearing_surface: JSON.stringify({ thicknessMm: 60, unitWeightKnM3: 23, measured: false, kind: 'overlay' }),
          barriers: JSON.stringify([{ loadKnM: 7.5 }, { loadKnM: 7.5 }]),
          diaphragms: JSON.stringify([{ xM: lengthM / 2, loadKn: 10 }]),
        })
        .returning('id');
      for (let girderNumber = 1; girderNumber <= girderCount; girderNumber++) {
        const [girder] = await knex('girders')
          .insert({
            span_id: span.id,
            girder_number: girderNumber,
            position: girderNumber === 1 || girderNumber === girderCount ? 'exterior' : 'interior',
            girder_type_id: type.id,
            concrete: JSON.stringify({ strengthMpa: fcMpa, basis: 'cylinder', unitWeightKnM3: 24 }),
            deck_concrete: JSON.stringify({ strengthMpa: 30, basis: 'cylinder' }),
            profiles: JSON.stringify(
              harped ? [{ rowId: 'h1', shape: 'harped', endYMm: sectionDepthOf(type.section) - 150, holdDownM: [0.4 * lengthM, 0.6 * lengthM] }] : [],
            ),
          })
          .returning('id');
        await knex('strand_rows').insert(rows.map((row, rowOrder) => ({ ...row, ...STRAND, girder_id: girder.id, row_order: rowOrder })));
      }
    }
  }
}
