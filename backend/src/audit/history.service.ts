import type { HistoryEvent, Page, PageQuery } from '../../../shared/src';
import type { Database } from '../db/database';
import { AppError } from '../http/app-error';
import { findStructureById } from '../structures/structures.repository';
import { findStructureHistory, type HistoryRow } from './history.repository';

function subjectOf(row: HistoryRow): string {
  if (row.entity_type === 'span') return `Span ${row.span_index ?? row.entity_id}`;
  if (row.entity_type === 'girder') return `Span ${row.span_index ?? '?'}, girder ${row.girder_number ?? row.entity_id}`;
  return row.entity_type === 'structure' ? 'Structure' : row.entity_type;
}

/** Each field the event touched, with its value before and after (a creation has only "after"). */
function changesOf(row: HistoryRow): HistoryEvent['changes'] {
  const before = row.before ?? {};
  const after = row.after ?? {};
  const fields = [...new Set([...Object.keys(before), ...Object.keys(after)])];
  return fields.map((field) => ({ field, before: before[field] ?? null, after: after[field] ?? null }));
}

/** A structure's history, newest first: its own changes and those of its spans and girders. */
export async function structureHistory({ db }: { db: Database }, structureId: number, page: PageQuery): Promise<Page<HistoryEvent>> {
  if (!(await findStructureById(db, structureId))) throw AppError.notFound(`There is no structure with id ${structureId}`);
  const { rows, total } = await findStructureHistory(db, structureId, page);
  return {
    items: rows.map((row) => ({
      id: row.id,
      occurredAt: row.occurred_at.toISOString(),
      action: row.action,
      entityType: row.entity_type,
      entityId: row.entity_id,
      subject: subjectOf(row),
      userName: row.user_name,
      changes: changesOf(row),
    })),
    total,
    limit: page.limit,
    offset: page.offset,
  };
}
