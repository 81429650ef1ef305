import { AppError } from '../http/app-error';
import type { Database } from '../db/database';
import { readPostgisVersion } from './health.repository';

export interface HealthReport {
  readonly status: 'ok';
  readonly db: 'ok';
  readonly postgis: string;
}

export async function checkHealth({ db }: { db: Database }): Promise<HealthReport> {
  try {
    return { status: 'ok', db: 'ok', postgis: await readPostgisVersion(db) };
  } catch (cause) {
    throw new AppError({ code: 'database_unavailable', status: 503, message: 'The database is not answering', cause });
  }
}
