import type { SignedInUser } from '../access';
import { templateOfFileName, templatesUserMayImport } from './rights';

const person = (role: SignedInUser['role']): Pick<SignedInUser, 'role' | 'admin'> => ({ role, admin: false });

describe('who may import which template', () => {
  it('follows the permission matrix: inspectors import findings, raters everything, managers the inventory and prior ratings', () => {
    expect(templatesUserMayImport(person('inspector'))).toEqual(['findings']);
    expect(templatesUserMayImport(person('rater'))).toEqual(['structures', 'spans', 'girders', 'strand-rows', 'findings', 'prior-ratings']);
    expect(templatesUserMayImport(person('manager'))).toEqual(['structures', 'spans', 'girders', 'strand-rows', 'prior-ratings']);
  });

  it('gives nobody signed in nothing to import', () => {
    expect(templatesUserMayImport(null)).toEqual([]);
    expect(templatesUserMayImport(undefined)).toEqual([]);
  });
});

describe('the template a CSV file name stands for', () => {
  it('is read whatever the case, spaces or underscores', () => {
    expect(templateOfFileName('structures.csv')).toBe('structures');
    expect(templateOfFileName('Strand rows.CSV')).toBe('strand-rows');
    expect(templateOfFileName(' prior_ratings .csv')).toBe('prior-ratings');
    expect(templateOfFileName('strand-rows')).toBe('strand-rows');
  });

  it('is none for a name that is not one', () => {
    expect(templateOfFileName('west district structures.csv')).toBeNull();
    expect(templateOfFileName('structure.csv')).toBeNull();
    expect(templateOfFileName('.csv')).toBeNull();
  });
});
