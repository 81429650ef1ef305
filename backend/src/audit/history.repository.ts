import type { Knex } from 'knex';
import type { Database, Transaction } from '../db/database';

export interface HistoryRow {
  id: string;
  occurred_at: Date;
  action: string;
  entity_type: string;
  entity_id: string;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
  user_name: string | null;
  span_index: number | null;
  girder_number: number | null;
  /** 'YYYY-MM-DD': the day of the inspection an event of an inspection or finding is of, or of a rating on file. */
  day: string | null;
}

/**
 * Everything a structure holds or that is recorded of it, as the history names them: itself,
 * its spans and girders, its inspections and their findings, its spans' ratings and its ratings
 * on file from before Spanledger, each with where it is (span index, girder number) and the day
 * of the inspection or rating on file it belongs to. Found through the register as it is now, so
 * a span's history stays with its structure.
 */
const SUBJECTS_OF_STRUCTURE = `
  select 'structure' as entity_type, ?::text as entity_id, null::smallint as span_index, null::smallint as girder_number, null::date as day
  union all
  select 'span', sp.id::text, sp.span_index, null, null from spans sp where sp.structure_id = ?
  union all
  select 'girder', g.id::text, sp.span_index, g.girder_number, null from girders g join spans sp on sp.id = g.span_id where sp.structure_id = ?
  union all
  select 'inspection', i.id::text, null, null, i.inspected_on from inspections i where i.structure_id = ?
  union all
  select 'finding', f.id::text, fsp.span_index, fg.girder_number, fi.inspected_on
    from findings f join inspections fi on fi.id = f.inspection_id left join girders fg on fg.id = f.girder_id left join spans fsp on fsp.id = fg.span_id
   where fi.structure_id = ?
  union all
  select 'rating', r.id::text, rsp.span_index, null, null from ratings r join spans rsp on rsp.id = r.span_id where rsp.structure_id = ?
  union all
  select 'prior-rating', pr.id::text, prsp.span_index, null, pr.approved_on from prior_ratings pr left join spans prsp on prsp.id = pr.span_id where pr.structure_id = ?`;

/**
 * The events of a structure and of everything it holds or that is recorded of it — product.md:
 * every change to inventory, findings and ratings is kept with who and when. Each subject's events
 * are looked up by the history's (entity type, entity id) index: an import adds tens of thousands
 * of events, and going through the whole history for one structure took over a minute once it
 * held 600 000.
 */
function eventsOfStructure(db: Database | Transaction, structureId: number): Knex.QueryBuilder {
  const subjects = db.raw(`(${SUBJECTS_OF_STRUCTURE}) as x`, Array<number>(7).fill(structureId));
  return db({ e: 'audit_events' })
    .join(subjects, (join) => join.on('x.entity_type', 'e.entity_type').andOn('x.entity_id', 'e.entity_id'))
    .leftJoin({ u: 'users' }, 'u.id', 'e.user_id');
}

/** One page of a structure's history, newest first, and how many events it holds. */
export async function findStructureHistory(db: Database | Transaction, structureId: number, page: { limit: number; offset: number }): Promise<{ rows: HistoryRow[]; total: number }> {
  const rows = eventsOfStructure(db, structureId)
    .select(
      'e.id',
      'e.occurred_at',
      'e.action',
      'e.entity_type',
      'e.entity_id',
      'e.before',
      'e.after',
      'u.display_name as user_name',
      'x.span_index',
      'x.girder_number',
      db.raw("to_char(x.day, 'YYYY-MM-DD') as day"),
    )
    .orderBy('e.occurred_at', 'desc')
    .orderBy('e.id', 'desc')
    .limit(page.limit)
    .offset(page.offset);
  const count = eventsOfStructure(db, structureId).count<{ total: string }[]>({ total: '*' });
  const [found, [counted]] = await Promise.all([rows as Promise<HistoryRow[]>, count]);
  return { rows: found, total: Number(counted?.total ?? 0) };
}
