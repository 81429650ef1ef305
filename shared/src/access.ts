/**
 * Who may do what (product brief, permission matrix). The server enforces it on every route; the
 * browser app reads the same table to hide what a user may not do and to explain it.
 */

export const ROLES = ['inspector', 'rater', 'manager'] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_NAMES: Readonly<Record<Role, string>> = {
  inspector: 'Inspector',
  rater: 'Rating engineer',
  manager: 'Asset manager',
};

/** The signed-in user as the server answers `GET /api/me`. */
export interface SignedInUser {
  readonly id: number;
  readonly email: string;
  readonly displayName: string;
  readonly role: Role;
  /** Districts the user may change things in; a manager with none acts on the whole network. */
  readonly districts: readonly string[];
  /** May manage vehicles, rating policies and role mapping (held by managers only). */
  readonly admin: boolean;
}

export type Action =
  | 'view'
  | 'editOwnInspections'
  | 'importFindings'
  | 'reviewInspections'
  | 'editInventory'
  | 'runRatings'
  | 'approveRatings'
  | 'decidePostings'
  | 'exportRegister'
  | 'manageSettings';

export interface Permission {
  readonly action: Action;
  readonly description: string;
  readonly roles: readonly Role[];
  /** Also needs the `admin` capability. */
  readonly needsAdmin: boolean;
  /** Only inside the user's own districts (see `changeScope`). */
  readonly withinOwnDistricts: boolean;
  /** A condition the server checks on the item itself, stated for people. */
  readonly condition: string | null;
}

const permission = (action: Action, description: string, roles: readonly Role[], extra: Partial<Permission> = {}): Permission => ({
  action,
  description,
  roles,
  needsAdmin: false,
  withinOwnDistricts: true,
  condition: null,
  ...extra,
});

/** The permission matrix, in the order people read it. */
export const PERMISSIONS: readonly Permission[] = [
  permission('view', 'View the map, structures, girders, inspections, ratings, postings and history', ROLES, { withinOwnDistricts: false }),
  permission('editOwnInspections', 'Create and edit your own inspections, findings and photos while they are drafts; submit them', ['inspector']),
  permission('importFindings', 'Import findings from a CSV or XLSX file', ['inspector', 'rater']),
  permission('reviewInspections', 'Accept or return a submitted inspection', ['rater', 'manager']),
  permission('editInventory', 'Edit the inventory (structures, spans, girders, girder types); import inventory', ['rater', 'manager']),
  permission('runRatings', 'Run ratings, save drafts and submit them; start a district re-rate', ['rater', 'manager']),
  permission('approveRatings', 'Approve or return a submitted rating', ['rater', 'manager'], { condition: 'never a rating you made yourself' }),
  permission('decidePostings', 'Decide postings', ['manager']),
  permission('exportRegister', 'Export the network register', ['manager'], { withinOwnDistricts: false }),
  permission('manageSettings', 'Manage vehicles, rating policies and role mapping', ['manager'], { needsAdmin: true, withinOwnDistricts: false }),
];

export function permissionFor(action: Action): Permission {
  const found = PERMISSIONS.find((p) => p.action === action);
  if (!found) throw new Error(`No permission is defined for ${action}`);
  return found;
}

/** Whether the user's role (and admin capability, where needed) allows the action at all. */
export function can(user: Pick<SignedInUser, 'role' | 'admin'>, action: Action): boolean {
  const { roles, needsAdmin } = permissionFor(action);
  return roles.includes(user.role) && (!needsAdmin || user.admin);
}

/** Where the user may change things: the whole network, some districts, or nowhere. */
export type ChangeScope = { readonly kind: 'network' } | { readonly kind: 'districts'; readonly districts: readonly string[] } | { readonly kind: 'none' };

export function changeScope(user: Pick<SignedInUser, 'role' | 'districts'>): ChangeScope {
  if (user.districts.length > 0) return { kind: 'districts', districts: user.districts };
  return user.role === 'manager' ? { kind: 'network' } : { kind: 'none' };
}

/** Whether the user may do a changing action on something in the given district. */
export function canInDistrict(user: SignedInUser, action: Action, district: string): boolean {
  if (!can(user, action)) return false;
  if (!permissionFor(action).withinOwnDistricts) return true;
  const scope = changeScope(user);
  return scope.kind === 'network' || (scope.kind === 'districts' && scope.districts.includes(district));
}
