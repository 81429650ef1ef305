import { randomBytes } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { stat } from 'node:fs/promises';
import { request } from 'node:http';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { SESSION_COOKIE } from '../../backend/src/auth/sessions';
import { XSRF_COOKIE, XSRF_HEADER } from '../../backend/src/auth/xsrf';
import type { SignInClient } from '../../tests/support/sign-in-client';

export interface HttpAnswer {
  readonly status: number;
  readonly text: string;
}

const XLSX_TYPE = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';

/**
 * Requests as a signed-in browser sends them (the session cookie, the XSRF token echoed in its
 * header), over plain node:http with no time limit: a request that takes minutes, such as a large
 * import's check or commit, is waited for rather than cut off as fetch does after five minutes
 * without response headers. A file is streamed from disk, never held whole in memory.
 */
export class SignedInHttp {
  private readonly headers: Record<string, string>;

  private constructor(
    private readonly appUrl: string,
    session: string,
    xsrfToken: string,
  ) {
    this.headers = { cookie: `${SESSION_COOKIE}=${session}; ${XSRF_COOKIE}=${xsrfToken}`, [XSRF_HEADER]: decodeURIComponent(xsrfToken), accept: 'application/json' };
  }

  /** The session a `SignInClient` signed in with. */
  static of(client: SignInClient, appUrl: string): SignedInHttp {
    const session = client.cookie(SESSION_COOKIE);
    const xsrfToken = client.cookie(XSRF_COOKIE);
    if (!session || !xsrfToken) throw new Error(`signing in set no ${!session ? SESSION_COOKIE : XSRF_COOKIE} cookie`);
    return new SignedInHttp(appUrl, session, xsrfToken);
  }

  get(path: string): Promise<HttpAnswer> {
    return this.send('GET', path, {}, null);
  }

  postJson(path: string, body: unknown): Promise<HttpAnswer> {
    const bytes = Buffer.from(JSON.stringify(body));
    return this.send('POST', path, { 'content-type': 'application/json', 'content-length': String(bytes.length) }, Readable.from([bytes]));
  }

  /** A multipart/form-data form holding one XLSX file in `field`, as a browser's file input sends it. */
  async postFile(path: string, field: string, filePath: string, fileName: string): Promise<HttpAnswer> {
    const boundary = `----spanledger-bench-${randomBytes(12).toString('hex')}`;
    const head = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="${field}"; filename="${fileName}"\r\nContent-Type: ${XLSX_TYPE}\r\n\r\n`);
    const tail = Buffer.from(`\r\n--${boundary}--\r\n`);
    const { size } = await stat(filePath);
    async function* form() {
      yield head;
      yield* createReadStream(filePath);
      yield tail;
    }
    const headers = { 'content-type': `multipart/form-data; boundary=${boundary}`, 'content-length': String(head.length + size + tail.length) };
    return this.send('POST', path, headers, Readable.from(form()));
  }

  private send(method: string, path: string, headers: Record<string, string>, body: Readable | null): Promise<HttpAnswer> {
    return new Promise((resolve, reject) => {
      let answered = false;
      // The server may answer (413, 401) before the body is all sent and close the connection: the answer is what counts.
      const failUnlessAnswered = (error: unknown) => {
        if (!answered) reject(error);
      };
      const outgoing = request(new URL(path, this.appUrl), { method, headers: { ...this.headers, ...headers } }, (response) => {
        answered = true;
        const chunks: Buffer[] = [];
        response.on('data', (chunk: Buffer) => chunks.push(chunk));
        response.on('error', reject);
        response.on('end', () => resolve({ status: response.statusCode ?? 0, text: Buffer.concat(chunks).toString('utf8') }));
      });
      outgoing.on('error', failUnlessAnswered);
      if (body === null) outgoing.end();
      else pipeline(body, outgoing).catch(failUnlessAnswered);
    });
  }
}
