import type { CacheItem, CacheProvider } from '@node-saml/node-saml';
import type { Database } from '../db/database';

/**
 * Keeps the ids of AuthnRequests awaiting an answer in PostgreSQL (`saml_pending_requests`), so
 * any server process accepts the identity provider's cross-site POST back, and each id only once.
 */
export function pendingRequestStore(db: Database, expiryMs: number): CacheProvider {
  const fresh = () => db.raw('now() - ? * interval \'1 millisecond\'', [expiryMs]);
  return {
    async saveAsync(requestId, issuedAt): Promise<CacheItem | null> {
      await db('saml_pending_requests').where('created_at', '<', fresh()).delete();
      const inserted = await db('saml_pending_requests').insert({ request_id: requestId, issued_at: issuedAt }).onConflict('request_id').ignore().returning('request_id');
      return inserted.length === 0 ? null : { value: issuedAt, createdAt: Date.now() };
    },
    async getAsync(requestId): Promise<string | null> {
      const row = await db('saml_pending_requests').where({ request_id: requestId }).andWhere('created_at', '>=', fresh()).first<{ issued_at: string } | undefined>('issued_at');
      return row?.issued_at ?? null;
    },
    async removeAsync(requestId): Promise<string | null> {
      if (requestId === null) return null;
      const [row] = await db('saml_pending_requests').where({ request_id: requestId }).delete().returning<Array<{ issued_at: string }>>('issued_at');
      return row?.issued_at ?? null;
    },
  };
}
