import { PERMISSIONS, can, canInDistrict, changeScope, type SignedInUser } from './access';

const user = (overrides: Partial<SignedInUser>): SignedInUser => ({
  id: 1,
  email: 'someone@example.org',
  displayName: 'Someone',
  role: 'inspector',
  districts: [],
  admin: false,
  ...overrides,
});

describe('permission matrix', () => {
  it.each([
    ['inspector', ['view', 'editOwnInspections', 'importFindings']],
    ['rater', ['view', 'importFindings', 'reviewInspections', 'editInventory', 'runRatings', 'approveRatings']],
    ['manager', ['view', 'reviewInspections', 'editInventory', 'runRatings', 'approveRatings', 'decidePostings', 'exportRegister']],
  ] as const)('lets a %s do exactly %p without the admin capability', (role, actions) => {
    const allowed = PERMISSIONS.filter((p) => can(user({ role }), p.action)).map((p) => p.action);
    expect(allowed).toEqual(actions);
  });

  it('keeps vehicles, policies and role mapping to managers with the admin capability', () => {
    expect(can(user({ role: 'manager', admin: true }), 'manageSettings')).toBe(true);
    expect(can(user({ role: 'manager', admin: false }), 'manageSettings')).toBe(false);
    expect(can(user({ role: 'rater', admin: true }), 'manageSettings')).toBe(false);
  });
});

describe('districts', () => {
  it('limit what a user may change, not what they may see', () => {
    const rater = user({ role: 'rater', districts: ['North District'] });
    expect(canInDistrict(rater, 'editInventory', 'North District')).toBe(true);
    expect(canInDistrict(rater, 'editInventory', 'South District')).toBe(false);
    expect(canInDistrict(rater, 'view', 'South District')).toBe(true);
  });

  it('let a manager with no district act on the whole network, and an inspector with none change nothing', () => {
    expect(changeScope(user({ role: 'manager' }))).toEqual({ kind: 'network' });
    expect(canInDistrict(user({ role: 'manager' }), 'decidePostings', 'East District')).toBe(true);
    expect(changeScope(user({ role: 'inspector' }))).toEqual({ kind: 'none' });
    expect(canInDistrict(user({ role: 'inspector' }), 'editOwnInspections', 'East District')).toBe(false);
  });

  it('never let a district grant an action the role lacks', () => {
    expect(canInDistrict(user({ role: 'inspector', districts: ['East District'] }), 'editInventory', 'East District')).toBe(false);
  });
});
