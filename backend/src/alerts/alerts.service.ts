import type { AlertItem, SignedInUser } from '../../../shared/src';
import type { Database } from '../db/database';
import { AppError } from '../http/app-error';
import { findAlertsOfUser, markAlertRead } from './alerts.repository';

/** Alerts a person sees at once: the newest, read or not. */
const ALERTS_SHOWN = 50;

export async function listAlerts({ db, user }: { db: Database; user: SignedInUser }): Promise<AlertItem[]> {
  return (await findAlertsOfUser(db, user.id, ALERTS_SHOWN)).map((row) => ({
    id: row.id,
    kind: row.kind,
    message: row.message,
    structureId: row.structure_id,
    structureNumber: row.structure_number,
    girderId: row.girder_id,
    inspectionId: row.inspection_id,
    findingId: row.finding_id,
    createdAt: row.created_at.toISOString(),
    readAt: row.read_at?.toISOString() ?? null,
  }));
}

export async function readAlert({ db, user }: { db: Database; user: SignedInUser }, alertId: number): Promise<void> {
  if (!(await markAlertRead(db, user.id, alertId))) throw AppError.notFound(`You have no alert with id ${alertId}`);
}
