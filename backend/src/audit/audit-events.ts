import type { SignedInUser } from '../../../shared/src';
import type { Database, Transaction } from '../db/database';

/** A thing a change happened to: its kind (`structure`, `user`, …) and its id. */
export interface AuditedEntity {
  readonly type: string;
  readonly id: string | number;
}

export interface AuditEventInput {
  /** Pass the open transaction so the history row commits or rolls back with the change itself. */
  readonly db: Database | Transaction;
  readonly user: Pick<SignedInUser, 'id'> | null;
  readonly action: string;
  readonly entity: AuditedEntity;
  readonly before?: unknown;
  readonly after?: unknown;
}

export interface AuditEventRow {
  id: string;
  user_id: number | null;
  action: string;
  entity_type: string;
  entity_id: string;
  before: unknown;
  after: unknown;
  occurred_at: Date;
}

/** Appends one event to the history (`audit_events`, which the database keeps append-only). */
export async function recordAuditEvent({ db, user, action, entity, before = null, after = null }: AuditEventInput): Promise<void> {
  await db('audit_events').insert({
    user_id: user?.id ?? null,
    action,
    entity_type: entity.type,
    entity_id: String(entity.id),
    before: before === null ? null : JSON.stringify(before),
    after: after === null ? null : JSON.stringify(after),
  });
}
