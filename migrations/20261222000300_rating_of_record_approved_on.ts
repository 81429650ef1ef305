import type { Knex } from 'knex';

/**
 * The day a structure's rating-of-record figures were approved when they are those of a rating
 * on file from before Spanledger (a prior rating is approved on a day, not at a moment). Kept
 * beside `rating_of_record_approved_at` (that day's start in UTC, for ordering) so the structure
 * page shows the day itself: as a moment, midnight UTC is the day before west of Greenwich.
 * Null when Spanledger approved the rating of record, or there is none.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('structures', (table) => {
    table.date('rating_of_record_approved_on').comment('the prior rating\'s day when the figures are one on file from before Spanledger; else null');
  });
  // Figures already refreshed from a prior rating: its day's start in UTC, and no approval of Spanledger's at that moment.
  await knex.raw(`
    update structures as s
       set rating_of_record_approved_on = (s.rating_of_record_approved_at at time zone 'UTC')::date
     where s.rating_of_record_approved_at is not null
       and exists (select 1 from prior_ratings as pr where pr.structure_id = s.id and (pr.approved_on::timestamp at time zone 'UTC') = s.rating_of_record_approved_at)
       and not exists (select 1 from ratings as r join spans as sp on sp.id = r.span_id where sp.structure_id = s.id and r.state = 'approved' and r.reviewed_at = s.rating_of_record_approved_at)`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('structures', (table) => {
    table.dropColumn('rating_of_record_approved_on');
  });
}
