import type { AlertItem } from '../../../shared/src';
import type { Database, Transaction } from '../db/database';

type Db = Database | Transaction;

export interface AlertRow {
  id: number;
  kind: AlertItem['kind'];
  message: string;
  structure_id: number;
  structure_number: string;
  girder_id: number | null;
  inspection_id: number | null;
  finding_id: number | null;
  created_at: Date;
  read_at: Date | null;
}

/** Users of a role whose districts include the district: who an alert about it goes to. */
export async function findUsersOfRoleInDistrict(db: Db, role: string, district: string): Promise<number[]> {
  return db('users').where({ role }).whereRaw('? = any(districts)', [district]).orderBy('id').pluck('id');
}

export async function findingAlreadyAlerted(db: Db, findingId: number): Promise<boolean> {
  return (await db('alerts').where({ finding_id: findingId }).first('id')) !== undefined;
}

export async function insertAlerts(trx: Transaction, alerts: readonly Omit<AlertRow, 'id' | 'structure_number' | 'created_at' | 'read_at'>[], userIds: readonly number[]): Promise<void> {
  const rows = alerts.flatMap((alert) => userIds.map((user_id) => ({ ...alert, user_id })));
  if (rows.length > 0) await trx('alerts').insert(rows);
}

export async function findAlertsOfUser(db: Db, userId: number, limit: number): Promise<AlertRow[]> {
  return db({ a: 'alerts' })
    .join({ s: 'structures' }, 's.id', 'a.structure_id')
    .where('a.user_id', userId)
    .orderBy([{ column: 'a.created_at', order: 'desc' }, { column: 'a.id', order: 'desc' }])
    .limit(limit)
    .select('a.id', 'a.kind', 'a.message', 'a.structure_id', 's.structure_number', 'a.girder_id', 'a.inspection_id', 'a.finding_id', 'a.created_at', 'a.read_at');
}

/** Marks the user's own alert read; false when the user has no such alert. */
export async function markAlertRead(db: Db, userId: number, alertId: number): Promise<boolean> {
  const updated = await db('alerts').where({ id: alertId, user_id: userId }).update({ read_at: db.raw('coalesce(read_at, now())') });
  return updated === 1;
}
