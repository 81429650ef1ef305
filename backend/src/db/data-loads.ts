import type { Database } from './database';
import { withTransaction } from './database';

/**
 * Runs a one-time data load (such as the demo scenario) unless it already ran, recording it in
 * `data_loads` in the same transaction: a failed load leaves no trace and is tried again next time.
 */
export async function runDataLoadOnce(db: Database, name: string, load: (trx: Database) => Promise<void>): Promise<boolean> {
  return withTransaction(db, async (trx) => {
    const inserted = await trx('data_loads').insert({ name }).onConflict('name').ignore().returning('name');
    if (inserted.length === 0) return false;
    await load(trx);
    return true;
  });
}
