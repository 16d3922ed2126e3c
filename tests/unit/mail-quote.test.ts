import { describe, expect, it } from 'vitest';
import { plainName, quoted } from '@/lib/mail-quote';

// Issue 13, finding 9: invitation e-mails carried attacker-chosen names as if they were our words.
describe('names in e-mails are quoted, flat, linkless data', () => {
  it('removes line breaks and controls so a name cannot start a paragraph of its own', () => {
    const n = plainName('Pricing\r\n\r\nYour account is locked.\tCall us\u0007 now');
    expect(n).not.toMatch(/[\r\n\t\u0007]/);
    expect(n).toBe('Pricing Your account is locked. Call us now');
  });

  it('defangs web and mail addresses so no mail client makes them links', () => {
    const n = plainName('Verify at https://evil.example/login or www.evil.example, mail help@evil.example');
    expect(n).not.toMatch(/https?:\/\//i);
    expect(n).not.toMatch(/www\./i);
    expect(n).not.toMatch(/evil\.example/);
    expect(n).not.toContain('@');
    expect(n).toContain('hxxps[:]//evil[.]example');
  });

  it('drops invisible and direction-changing characters, and caps the length', () => {
    expect(plainName('Acme\u202e moc.live\u200b')).toBe('Acme moc[.]live');
    const long = plainName('x'.repeat(500));
    expect(long.length).toBeLessThanOrEqual(140);
    expect(long.endsWith('…')).toBe(true);
  });

  it('wraps the value in guillemets and keeps ordinary names as typed', () => {
    expect(quoted('Harbourline Market — Pricing')).toBe('«Harbourline Market — Pricing»');
    expect(quoted('«Fake» end')).toBe('«"Fake" end»');
    expect(quoted('Version 3.14 lab')).toBe('«Version 3.14 lab»');
    expect(quoted('   ')).toBe('«(no name)»');
  });
});
