import type { Knex } from 'knex';
import { ratingRun, type RatingState } from '../shared/src';
import { approveRating, returnRating, runRating, submitRating } from '../backend/src/ratings/ratings.service';
import { demoStaff } from './demo-inspections';

/**
 * The demo scenario's rating records, made through the same rules a person follows: ratings of
 * record on a spread of structures in three districts (among them the ones whose accepted
 * inspections found damage, rated with those findings applied), one record waiting for review,
 * one returned with a comment and one draft. South District structures with no inspection are
 * left unrated, for the journeys that rate one themselves. Everything is invented.
 */

const CENTRAL_RATER = 'bv-staff-2013';
const EAST_AND_SOUTH_RATER = 'bv-staff-2029';
const NETWORK_MANAGER = 'bv-staff-3002';
/** North District has no rating engineer of its own: its manager (North and Central) runs its ratings. */
const NORTH_AND_CENTRAL_MANAGER = 'bv-staff-3018';

/** The design load and the legal loads, under the default policy: what a routine rating of record reads. */
const VEHICLE_IDS = ['hl93', 'type-3', 'type-3s2', 'type-3-3'];
const POLICY_ID = 'lrfr-default';

type Outcome =
  | { readonly state: 'draft' }
  | { readonly state: 'submitted'; readonly submitComment: string }
  | { readonly state: 'returned' | 'approved'; readonly submitComment: string; readonly reviewer: string; readonly reviewComment: string };

interface PlannedRating {
  readonly structureNumber: string;
  readonly rater: string;
  /** Every span for a rating of record; only the first for a record still in progress. */
  readonly spans: 'all' | 'first';
  /**
   * Two girders per span keep the load quick: exterior girder 1 and an interior one, girder 2
   * unless the damage is on another.
   */
  readonly girderNumbers?: readonly [number, number];
  readonly notes: string;
  readonly outcome: Outcome;
}

const approvedBy = (reviewer: string, reviewComment: string, submitComment = 'Span record checked against the drawings.'): Outcome => ({ state: 'approved', submitComment, reviewer, reviewComment });

const PLAN: readonly PlannedRating[] = [
  { structureNumber: 'BV-N-0108', rater: NORTH_AND_CENTRAL_MANAGER, spans: 'all', notes: 'The spall of the September routine inspection applied to girder 1, span 1.', outcome: approvedBy(NETWORK_MANAGER, 'Spall applied as recorded; agreed.', 'Re-rated with the accepted September findings.') },
  { structureNumber: 'BV-N-0122', rater: NORTH_AND_CENTRAL_MANAGER, spans: 'all', notes: 'The severed and exposed strands of the October in-depth inspection applied to girder 1, span 1.', outcome: approvedBy(NETWORK_MANAGER, 'Strand loss from the vehicle strike applied; agreed.', 'Re-rated after the over-height strike.') },
  { structureNumber: 'BV-N-0115', rater: NORTH_AND_CENTRAL_MANAGER, spans: 'all', notes: 'Routine rating from the inventory.', outcome: approvedBy(NETWORK_MANAGER, 'Agreed.') },
  { structureNumber: 'BV-N-0178', rater: NORTH_AND_CENTRAL_MANAGER, spans: 'all', notes: 'Routine rating from the inventory.', outcome: approvedBy(NETWORK_MANAGER, 'Agreed.') },
  { structureNumber: 'BV-C-0101', rater: CENTRAL_RATER, spans: 'all', notes: 'Routine rating from the inventory.', outcome: approvedBy(NORTH_AND_CENTRAL_MANAGER, 'Agreed.') },
  { structureNumber: 'BV-C-0129', rater: CENTRAL_RATER, spans: 'all', notes: "Superstructure condition 4: the policy's condition factor lowers the capacity.", outcome: approvedBy(NORTH_AND_CENTRAL_MANAGER, 'Agreed; keep on the watch list.') },
  { structureNumber: 'BV-C-0164', rater: CENTRAL_RATER, spans: 'all', notes: 'Routine rating from the inventory.', outcome: approvedBy(NETWORK_MANAGER, 'Agreed.') },
  { structureNumber: 'BV-E-0122', rater: EAST_AND_SOUTH_RATER, spans: 'all', notes: 'Posted structure: rated again from the inventory.', outcome: approvedBy(NETWORK_MANAGER, 'Agreed.') },
  { structureNumber: 'BV-E-0143', rater: EAST_AND_SOUTH_RATER, spans: 'all', notes: 'Routine rating from the inventory.', outcome: approvedBy(NETWORK_MANAGER, 'Agreed.') },
  { structureNumber: 'BV-E-0150', rater: EAST_AND_SOUTH_RATER, spans: 'all', notes: 'Routine rating from the inventory.', outcome: approvedBy(NETWORK_MANAGER, 'Agreed.') },
  { structureNumber: 'BV-S-0115', rater: EAST_AND_SOUTH_RATER, spans: 'all', notes: 'The web cracks of the August routine inspection are on the register; they have no modelled effect on flexure.', outcome: approvedBy(NETWORK_MANAGER, 'Cracks noted; agreed.', 'Re-rated after the August inspection.') },
  {
    structureNumber: 'BV-S-0136', rater: EAST_AND_SOUTH_RATER, spans: 'first', girderNumbers: [1, 3],
    notes: 'The broken strands and pitting reported on girder 3, span 1, in the November damage inspection applied.',
    outcome: { state: 'submitted', submitComment: 'Re-rated at once for the strand breaks on girder 3; the inspection itself is still waiting for review.' },
  },
  {
    structureNumber: 'BV-C-0136', rater: CENTRAL_RATER, spans: 'first', notes: 'Routine rating from the inventory.',
    outcome: { state: 'returned', submitComment: 'Span 1 first; the others follow once agreed.', reviewer: NORTH_AND_CENTRAL_MANAGER, reviewComment: 'The overlay was measured in the spring survey; update the wearing surface on the span record and run again.' },
  },
  { structureNumber: 'BV-E-0129', rater: EAST_AND_SOUTH_RATER, spans: 'first', notes: 'Started from the inventory; ADTT to be confirmed with the new count.', outcome: { state: 'draft' } },
];

