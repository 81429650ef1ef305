import { randomUUID } from 'node:crypto';
import type { IncomingMessage, ServerResponse } from 'node:http';
import { pinoHttp } from 'pino-http';
import type { Logger } from '../logger';

const REQUEST_ID_HEADER = 'x-request-id';
/** A caller's own request id is kept when it looks like one, so logs can be joined across services. */
const SAFE_REQUEST_ID = /^[A-Za-z0-9._-]{8,64}$/;

function requestIdFor(req: IncomingMessage, res: ServerResponse): string {
  const offered = req.headers[REQUEST_ID_HEADER];
  const id = typeof offered === 'string' && SAFE_REQUEST_ID.test(offered) ? offered : randomUUID();
  res.setHeader('X-Request-Id', id);
  return id;
}

/** Logs every request once, with its id on every line logged through `req.log`. */
export function requestLogging(logger: Logger) {
  return pinoHttp({
    logger,
    genReqId: requestIdFor,
    // Lines logged through req.log carry only the id; the completion line also has req and res.
    quietReqLogger: true,
    customAttributeKeys: { reqId: 'requestId' },
    serializers: {
      req: (req: { method: string; url: string }) => ({ method: req.method, url: req.url }),
      res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
    },
  });
}
