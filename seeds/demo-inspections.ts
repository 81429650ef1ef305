import type { Knex } from 'knex';
import type { NewFinding, SignedInUser } from '../shared/src';
import { toSignedInUser } from '../backend/src/auth/auth.service';
import { acceptInspection, addFinding, startInspection, submitInspection } from '../backend/src/inspections/inspections.service';
import { findUserBySubject, upsertSignedInUser } from '../backend/src/users/users.repository';
import { DEMO_USERS } from '../scripts/lib/local-identity-provider/demo-users';

/**
 * The demo scenario's inspection history, recorded through the same rules a person follows:
 * accepted inspections from last year with a little damage, and one damage inspection this
 * autumn with newly broken strands waiting for review (its critical finding alerts the South
 * District raters). Everything is invented.
 */

/** The demo staff as they appear once they have signed in; added here so the history has its people. */
export async function demoStaff(knex: Knex, subject: string): Promise<SignedInUser> {
  const existing = await findUserBySubject(knex, subject);
  if (existing) return toSignedInUser(existing);
  const person = DEMO_USERS.find((user) => user.subject === subject)!;
  const row = await upsertSignedInUser(knex, { subject, email: person.email, display_name: person.displayName, role: person.role, districts: [...person.districts], admin: person.admin });
  return toSignedInUser(row);
}

interface PlannedFinding {
  readonly girderNumber: number;
  readonly finding: Omit<NewFinding, 'girderId' | 'strands' | 'lossFraction' | 'brokenWires' | 'spall' | 'deckLossMm' | 'crackWidthMm' | 'notes'> & Partial<NewFinding>;
  /** Take this many strands of the girder's lowest row, by index from the first. */
  readonly strandsOfBottomRow?: readonly number[];
}

interface PlannedInspection {
  readonly structureNumber: string;
  readonly inspector: string;
  readonly reviewer: string | null;
  readonly inspectedOn: string;
  readonly kind: 'routine' | 'in-depth' | 'damage';
  readonly conditions: { deck: number; superstructure: number; substructure: number };
  readonly notes: string;
  readonly findings: readonly PlannedFinding[];
}

const PLAN: readonly PlannedInspection[] = [
  {
    structureNumber: 'BV-N-0108', inspector: 'bv-staff-1041', reviewer: 'bv-staff-3018', inspectedOn: '2025-09-16', kind: 'routine',
    conditions: { deck: 6, superstructure: 6, substructure: 7 }, notes: 'Light scaling on the deck; bearings clean.',
    findings: [{ girderNumber: 1, finding: { kind: 'spall', spall: { depthMm: 40, widthMm: 180 }, fromM: 3.5, toM: 4.6, severity: 'moderate', notes: 'Spall at the bottom flange corner over the ditch, no steel showing.' } }],
  },
  {
    structureNumber: 'BV-N-0122', inspector: 'bv-staff-1041', reviewer: 'bv-staff-3018', inspectedOn: '2025-10-02', kind: 'in-depth',
    conditions: { deck: 5, superstructure: 5, substructure: 6 }, notes: 'Over-height vehicle strike on the exterior girder, span 1.',
    findings: [
      { girderNumber: 1, strandsOfBottomRow: [0], finding: { kind: 'lost-strands', fromM: 9.0, toM: 10.2, severity: 'severe', notes: 'One strand severed at the impact, ends frayed.' } },
      { girderNumber: 1, strandsOfBottomRow: [1], finding: { kind: 'exposed-strands', fromM: 8.5, toM: 10.8, severity: 'moderate', notes: 'Strand exposed beside the severed one.' } },
    ],
  },
  {
    structureNumber: 'BV-S-0115', inspector: 'bv-staff-1057', reviewer: 'bv-staff-2029', inspectedOn: '2025-08-21', kind: 'routine',
    conditions: { deck: 7, superstructure: 7, substructure: 6 }, notes: 'Hairline cracks at the girder ends; monitor.',
    findings: [{ girderNumber: 2, finding: { kind: 'crack', crackWidthMm: 0.2, fromM: 0, toM: 0.8, severity: 'minor', notes: 'Web cracks near the bearing.' } }],
  },
  {
    structureNumber: 'BV-S-0136', inspector: 'bv-staff-1057', reviewer: null, inspectedOn: '2026-11-18', kind: 'damage',
    conditions: { deck: 5, superstructure: 4, substructure: 6 }, notes: 'Corrosion under a leaking joint; two strands broken in the bottom row.',
    findings: [
      { girderNumber: 3, strandsOfBottomRow: [2, 3], finding: { kind: 'lost-strands', fromM: 11.0, toM: 12.5, severity: 'severe', notes: 'Two strands broken, rust staining along the flange.' } },
      { girderNumber: 3, strandsOfBottomRow: [4], finding: { kind: 'strand-section-loss', lossFraction: 0.25, fromM: 10.0, toM: 13.0, severity: 'moderate', notes: 'Pitting on the next strand, about a quarter of its area.' } },
    ],
  },
];

async function girderOf(knex: Knex, structureId: number, girderNumber: number): Promise<{ id: number; bottomRowId: string }> {
  const girder = await knex('girders').join('spans', 'spans.id', 'girders.span_id').where({ 'spans.structure_id': structureId, 'spans.span_index': 1, 'girders.girder_number': girderNumber }).first('girders.id');
  const row = await knex('strand_rows').where({ girder_id: girder.id }).orderBy('y_mm').first('row_key');
  return { id: girder.id, bottomRowId: row.row_key };
}

/** Knex seed entry point: the planned inspections of demo structures that have none yet. */
export async function seed(knex: Knex): Promise<void> {
  const db = knex as Parameters<typeof startInspection>[0]['db'];
  for (const plan of PLAN) {
    const structure = await knex('structures').where({ structure_number: plan.structureNumber }).first('id');
    if (!structure || (await knex('inspections').where({ structure_id: structure.id }).first('id'))) continue;
    const inspector = await demoStaff(knex, plan.inspector);
    let inspection = await startInspection({ db, user: inspector }, structure.id, {
      inspectedOn: plan.inspectedOn,
      kind: plan.kind,
      deckCondition: plan.conditions.deck,
      superstructureCondition: plan.conditions.superstructure,
      substructureCondition: plan.conditions.substructure,
      notes: plan.notes,
    });
    for (const { girderNumber, finding, strandsOfBottomRow } of plan.findings) {
      const girder = await girderOf(knex, structure.id, girderNumber);
      await addFinding({ db, user: inspector }, inspection.id, {
        girderId: girder.id,
        strands: strandsOfBottomRow ? { rowId: girder.bottomRowId, strands: [...strandsOfBottomRow] } : null,
        lossFraction: null,
        brokenWires: null,
        spall: null,
        deckLossMm: null,
        crackWidthMm: null,
        notes: '',
        ...finding,
      });
    }
    inspection = await submitInspection({ db, user: inspector }, inspection.id, inspection.version);
    if (plan.reviewer) await acceptInspection({ db, user: await demoStaff(knex, plan.reviewer) }, inspection.id, inspection.version);
  }
}

/** For the demo scenario's own check: which structures carry inspections. */
export const DEMO_INSPECTED_STRUCTURES = PLAN.map((plan) => plan.structureNumber);