async function spansToRate(knex: Knex, structureId: number, spans: PlannedRating['spans']): Promise<number[]> {
  const ids: number[] = await knex('spans').where({ structure_id: structureId }).orderBy('span_index').pluck('id');
  return spans === 'all' ? ids : ids.slice(0, 1);
}

async function girderIdsOf(knex: Knex, spanId: number, girderNumbers: readonly number[]): Promise<number[]> {
  return knex('girders').where({ span_id: spanId }).whereIn('girder_number', girderNumbers).orderBy('girder_number').pluck('id');
}

/** Runs the span's rating as the planned rater and takes it through the planned steps. */
async function rateSpan(knex: Knex, spanId: number, plan: PlannedRating): Promise<void> {
  const db = knex as Parameters<typeof runRating>[0]['db'];
  const rater = await demoStaff(knex, plan.rater);
  const girderIds = await girderIdsOf(knex, spanId, plan.girderNumbers ?? [1, 2]);
  const run = ratingRun.parse({ girderIds, vehicleIds: VEHICLE_IDS, policyId: POLICY_ID, notes: plan.notes });
  const draft = await runRating({ db, user: rater }, spanId, run);
  const { outcome } = plan;
  if (outcome.state === 'draft') return;
  const submitted = await submitRating({ db, user: rater }, draft.id, draft.version, outcome.submitComment);
  if (outcome.state === 'submitted') return;
  const reviewer = { db, user: await demoStaff(knex, outcome.reviewer) };
  const review = outcome.state === 'approved' ? approveRating : returnRating;
  await review(reviewer, submitted.id, submitted.version, outcome.reviewComment);
}

/** Knex seed entry point: the planned ratings of demo structures that have no rating yet. */
export async function seed(knex: Knex): Promise<void> {
  for (const plan of PLAN) {
    const structure = await knex('structures').where({ structure_number: plan.structureNumber }).first('id');
    if (!structure) continue;
    const rated = await knex('ratings').join('spans', 'spans.id', 'ratings.span_id').where({ 'spans.structure_id': structure.id }).first('ratings.id');
    if (rated) continue;
    for (const spanId of await spansToRate(knex, structure.id, plan.spans)) await rateSpan(knex, spanId, plan);
  }
}

/** For the demo scenario's own check: which structures carry rating records, and in which state. */
export const DEMO_RATED_STRUCTURES: ReadonlyMap<string, RatingState> = new Map(PLAN.map((plan) => [plan.structureNumber, plan.outcome.state]));
