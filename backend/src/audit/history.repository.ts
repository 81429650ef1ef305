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
 * The events of a structure and of everything it holds or that is recorded of it: its own, its
 * spans' and girders', its inspections' and their findings', its spans' ratings and its ratings
 * on file from before Spanledger — product.md: every change to inventory, findings and ratings
 * is kept with who and when. Matched through the register as it is now, so a span's history
 * stays with its structure.
 */
function eventsOfStructure(db: Database | Transaction, structureId: number): Knex.QueryBuilder {
  const ofType = (type: string, alias: string) => (join: Knex.JoinClause) => join.on(db.raw('e.entity_type = ?', [type])).andOn(db.raw(`${alias}.id::text = e.entity_id`));
  return db({ e: 'audit_events' })
    .leftJoin({ u: 'users' }, 'u.id', 'e.user_id')
    .leftJoin({ sp: 'spans' }, ofType('span', 'sp'))
    .leftJoin({ g: 'girders' }, ofType('girder', 'g'))
    .leftJoin({ gsp: 'spans' }, 'gsp.id', 'g.span_id')
    .leftJoin({ i: 'inspections' }, ofType('inspection', 'i'))
    .leftJoin({ f: 'findings' }, ofType('finding', 'f'))
    .leftJoin({ fi: 'inspections' }, 'fi.id', 'f.inspection_id')
    .leftJoin({ fg: 'girders' }, 'fg.id', 'f.girder_id')
    .leftJoin({ fsp: 'spans' }, 'fsp.id', 'fg.span_id')
    .leftJoin({ r: 'ratings' }, ofType('rating', 'r'))
    .leftJoin({ rsp: 'spans' }, 'rsp.id', 'r.span_id')
    .leftJoin({ pr: 'prior_ratings' }, ofType('prior-rating', 'pr'))
    .leftJoin({ prsp: 'spans' }, 'prsp.id', 'pr.span_id')
    .where((q) =>
      q
        .where((own) => own.where('e.entity_type', 'structure').andWhere('e.entity_id', String(structureId)))
        .orWhere('sp.structure_id', structureId)
        .orWhere('gsp.structure_id', structureId)
        .orWhere('i.structure_id', structureId)
        .orWhere('fi.structure_id', structureId)
        .orWhere('rsp.structure_id', structureId)
        .orWhere('pr.structure_id', structureId),
    );
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
      db.raw('coalesce(sp.span_index, gsp.span_index, fsp.span_index, rsp.span_index, prsp.span_index) as span_index'),
      db.raw('coalesce(g.girder_number, fg.girder_number) as girder_number'),
      db.raw("to_char(coalesce(i.inspected_on, fi.inspected_on, pr.approved_on), 'YYYY-MM-DD') as day"),
    )
    .orderBy('e.occurred_at', 'desc')
    .orderBy('e.id', 'desc')
    .limit(page.limit)
    .offset(page.offset);
  const count = eventsOfStructure(db, structureId).count<{ total: string }[]>({ total: '*' });
  const [found, [counted]] = await Promise.all([rows as Promise<HistoryRow[]>, count]);
  return { rows: found, total: Number(counted?.total ?? 0) };
}
