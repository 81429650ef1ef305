import { safeReturnPath } from './return-path';

describe('safeReturnPath', () => {
  it.each([
    ['/', '/'],
    ['/register?district=North%20District', '/register?district=North%20District'],
    ['/my-role#matrix', '/my-role#matrix'],
  ])('keeps the same-site path %p', (candidate, expected) => {
    expect(safeReturnPath(candidate)).toBe(expected);
  });

  it.each(['https://evil.example', '//evil.example', '/\\evil.example', '\\\\evil.example', 'javascript:alert(1)', '/\tevil', '', undefined, 42, ['/a']])(
    'sends %p home instead',
    (candidate) => {
      expect(safeReturnPath(candidate)).toBe('/');
    },
  );
});
