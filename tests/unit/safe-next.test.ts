import { describe, expect, it } from 'vitest';
import { safeNextPath } from '@/lib/safe-next';

// Issue 13, finding 6: `/sign-in?next=/%09/example.org/phish` ended on example.org.
describe('safeNextPath: same-origin paths only', () => {
  it.each([
    '/%09/example.org/phish',
    '/%09%09/example.org',
    '/%0a/example.org',
    '/%0d%0a/example.org',
    '/%2509/example.org',
    '/\t/example.org',
    '/\\example.org',
    '/%5Cexample.org',
    '/%5c%5cexample.org',
    '//example.org',
    '///example.org',
    '/%2F/example.org',
    '/%2f%2fexample.org',
    'https://example.org/',
    'http:example.org',
    'javascript:alert(1)',
    ' /w/harbourline',
    'w/harbourline',
    '/..//example.org',
    '/./%2F/example.org',
    '/%E0%A4%A',
    '',
    null,
    undefined,
  ])('%j falls back to the default', (next) => {
    expect(safeNextPath(next as string | null | undefined)).toBeNull();
  });

  it.each([
    ['/w/harbourline', '/w/harbourline'],
    ['/w/harbourline/studies?tab=open#list', '/w/harbourline/studies?tab=open#list'],
    ['/w/a/../b', '/w/b'],
    ['/search?q=%2F%2Fnot-a-host', '/search?q=%2F%2Fnot-a-host'],
  ])('%j is followed as %j', (next, expected) => {
    expect(safeNextPath(next)).toBe(expected);
  });

  it('resolves against the origin it is given and keeps only that origin', () => {
    expect(safeNextPath('/w/x', 'http://127.0.0.1:3000')).toBe('/w/x');
    expect(safeNextPath('//127.0.0.1:3000/w/x', 'http://127.0.0.1:3000')).toBeNull();
  });
});
