import type { Knex } from 'knex';
import PgBoss from 'pg-boss';
import type { Transaction } from '../db/database';
import type { Logger } from '../logger';

/** Work that outlasts a request, queued in Spanledger's own PostgreSQL (pg-boss), done by the server that takes it. */
export interface BackgroundJobs {
  /** Queues a job inside the caller's transaction: it exists exactly when the transaction commits, and this server starts on it then. */
  send(queue: JobQueueName, data: object, trx: Transaction): Promise<void>;
  stop(): Promise<void>;
}

/** Every queue the server works; each job's data is small (ids), what it works on is in the database. */
export const JOB_QUEUES = ['import-commit'] as const;
export type JobQueueName = (typeof JOB_QUEUES)[number];

export type JobHandler = (data: Record<string, unknown>) => Promise<void>;

/**
 * pg-boss sends its SQL with `$1`-style placeholders; Knex takes `?`. Each placeholder becomes
 * one `?` with its value, in the order they appear, so a job is inserted on the transaction's
 * own connection.
 */
function onTransaction(trx: Transaction): PgBoss.Db {
  return {
    async executeSql(text, values) {
      const bindings: Knex.RawBinding[] = [];
      const sql = text.replace(/\?/g, '\\?').replace(/\$(\d+)/g, (_, position: string) => {
        // node-postgres sends undefined as NULL; Knex refuses it, so say NULL outright.
        bindings.push((values[Number(position) - 1] ?? null) as Knex.RawBinding);
        return '?';
      });
      const result = await trx.raw(sql, bindings);
      return { rows: (result as { rows: unknown[] }).rows };
    },
  };
}

/**
 * A commit of a large import can take a minute; one job at a time per server keeps the
 * database's other work responsive. A job whose server died part way is given again once.
 */
const QUEUE_OPTIONS: Omit<PgBoss.Queue, 'name'> = { retryLimit: 1, retryDelay: 5, expireInSeconds: 30 * 60 };

/** Starts the queue (creating its tables on first use) and a worker for each handler. */
export async function startBackgroundJobs(databaseUrl: string, logger: Logger, handlers: Readonly<Record<JobQueueName, JobHandler>>): Promise<BackgroundJobs> {
  const boss = new PgBoss({ connectionString: databaseUrl, schema: 'pgboss', max: 3, schedule: false, application_name: 'spanledger-jobs' });
  boss.on('error', (error: unknown) => logger.error({ err: error }, 'background job queue error'));
  await boss.start();
  const workerOf = new Map<JobQueueName, string>();
  for (const queue of JOB_QUEUES) {
    await boss.createQueue(queue, { name: queue, ...QUEUE_OPTIONS });
    const workerId = await boss.work<Record<string, unknown>>(queue, { batchSize: 1, pollingIntervalSeconds: 0.5 }, async ([job]) => {
      logger.info({ queue, jobId: job!.id }, 'background job started');
      await handlers[queue](job!.data);
      logger.info({ queue, jobId: job!.id }, 'background job done');
    });
    workerOf.set(queue, workerId);
  }
  return {
    async send(queue, data, trx) {
      const id = await boss.send(queue, data, { db: onTransaction(trx) });
      if (id === null) throw new Error(`The background job queue "${queue}" refused a job`);
      // Once the job is committed, this server's worker looks for it at once rather than at its next poll.
      trx.executionPromise.then(
        () => boss.notifyWorker(workerOf.get(queue)!),
        () => undefined,
      );
    },
    async stop() {
      await boss.stop({ graceful: true, wait: true, timeout: 30_000 });
    },
  };
}
