import { describe, expect, it } from 'vitest';
import { cspDirectives } from '../support/csp';

// The header checks in tests/e2e (respondent.test.ts, security-http.test.ts) compare directives
// exactly through this parser; these cases show they tell the app's loose policy from the
// respondent pages' strict one, and catch a policy sent twice.
describe('reading a Content-Security-Policy header', () => {
  const loose = "default-src 'self'; script-src 'self' 'unsafe-inline'; style-src 'self' 'unsafe-inline'; frame-ancestors 'none'";
  const strict = "default-src 'self'; script-src 'self'; style-src 'self'; frame-ancestors 'none'";

  it("the app's policy with inline script does not pass as script-src 'self' (a pattern match would let it through)", () => {
    expect(loose).toMatch(/script-src 'self'/);
    expect(cspDirectives(loose).get('script-src')).not.toEqual(["'self'"]);
    expect(cspDirectives(strict).get('script-src')).toEqual(["'self'"]);
  });

  it('two policies in one header (a global one added to a page policy) are refused, as is no header at all', () => {
    expect(() => cspDirectives(`${strict}, ${loose}`)).toThrow(/appears twice/);
    expect(() => cspDirectives(null)).toThrow(/no Content-Security-Policy/);
  });
});
