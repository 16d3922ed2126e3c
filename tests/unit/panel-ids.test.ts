import { describe, expect, it } from 'vitest';
import { checkedPid, MAX_PID_LENGTH, newReferenceCode, normalReferenceCode, pidSignature, requireSignedPid } from '@/respondent/server/panel-ids';

// Panel ids and reference codes (respondent/server/panel-ids.ts).

describe('panel ids', () => {
  it('are trimmed, empty means none, and more than 120 characters is a 422 on the field pid', () => {
    expect(checkedPid('  panel-7 ')).toBe('panel-7');
    expect(checkedPid('   ')).toBeNull();
    expect(checkedPid('x'.repeat(MAX_PID_LENGTH))).toHaveLength(120);
    expect(() => checkedPid('x'.repeat(MAX_PID_LENGTH + 1))).toThrow(expect.objectContaining({ status: 422, issues: [expect.objectContaining({ path: 'pid' })] }));
  });

  it('the signature a panel adds is plain HMAC-SHA-256 in hex, so any panel can compute it (RFC 4231, test case 2)', () => {
    expect(pidSignature('Jefe', 'what do ya want for nothing?')).toBe('5bdcc146bf60754e6a042426089575c75a003f089d2739839dec58b964ec3843');
  });

  it('a signing link refuses a missing, malformed or wrong signature, and accepts the right one in either case', () => {
    const key = 'link-key';
    const sig = pidSignature(key, 'member-1');
    expect(() => requireSignedPid(key, 'member-1', null)).toThrow(expect.objectContaining({ status: 403 }));
    expect(() => requireSignedPid(key, 'member-1', 'not-hex')).toThrow(expect.objectContaining({ status: 403 }));
    expect(() => requireSignedPid(key, 'member-2', sig)).toThrow(expect.objectContaining({ status: 403 }));
    expect(() => requireSignedPid(key, 'member-1', sig.toUpperCase())).not.toThrow();
    // Links without a key, and starts without a pid, need no signature.
    expect(() => requireSignedPid(null, 'member-1', null)).not.toThrow();
    expect(() => requireSignedPid(key, null, null)).not.toThrow();
  });
});

describe('reference codes', () => {
  it('are ten characters of an alphabet without I, L, O, U, in two groups, and differ every time', () => {
    const codes = Array.from({ length: 2000 }, newReferenceCode);
    for (const c of codes) expect(c).toMatch(/^[0-9A-HJKMNP-TV-Z]{5}-[0-9A-HJKMNP-TV-Z]{5}$/);
    expect(new Set(codes).size).toBe(codes.length);
  });

  it('read back as typed: case, spaces, a missing dash, O for zero and I or L for one', () => {
    expect(normalReferenceCode('7k2qd m9xpa')).toBe('7K2QD-M9XPA');
    expect(normalReferenceCode('O1LI0-ABCDE')).toBe('01110-ABCDE');
    expect(normalReferenceCode('7K2QD-M9XP')).toBeNull();
    expect(normalReferenceCode('7K2QD-M9XPU')).toBeNull();
  });
});
