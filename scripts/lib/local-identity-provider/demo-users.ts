import type { Role } from '../../../shared/src';

/** A person of the demo authority as the local identity provider vouches for them. Invented people. */
export interface DemoUser {
  /** The stable subject (NameID) the provider sends. */
  readonly subject: string;
  readonly email: string;
  readonly displayName: string;
  readonly role: Role;
  readonly districts: readonly string[];
  readonly admin: boolean;
}

export const DEMO_AUTHORITY = 'Bluestem Valley Regional Roads Authority';

/** Two or more people per role in different districts of the demo scenario (seeds/demo-structures.ts). */
export const DEMO_USERS: readonly DemoUser[] = [
  { subject: 'bv-staff-1041', email: 'dana.whitcombe@bluestem-roads.example', displayName: 'Dana Whitcombe', role: 'inspector', districts: ['North District'], admin: false },
  { subject: 'bv-staff-1057', email: 'luis.orvane@bluestem-roads.example', displayName: 'Luis Orvane', role: 'inspector', districts: ['South District'], admin: false },
  { subject: 'bv-staff-2013', email: 'priya.halloran@bluestem-roads.example', displayName: 'Priya Halloran', role: 'rater', districts: ['Central District'], admin: false },
  { subject: 'bv-staff-2029', email: 'tomasz.brenek@bluestem-roads.example', displayName: 'Tomasz Brenek', role: 'rater', districts: ['East District', 'South District'], admin: false },
  { subject: 'bv-staff-3002', email: 'greer.ashdown@bluestem-roads.example', displayName: 'Greer Ashdown', role: 'manager', districts: [], admin: true },
  { subject: 'bv-staff-3018', email: 'mateo.quillen@bluestem-roads.example', displayName: 'Mateo Quillen', role: 'manager', districts: ['North District', 'Central District'], admin: false },
];

export function demoUser(subject: string): DemoUser | undefined {
  return DEMO_USERS.find((user) => user.subject === subject);
}
