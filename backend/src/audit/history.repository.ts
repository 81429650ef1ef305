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
}

/**
 * The events of a structure and of everything it holds: its own, its spans' and its girders'
 * (matched through the inventory as it is now, so a span's history stays with its structure).
 */
function eventsOfStructure(db: Database | Transaction, structureId: number): Knex.QueryBuilder {
  return db({ e: 'audit_events' })
    .leftJoin({ u: 'users' }, 'u.id', 'e.user_id')
    .leftJoin({ sp: 'spans' }, (join) => join.on(db.raw("e.entity_type = 'span'")).andOn(db.raw('sp.id::text = e.entity_id')))
    .leftJoin({ g: 'girders' }, (join) => join.on(db.raw("e.entity_type = 'girder'")).andOn(db.raw('g.id::text = e.entity_id')))
    .leftJoin({ gsp: 'spans' }, 'gsp.id', 'g.span_id')
    .where((q) =>
      q
        .where((own) => own.where('e.entity_type', 'structure').andWhere('e.entity_id', String(structureId)))
        .orWhere('sp.structure_id', structureId)
        .orWhere('gsp.structure_id', structureId),
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
      db.raw('coalesce(sp.span_index, gsp.span_index) as span_index'),
      'g.girder_number',
    )
    .orderBy('e.occurred_at', 'desc')
    .orderBy('e.id', 'desc')
    .limit(page.limit)
    .offset(page.offset);
  const count = eventsOfStructure(db, structureId).count<{ total: string }[]>({ total: '*' });
  const [found, [counted]] = await Promise.all([rows as Promise<HistoryRow[]>, count]);
  return { rows: found, total: Number(counted?.total ?? 0) };
}
