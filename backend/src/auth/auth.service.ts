import type { Profile } from '@node-saml/passport-saml';
import { z } from 'zod';
import { ROLES, type SignedInUser } from '../../../shared/src';
import { recordAuditEvent } from '../audit/audit-events';
import type { SamlAttributeNames } from '../config';
import { withTransaction, type Database } from '../db/database';
import { AppError } from '../http/app-error';
import { upsertSignedInUser, type UserFromIdentityProvider, type UserRow } from '../users/users.repository';

/** Attribute values arrive as one string or a list of them, depending on how many were sent. */
const values = z.union([z.string(), z.array(z.string())]).transform((value) => (Array.isArray(value) ? value : [value]));
const oneValue = values.refine((list) => list.length === 1, 'expected exactly one value').transform((list) => list[0] as string);

const identitySchema = z.object({
  subject: z.string().min(1).max(500),
  email: oneValue.pipe(z.email()),
  displayName: oneValue.pipe(z.string().trim().min(1).max(200)),
  role: oneValue.pipe(z.string().trim().toLowerCase().pipe(z.enum(ROLES))),
  districts: values.pipe(z.array(z.string().trim().min(1).max(200)).max(100)).default([]),
  admin: oneValue.pipe(z.enum(['true', 'false'])).default('false'),
});

/**
 * The user the identity provider vouched for, read from the configured assertion attributes. The
 * admin capability counts only for managers, since the permission matrix gives it to no one else.
 */
export function identityFromAssertion(profile: Profile, names: SamlAttributeNames): UserFromIdentityProvider {
  const attributes = (profile.attributes ?? {}) as Record<string, unknown>;
  const parsed = identitySchema.safeParse({
    subject: profile.nameID,
    email: attributes[names.email],
    displayName: attributes[names.displayName],
    role: attributes[names.role],
    districts: attributes[names.districts],
    admin: attributes[names.admin],
  });
  if (!parsed.success) {
    const problems = parsed.error.issues.map((issue) => String(issue.path[0])).join(', ');
    throw new AppError({ code: 'sign_in_failed', status: 401, message: `The identity provider did not send a usable ${problems}`, details: { attributes: problems } });
  }
  const identity = parsed.data;
  return {
    subject: identity.subject,
    email: identity.email,
    display_name: identity.displayName,
    role: identity.role,
    districts: [...new Set(identity.districts)],
    admin: identity.role === 'manager' && identity.admin === 'true',
  };
}

export function toSignedInUser(row: UserRow): SignedInUser {
  return { id: row.id, email: row.email, displayName: row.display_name, role: row.role, districts: row.districts, admin: row.admin };
}

/** Records the sign-in: the user row is created or refreshed and the history notes it. */
export async function signIn({ db }: { db: Database }, identity: UserFromIdentityProvider): Promise<SignedInUser> {
  return withTransaction(db, async (trx) => {
    const user = toSignedInUser(await upsertSignedInUser(trx, identity));
    await recordAuditEvent({ db: trx, user, action: 'sign-in', entity: { type: 'user', id: user.id }, after: { role: user.role, districts: user.districts, admin: user.admin } });
    return user;
  });
}

export async function recordSignOut({ db, user }: { db: Database; user: SignedInUser }): Promise<void> {
  await recordAuditEvent({ db, user, action: 'sign-out', entity: { type: 'user', id: user.id } });
}
