import type { Role } from '../../../shared/src';
import type { Database, Transaction } from '../db/database';

export interface UserRow {
  id: number;
  subject: string;
  email: string;
  display_name: string;
  role: Role;
  districts: string[];
  admin: boolean;
  last_signed_in_at: Date;
}

export type UserFromIdentityProvider = Pick<UserRow, 'subject' | 'email' | 'display_name' | 'role' | 'districts' | 'admin'>;

export async function findUserBySubject(db: Database | Transaction, subject: string): Promise<UserRow | undefined> {
  return db<UserRow>('users').where({ subject }).first();
}

/** Inserts or refreshes the user the identity provider vouched for, stamping the time of sign-in. */
export async function upsertSignedInUser(db: Database | Transaction, user: UserFromIdentityProvider): Promise<UserRow> {
  const [row] = await db<UserRow>('users')
    .insert({ ...user, last_signed_in_at: db.fn.now() as unknown as Date })
    .onConflict('subject')
    .merge(['email', 'display_name', 'role', 'districts', 'admin', 'last_signed_in_at'])
    .returning('*');
  if (!row) throw new Error('users upsert returned no row');
  return row;
}

export async function findUserById(db: Database | Transaction, id: number): Promise<UserRow | undefined> {
  return db<UserRow>('users').where({ id }).first();
}
