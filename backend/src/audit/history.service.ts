import type { HistoryEvent, Page, PageQuery } from '../../../shared/src';
import type { Database } from '../db/database';
import { AppError } from '../http/app-error';
import { findStructureById } from '../structures/structures.repository';
import { findStructureHistory, type HistoryRow } from './history.repository';

function subjectOf(row: HistoryRow): string {
  switch (row.entity_type) {
    case 'structure':
      return 'Structure';
    case 'span':
      return `Span ${row.span_index ?? row.entity_id}`;
    case 'girder':
      return `Span ${row.span_index ?? '?'}, girder ${row.girder_number ?? row.entity_id}`;
    case 'inspection':
      return `Inspection of ${row.day ?? row.entity_id}`;
    case 'finding':
      return `Finding on span ${row.span_index ?? '?'}, girder ${row.girder_number ?? '?'} (inspection of ${row.day ?? '?'})`;
    case 'rating':
      return `Rating ${row.entity_id} of span ${row.span_index ?? '?'}`;
    case 'prior-rating':
      return `Rating on file of ${row.day ?? '?'}${row.span_index === null ? '' : ` (span ${row.span_index})`}`;
    default:
      return row.entity_type;
  }
}

/** Each field the event touched, with its value before and after (a creation has only "after"). */
function changesOf(row: HistoryRow): HistoryEvent['changes'] {
  const before = row.before ?? {};
  const after = row.after ?? {};
  const fields = [...new Set([...Object.keys(before), ...Object.keys(after)])];
  return fields.map((field) => ({ field, before: before[field] ?? null, after: after[field] ?? null }));
}

/** A structure's history, newest first: its own changes, its spans' and girders', its inspections' and findings', and its ratings'. */
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
