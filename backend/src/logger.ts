import pino, { type Logger } from 'pino';

export type { Logger };

/** One structured JSON logger for the whole server; requests get child loggers carrying their id. */
export function createLogger(level: string): Logger {
  return pino({ level, base: { service: 'spanledger' }, timestamp: pino.stdTimeFunctions.isoTime });
}
