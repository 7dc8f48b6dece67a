import { describe, expect, it } from 'vitest';
import { safeReturnPath } from '../../shared/paths';

describe('safeReturnPath', () => {
  it.each([
    ['/dashboard?tab=jobs', '/dashboard?tab=jobs'],
    ['/admin/people', '/admin/people'],
  ])('when the path %s is our own, then it is kept', (input, expected) => {
    expect(safeReturnPath(input)).toBe(expected);
  });

  it.each([
    ['https://elsewhere.example/'],
    ['//elsewhere.example/path'],
    ['/\\elsewhere.example'],
    ['javascript:alert(1)'],
    ['dashboard'],
    ['/ok\nSet-Cookie: x=1'],
    [''],
    [undefined],
    [['/a', '/b']],
    ['/' + 'a'.repeat(600)],
  ])('when the value %j could lead off-site or is not a path, then the fallback is used', (input) => {
    expect(safeReturnPath(input)).toBe('/dashboard');
    expect(safeReturnPath(input, '/')).toBe('/');
  });
});
