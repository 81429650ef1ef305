import type { SignedInUser } from '../../../shared/src';
import type { Database, Transaction } from '../db/database';
import { insertJsonRows } from '../db/json-rows-insert';
import { inChunks } from '../db/many-created';

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
export async function recordAuditEvent({ db, user, ...event }: AuditEventInput): Promise<void> {
  await recordAuditEvents(db, user, [event]);
}

/** Events per insert statement when many are written at once: a few megabytes of JSON text each; a step of an import's girders (2 500) in one. */
const EVENTS_PER_INSERT = 2500;

/** Appends many events by one user in a few statements — an import writes thousands — in the order given. */
export async function recordAuditEvents(db: Database | Transaction, user: Pick<SignedInUser, 'id'> | null, events: readonly Omit<AuditEventInput, 'db' | 'user'>[]): Promise<void> {
  for (const chunk of inChunks(events, EVENTS_PER_INSERT)) {
    await insertJsonRows(
      db,
      'audit_events',
      chunk.map(({ action, entity, before = null, after = null }) => ({ user_id: user?.id ?? null, action, entity_type: entity.type, entity_id: String(entity.id), before, after })),
    );
  }
}
